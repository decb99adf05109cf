import { db } from "~/lib/db.server";
import { createInvitation, type Inviter } from "~/lib/invitations.server";
import { parseAddressList, type InviteReport } from "~/lib/roster";

/**
 * Invites a pasted list of addresses into a class. Addresses already in the class or with a
 * live invitation to it are skipped; every other valid one goes through createInvitation,
 * which e-mails a single-use link (to an existing trainee account: a link to accept joining).
 */
export async function inviteToClass(o: {
  classId: string;
  text: string;
  inviter: Inviter;
  origin: string;
  ip?: string | null;
}): Promise<InviteReport> {
  const parsed = parseAddressList(o.text);
  const report: InviteReport = {
    invited: [],
    askedToJoin: [],
    alreadyMember: [],
    alreadyInvited: [],
    invalid: parsed.invalid,
    repeated: parsed.repeated,
    refused: [],
    mailFailed: [],
    truncated: parsed.truncated,
  };
  if (!parsed.valid.length) return report;
  const k = db();
  const emails = (rows: { email: string }[]) => new Set(rows.map((r) => r.email.toLowerCase()));
  const members = emails(
    await k("class_members as m")
      .join("users as u", "u.id", "m.user_id")
      .where("m.class_id", o.classId)
      .select("u.email"),
  );
  const pending = emails(
    await k("tokens")
      .where({ class_id: o.classId, kind: "invitation" })
      .whereNull("used_at")
      .where("expires_at", ">", k.fn.now())
      .select("email"),
  );
  for (const email of parsed.valid) {
    if (members.has(email)) report.alreadyMember.push(email);
    else if (pending.has(email)) report.alreadyInvited.push(email);
    else {
      const result = await createInvitation({
        email,
        role: "trainee",
        classId: o.classId,
        invitedBy: o.inviter,
        origin: o.origin,
        ip: o.ip,
      });
      if (result.status === "refused") report.refused.push({ email, message: result.message });
      else {
        (result.status === "sent" ? report.invited : report.askedToJoin).push(email);
        if (!result.emailSent) report.mailFailed.push(email);
      }
    }
  }
  return report;
}
