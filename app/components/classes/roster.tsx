import { Day } from "~/components/dates";
import { Form } from "react-router";
import { UserMinus } from "lucide-react";

interface Member {
  id: string;
  name: string;
  email: string;
  joined_at: string;
}

interface Pending {
  email: string;
  invited_at: string;
  expires_at: string;
  expired: boolean;
}

function confirmFirst(message: string) {
  return (e: React.FormEvent) => {
    if (!window.confirm(message)) e.preventDefault();
  };
}

export function RosterTable({ members, className }: { members: Member[]; className: string }) {
  if (!members.length) {
    return (
      <p className="text-sm text-ink-soft">
        Nobody has joined yet. Invite trainees below; they appear here once they accept.
      </p>
    );
  }
  return (
    <div className="overflow-x-auto">
      <table className="data-table w-full">
        <caption className="sr-only">Trainees in {className}</caption>
        <thead>
          <tr>
            <th scope="col">Name</th>
            <th scope="col">E-mail</th>
            <th scope="col">Joined</th>
            <th scope="col">
              <span className="sr-only">Remove</span>
            </th>
          </tr>
        </thead>
        <tbody>
          {members.map((m) => (
            <tr key={m.id}>
              <td className="font-medium">{m.name || <span className="text-ink-soft">(no name yet)</span>}</td>
              <td className="break-all">{m.email}</td>
              <td className="whitespace-nowrap">
                <Day iso={m.joined_at} />
              </td>
              <td className="text-right">
                <Form
                  method="post"
                  onSubmit={confirmFirst(`Remove ${m.name || m.email} from ${className}? Their attempts are kept.`)}
                >
                  <input type="hidden" name="intent" value="remove" />
                  <input type="hidden" name="userId" value={m.id} />
                  <button type="submit" className="btn" aria-label={`Remove ${m.name || m.email}`}>
                    <UserMinus aria-hidden="true" className="h-4 w-4" /> Remove
                  </button>
                </Form>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

export function PendingInvitations({ pending }: { pending: Pending[] }) {
  if (!pending.length) return <p className="text-sm text-ink-soft">No invitations waiting for an answer.</p>;
  return (
    <ul className="divide-y divide-rule">
      {pending.map((p) => (
        <li key={p.email} className="flex flex-wrap items-center justify-between gap-2 py-2 text-sm">
          <span className="break-all">
            <span className="font-medium">{p.email}</span>
            <span className="block text-xs text-ink-soft">
              Invited <Day iso={p.invited_at} /> ·{" "}
              {p.expired ? (
                <strong className="text-bad">link expired: paste the address again to resend</strong>
              ) : (
                <>
                  link valid until <Day iso={p.expires_at} />
                </>
              )}
            </span>
          </span>
          {p.expired ? null : (
            <Form
              method="post"
              onSubmit={confirmFirst(`Withdraw the invitation to ${p.email}? The link stops working.`)}
            >
              <input type="hidden" name="intent" value="withdraw" />
              <input type="hidden" name="email" value={p.email} />
              <button type="submit" className="btn" aria-label={`Withdraw the invitation to ${p.email}`}>
                Withdraw
              </button>
            </Form>
          )}
        </li>
      ))}
    </ul>
  );
}
