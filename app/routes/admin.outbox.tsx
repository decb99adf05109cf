import { When } from "~/components/dates";
import type { Route } from "./+types/admin.outbox";
import { requirePermission } from "~/lib/auth.server";
import { readOutbox } from "~/lib/outbox.server";

export const meta: Route.MetaFunction = () => [{ title: "Outbox · Admin · Fallwright" }];

export async function loader({ request }: Route.LoaderArgs) {
  await requirePermission(request, "outbox:view");
  return readOutbox({ limit: 50 });
}

export default function AdminOutbox({ loaderData }: Route.ComponentProps) {
  const { configured, total, messages } = loaderData;
  return (
    <section className="grid gap-3" aria-labelledby="outbox-heading">
      <div>
        <h2 id="outbox-heading" className="text-lg font-bold">
          Outbox
        </h2>
        <p className="text-sm text-ink-soft">
          Messages caught by the local mail fake, newest first
          {total > messages.length ? ` (the latest ${messages.length} of ${total})` : ""}. Nothing here reached a real
          inbox.
        </p>
      </div>
      {!configured ? (
        <p className="card">
          No mail spool is configured (<code>MAIL_SPOOL_DIR</code> is not set), so e-mail goes straight to the SMTP
          server in <code>SMTP_URL</code> and is not kept here.
        </p>
      ) : messages.length === 0 ? (
        <p className="card text-ink-soft">No messages yet. Invitations and password resets will appear here.</p>
      ) : (
        <ul className="grid gap-2">
          {messages.map((m) => (
            <li key={m.id} className="card p-0">
              <details>
                <summary className="flex cursor-pointer flex-wrap items-baseline gap-x-4 gap-y-1 px-4 py-3">
                  <span className="font-medium">{m.subject || "(no subject)"}</span>
                  <span className="text-sm text-ink-soft">to {m.to.join(", ")}</span>
                  <span className="ml-auto text-sm text-ink-soft">
                    <When iso={m.receivedAt} />
                  </span>
                </summary>
                <div className="grid gap-4 border-t border-rule px-4 py-3 lg:grid-cols-2">
                  <div>
                    <p className="label">Text part</p>
                    <pre className="max-h-96 overflow-auto whitespace-pre-wrap rounded border border-rule bg-paper p-3 text-sm">
                      {m.text || "(empty)"}
                    </pre>
                  </div>
                  <div>
                    <p className="label">HTML part</p>
                    {m.html ? (
                      // sandbox with no permissions: no scripts, no forms, no navigation of this page.
                      <iframe
                        title={`HTML part of “${m.subject}”`}
                        sandbox=""
                        srcDoc={m.html}
                        className="h-96 w-full rounded border border-rule bg-sheet"
                      />
                    ) : (
                      <p className="text-sm text-ink-soft">(none)</p>
                    )}
                  </div>
                </div>
              </details>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
