import { When } from "~/components/dates";
import { Form, Link } from "react-router";
import type { Route } from "./+types/admin.audit";
import { z } from "zod";
import { AUDIT_ACTIONS, type AuditAction } from "~/lib/audit-actions";
import { listAudit } from "~/lib/audit.server";
import { requirePermission } from "~/lib/auth.server";

export const meta: Route.MetaFunction = () => [{ title: "Audit log · Admin · Fallwright" }];

const PAGE = 100;
const Query = z.object({
  action: z
    .enum(Object.keys(AUDIT_ACTIONS) as [AuditAction, ...AuditAction[]])
    .nullable()
    .catch(null),
  // audit_log.id is a bigint; past the safe-integer range the page falls back to the newest.
  before: z.coerce.number().int().positive().max(Number.MAX_SAFE_INTEGER).nullable().catch(null),
});

export async function loader({ request }: Route.LoaderArgs) {
  const admin = await requirePermission(request, "users:manage");
  const sp = new URL(request.url).searchParams;
  const q = Query.parse({ action: sp.get("action") || null, before: sp.get("before") || null });
  const rows = await listAudit({
    organisationId: admin.organisationId,
    action: q.action ?? undefined,
    before: q.before ?? undefined,
    limit: PAGE,
  });
  return { rows, action: q.action, paged: !!q.before, older: rows.length === PAGE ? rows[rows.length - 1].id : null };
}

function describe(detail: Record<string, unknown>, subjectEmail: string | null): string {
  const parts: string[] = [];
  if (typeof detail.email === "string" && detail.email !== subjectEmail?.toLowerCase()) parts.push(detail.email);
  if (detail.from && detail.to) parts.push(`${detail.from} → ${detail.to}`);
  if (typeof detail.role === "string" && !detail.from) parts.push(`as ${detail.role}`);
  if (typeof detail.open === "boolean") parts.push(detail.open ? "opened" : "closed");
  if (typeof detail.sessionsEnded === "number")
    parts.push(`${detail.sessionsEnded} session${detail.sessionsEnded === 1 ? "" : "s"} ended`);
  if (detail.classId) parts.push("into a class");
  return parts.join(" · ");
}

export default function AdminAudit({ loaderData }: Route.ComponentProps) {
  const { rows, action, older, paged } = loaderData;
  return (
    <section className="grid gap-3" aria-labelledby="audit-heading">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <h2 id="audit-heading" className="text-lg font-bold">
          Audit log
        </h2>
        <Form method="get" className="flex items-end gap-2">
          <div>
            <label className="label" htmlFor="audit-action">
              What
            </label>
            <select id="audit-action" name="action" className="field" defaultValue={action ?? ""}>
              <option value="">Everything</option>
              {Object.entries(AUDIT_ACTIONS).map(([k, v]) => (
                <option key={k} value={k}>
                  {v}
                </option>
              ))}
            </select>
          </div>
          <button type="submit" className="btn">
            Show
          </button>
        </Form>
      </div>
      {rows.length === 0 ? (
        <p className="card text-ink-soft">Nothing recorded{action ? ` for “${AUDIT_ACTIONS[action]}”` : ""} yet.</p>
      ) : (
        <div className="card overflow-x-auto p-0">
          <table className="data-table w-full">
            <thead>
              <tr>
                <th scope="col">When</th>
                <th scope="col">What</th>
                <th scope="col">By</th>
                <th scope="col">Account</th>
                <th scope="col">Detail</th>
                <th scope="col">From</th>
              </tr>
            </thead>
            <tbody>
              {rows.map((r) => (
                <tr key={r.id}>
                  <td className="whitespace-nowrap">
                    <When iso={r.at} />
                  </td>
                  <td
                    className={r.action === "sign_in_failed" || r.action === "sign_in_limited" ? "text-bad" : undefined}
                  >
                    {AUDIT_ACTIONS[r.action] ?? r.action}
                  </td>
                  {/* Addresses break only where they must (never at their hyphens): see .email in app.css. */}
                  <td className="email">{r.actorEmail ?? "—"}</td>
                  <td className="email">{r.subjectEmail ?? "—"}</td>
                  <td>{describe(r.detail, r.subjectEmail)}</td>
                  <td className="text-ink-soft">{r.ip ?? "—"}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      <p className="flex gap-4 text-sm">
        {paged ? (
          <Link className="underline" to={action ? `?action=${action}` : "."}>
            Newest
          </Link>
        ) : null}
        {older ? (
          <Link className="underline" to={`?${new URLSearchParams({ ...(action ? { action } : {}), before: older })}`}>
            Older entries
          </Link>
        ) : null}
      </p>
    </section>
  );
}
