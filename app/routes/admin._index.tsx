import { useState } from "react";
import { data, Form, useSearchParams } from "react-router";
import type { Route } from "./+types/admin._index";
import { z } from "zod";
import { requirePermission } from "~/lib/auth.server";
import { createInvitation, resendInvitation } from "~/lib/invitations.server";
import { appOrigin } from "~/lib/app-url";
import { ROLE_LABELS, ROLES, type Role } from "~/lib/permissions";
import { clientIp } from "~/lib/rate-limit.server";
import {
  changeRole,
  listUsers,
  primaryOrganisation,
  setActive,
  setOpenSignup,
  type UserStatus,
} from "~/lib/users.server";
import { When } from "~/components/dates";
import { Field, FormError, FormNotice, SubmitButton } from "~/components/form-field";

export const meta: Route.MetaFunction = () => [{ title: "Users · Admin · Fallwright" }];

const STATUSES: Record<UserStatus, string> = { active: "Active", invited: "Invited", deactivated: "Deactivated" };
const INVITABLE: Role[] = ["trainer", "designer", "trainee"];

const Filters = z.object({
  q: z.string().trim().max(100).catch(""),
  role: z.enum(ROLES).nullable().catch(null),
  status: z.enum(["active", "invited", "deactivated"]).nullable().catch(null),
});

export async function loader({ request }: Route.LoaderArgs) {
  const admin = await requirePermission(request, "users:manage");
  const sp = new URL(request.url).searchParams;
  const filters = Filters.parse({
    q: sp.get("q") ?? "",
    role: sp.get("role") || null,
    status: sp.get("status") || null,
  });
  const [{ rows, total }, org] = await Promise.all([
    listUsers({ organisationId: admin.organisationId, ...filters }),
    primaryOrganisation(),
  ]);
  return { me: admin.id, users: rows, total, filters, openSignup: !!org?.open_designer_signup };
}

const Action = z.discriminatedUnion("intent", [
  z.object({ intent: z.literal("invite"), email: z.string().max(320), role: z.string() }),
  z.object({ intent: z.literal("role"), userId: z.string(), role: z.string() }),
  z.object({ intent: z.literal("deactivate"), userId: z.string() }),
  z.object({ intent: z.literal("reactivate"), userId: z.string() }),
  z.object({ intent: z.literal("resend"), userId: z.string() }),
  z.object({ intent: z.literal("signup"), open: z.enum(["on", "off"]) }),
]);

type ActionResult = { intent: string; ok: boolean; message: string; email?: string; role?: string; userId?: string };

export async function action({ request, context }: Route.ActionArgs) {
  const admin = await requirePermission(request, "users:manage");
  const parsed = Action.safeParse(Object.fromEntries(await request.formData()));
  if (!parsed.success)
    return data<ActionResult>(
      { intent: "unknown", ok: false, message: "That request was not understood." },
      { status: 400 },
    );
  const a = parsed.data;
  const ip = clientIp(context);
  const origin = appOrigin();
  let r: ActionResult;
  switch (a.intent) {
    case "invite": {
      const role = (INVITABLE as string[]).includes(a.role) ? (a.role as Role) : null;
      if (!role) {
        r = { intent: a.intent, ok: false, message: "Choose a role to invite as.", email: a.email, role: a.role };
        break;
      }
      const res = await createInvitation({ email: a.email, role, invitedBy: admin, origin, ip });
      r =
        res.status === "refused"
          ? { intent: a.intent, ok: false, message: res.message, email: a.email, role }
          : {
              intent: a.intent,
              ok: true,
              message: res.emailSent
                ? `Invitation sent to ${a.email.trim()}.`
                : `The invitation for ${a.email.trim()} is saved, but the e-mail could not be sent. Use "Resend invite" once mail works.`,
            };
      break;
    }
    case "resend": {
      const res = await resendInvitation({ userId: a.userId, invitedBy: admin, origin, ip });
      r =
        res.status === "refused"
          ? { intent: a.intent, ok: false, message: res.message }
          : {
              intent: a.intent,
              ok: res.emailSent,
              message: res.emailSent
                ? "A fresh invitation link is on its way."
                : "The e-mail could not be sent; try again later.",
            };
      break;
    }
    case "role":
      r = { intent: a.intent, userId: a.userId, ...(await changeRole(admin, a.userId, a.role, ip)) };
      break;
    case "deactivate":
    case "reactivate":
      r = { intent: a.intent, userId: a.userId, ...(await setActive(admin, a.userId, a.intent === "reactivate", ip)) };
      break;
    case "signup":
      r = { intent: a.intent, ...(await setOpenSignup(admin, a.open === "on", ip)) };
      break;
  }
  return data(r, { status: r.ok ? 200 : 400 });
}

export default function AdminUsers({ loaderData, actionData }: Route.ComponentProps) {
  const { me, users, total, filters, openSignup } = loaderData;
  const result = actionData;
  const [searchParams] = useSearchParams();
  const inviteResult = result?.intent === "invite" ? result : null;
  const rowResult = result && result.intent !== "invite" ? result : null;
  const filtered = !!(filters.q || filters.role || filters.status);
  return (
    <div className="grid gap-6">
      <div className="grid items-start gap-6 lg:grid-cols-[2fr_1fr]">
        <section className="card grid gap-3" aria-labelledby="invite-heading">
          <h2 id="invite-heading" className="text-lg font-bold">
            Invite someone
          </h2>
          <p className="text-sm text-ink-soft">
            They get an e-mail with a link that works once, for 7 days, to choose their name and password. Trainers
            invite trainees from their classes.
          </p>
          {/* A fresh form after a successful invitation, so the next address starts empty. */}
          <Form
            method="post"
            className="grid items-end gap-3 sm:grid-cols-[1fr_10rem_auto]"
            key={inviteResult?.ok ? inviteResult.message : "invite"}
            noValidate
          >
            <Field
              label="E-mail"
              name="email"
              type="email"
              required
              autoComplete="off"
              defaultValue={inviteResult && !inviteResult.ok ? inviteResult.email : ""}
            />
            <div>
              <label className="label" htmlFor="invite-role">
                Role
              </label>
              <select
                id="invite-role"
                name="role"
                className="field"
                defaultValue={inviteResult && !inviteResult.ok ? inviteResult.role : "trainer"}
              >
                {INVITABLE.map((r) => (
                  <option key={r} value={r}>
                    {ROLE_LABELS[r]}
                  </option>
                ))}
              </select>
            </div>
            <SubmitButton intent="invite" pendingText="Sending…">
              Send invitation
            </SubmitButton>
          </Form>
          {inviteResult ? (
            inviteResult.ok ? (
              <FormNotice message={inviteResult.message} />
            ) : (
              <FormError message={inviteResult.message} />
            )
          ) : null}
        </section>

        <section className="card grid gap-3" aria-labelledby="signup-heading">
          <h2 id="signup-heading" className="text-lg font-bold">
            Designer self sign-up
          </h2>
          <p className="text-sm">
            {openSignup ? (
              <>
                <strong className="text-ok">Open.</strong> Anyone can create a designer account at <code>/signup</code>.
              </>
            ) : (
              <>
                <strong>Closed.</strong> Accounts are made by invitation only.
              </>
            )}
          </p>
          <Form method="post">
            <input type="hidden" name="open" value={openSignup ? "off" : "on"} />
            <SubmitButton intent="signup" pendingText="Saving…" className="btn">
              {openSignup ? "Close sign-up" : "Open sign-up for designers"}
            </SubmitButton>
          </Form>
          {result?.intent === "signup" ? <FormNotice message={result.message} /> : null}
        </section>
      </div>

      <section className="grid gap-3" aria-labelledby="users-heading">
        <div className="flex flex-wrap items-end justify-between gap-3">
          <h2 id="users-heading" className="text-lg font-bold">
            Users{" "}
            <span className="font-normal text-ink-soft">
              ({filtered ? `${users.length} of ${total} match` : total})
            </span>
          </h2>
          <Form method="get" className="flex flex-wrap items-end gap-2" role="search">
            <div>
              <label className="label" htmlFor="q">
                Search
              </label>
              <input
                id="q"
                name="q"
                type="search"
                className="field w-56"
                placeholder="Name or e-mail"
                defaultValue={filters.q}
              />
            </div>
            <div>
              <label className="label" htmlFor="role-filter">
                Role
              </label>
              <select id="role-filter" name="role" className="field" defaultValue={filters.role ?? ""}>
                <option value="">Any role</option>
                {ROLES.map((r) => (
                  <option key={r} value={r}>
                    {ROLE_LABELS[r]}
                  </option>
                ))}
              </select>
            </div>
            <div>
              <label className="label" htmlFor="status-filter">
                Status
              </label>
              <select id="status-filter" name="status" className="field" defaultValue={filters.status ?? ""}>
                <option value="">Any status</option>
                {Object.entries(STATUSES).map(([k, v]) => (
                  <option key={k} value={k}>
                    {v}
                  </option>
                ))}
              </select>
            </div>
            <button type="submit" className="btn">
              Filter
            </button>
            {filtered ? (
              <a className="self-center text-sm underline" href="/admin">
                Clear
              </a>
            ) : null}
          </Form>
        </div>
        {rowResult && rowResult.intent !== "signup" ? (
          rowResult.ok ? (
            <FormNotice message={rowResult.message} />
          ) : (
            <FormError message={rowResult.message} />
          )
        ) : null}
        {users.length === 0 ? (
          <p className="card text-ink-soft">
            {filtered
              ? `No users match ${searchParams.get("q") ? `“${searchParams.get("q")}”` : "these filters"}.`
              : "No users yet. Invite someone above."}
          </p>
        ) : (
          <div className="card overflow-x-auto p-0 max-sm:p-2">
            <table className="data-table card-table w-full">
              <thead>
                <tr>
                  <th scope="col">Name</th>
                  <th scope="col">E-mail</th>
                  <th scope="col">Role</th>
                  <th scope="col">Status</th>
                  <th scope="col">Last sign-in</th>
                  <th scope="col">
                    <span className="sr-only">Actions</span>
                  </th>
                </tr>
              </thead>
              <tbody>
                {users.map((u) => {
                  const self = u.id === me;
                  return (
                    <tr key={u.id} className={u.status === "deactivated" ? "text-ink-soft" : undefined}>
                      <td className="card-wide font-medium">
                        {u.name || <span className="text-ink-soft">—</span>}
                        {self ? <span className="ml-1 text-xs text-ink-soft">(you)</span> : null}
                      </td>
                      <td className="card-wide break-all" data-label="E-mail">
                        {u.email}
                      </td>
                      <td data-label="Role">
                        {self ? (
                          ROLE_LABELS[u.role]
                        ) : (
                          <Form method="post" className="flex items-center gap-1">
                            <input type="hidden" name="userId" value={u.id} />
                            <select
                              name="role"
                              aria-label={`Role of ${u.email}`}
                              className="field w-auto py-0.5"
                              defaultValue={u.role}
                              key={u.role}
                            >
                              {ROLES.map((r) => (
                                <option key={r} value={r}>
                                  {ROLE_LABELS[r]}
                                </option>
                              ))}
                            </select>
                            <button className="btn px-2 py-0.5 text-xs" type="submit" name="intent" value="role">
                              Change
                            </button>
                          </Form>
                        )}
                      </td>
                      <td data-label="Status">
                        <span
                          className={
                            u.status === "active" ? "text-ok" : u.status === "invited" ? "text-warn" : "text-bad"
                          }
                        >
                          {STATUSES[u.status]}
                        </span>
                      </td>
                      <td className="whitespace-nowrap" data-label="Last sign-in">
                        {u.lastSignInAt ? <When iso={u.lastSignInAt} /> : "never"}
                      </td>
                      <td className="card-wide">
                        <div className="flex flex-wrap justify-end gap-1">
                          {u.status === "invited" ? (
                            <Form method="post">
                              <input type="hidden" name="userId" value={u.id} />
                              <button className="btn px-2 py-0.5 text-xs" type="submit" name="intent" value="resend">
                                Resend invite
                              </button>
                            </Form>
                          ) : null}
                          {!self ? (
                            <Form method="post">
                              <input type="hidden" name="userId" value={u.id} />
                              {u.status === "deactivated" ? (
                                <button
                                  className="btn px-2 py-0.5 text-xs"
                                  type="submit"
                                  name="intent"
                                  value="reactivate"
                                >
                                  Reactivate
                                </button>
                              ) : (
                                <DeactivateButton name={u.name} />
                              )}
                            </Form>
                          ) : null}
                        </div>
                      </td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </div>
        )}
      </section>
    </div>
  );
}

/** Deactivating signs the person out at once, so it asks first (Escape or "Keep" backs out). */
function DeactivateButton({ name }: { name: string }) {
  const [asking, setAsking] = useState(false);
  if (!asking) {
    return (
      <button className="btn px-2 py-0.5 text-xs" type="button" onClick={() => setAsking(true)}>
        Deactivate
      </button>
    );
  }
  return (
    <span
      className="flex items-center gap-1 text-xs"
      role="group"
      aria-label={`Deactivate ${name}?`}
      onKeyDown={(e) => e.key === "Escape" && setAsking(false)}
    >
      <span>Sign {name} out and block?</span>
      <button className="btn px-2 py-0.5 text-xs text-bad" type="submit" name="intent" value="deactivate" autoFocus>
        Deactivate
      </button>
      <button className="btn px-2 py-0.5 text-xs" type="button" onClick={() => setAsking(false)}>
        Keep
      </button>
    </span>
  );
}
