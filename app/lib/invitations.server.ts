/**
 * Invitations: an admin invites trainers and designers, a trainer (or admin) invites trainees,
 * optionally into a class. The invited address gets a pending account (no password) and an
 * e-mail with a single-use link that expires in seven days; accepting it sets name and password.
 */
import type { AppLoadContext } from "react-router";
import { z } from "zod";
import { audit } from "~/lib/audit.server";
import { db } from "~/lib/db.server";
import { invitationMessage, noticeMessage, sendMail } from "~/lib/mail.server";
import { hashPassword } from "~/lib/password.server";
import { can, ROLE_LABELS, ROLES, type Role } from "~/lib/permissions";
import { clientIp, hitAll, LIMITS, waitPhrase } from "~/lib/rate-limit.server";
import { createSession, type SessionUser } from "~/lib/session.server";
import { consumeToken, issueToken, peekToken, sha256 } from "~/lib/tokens.server";
import { newPasswordFields, type PasswordFormResult } from "~/lib/password-form.server";

export const INVITATION_TTL_DAYS = 7;

export type Inviter = Pick<SessionUser, "id" | "role" | "organisationId">;

export type InvitationResult =
  | { status: "sent"; userId: string; emailSent: boolean }
  /** An existing trainee account asked to join a class: it joins only when it accepts the e-mailed link. */
  | { status: "asked_to_join"; userId: string; emailSent: boolean }
  | { status: "refused"; message: string };

const Email = z.email("Enter a valid e-mail address.").max(320);

/** Which roles an inviter may hand out: trainees need "invite:trainee", everyone else "invite:staff". */
export function mayInvite(inviterRole: Role, role: Role): boolean {
  return can(inviterRole, role === "trainee" ? "invite:trainee" : "invite:staff");
}

/**
 * Invites `email` as `role` (into `classId` when given) and e-mails the link. An existing trainee
 * account invited into a class gets a link too and joins only when it accepts, signed in as
 * itself: a trainer must never be able to enrol someone's account (and so read their attempts)
 * without their consent.
 */
export async function createInvitation(o: {
  email: string;
  role: Role;
  classId?: string | null;
  invitedBy: Inviter;
  origin: string;
  ip?: string | null;
}): Promise<InvitationResult> {
  const parsed = Email.safeParse(o.email.trim().toLowerCase());
  if (!parsed.success) return { status: "refused", message: "Enter a valid e-mail address." };
  const email = parsed.data;
  if (!ROLES.includes(o.role)) return { status: "refused", message: "Choose a role." };
  if (!mayInvite(o.invitedBy.role, o.role))
    return { status: "refused", message: `Your account cannot invite a ${ROLE_LABELS[o.role].toLowerCase()}.` };

  const k = db();
  let cls: { id: string; name: string } | undefined;
  if (o.classId) {
    if (o.role !== "trainee") return { status: "refused", message: "Only trainees join classes." };
    const q = k("classes").where({ id: o.classId, organisation_id: o.invitedBy.organisationId });
    if (o.invitedBy.role !== "admin") q.andWhere({ trainer_id: o.invitedBy.id });
    cls = await q.first("id", "name");
    if (!cls) return { status: "refused", message: "That class is not one of yours." };
  }

  const outcome = await k.transaction(async (trx) => {
    const existing = await trx("users")
      .whereRaw("lower(email) = ?", [email])
      .forUpdate()
      .first<
        { id: string; role: Role; organisation_id: string; password_hash: string | null; active: boolean } | undefined
      >("id", "role", "organisation_id", "password_hash", "active");
    if (existing && (existing.organisation_id !== o.invitedBy.organisationId || !existing.active)) {
      return {
        status: "refused" as const,
        message: "That address belongs to an account that cannot be invited. Ask an admin.",
      };
    }
    if (existing?.password_hash) {
      if (cls && existing.role === "trainee") {
        const token = await issueToken(
          {
            kind: "invitation",
            email,
            userId: existing.id,
            role: "trainee",
            classId: cls.id,
            createdBy: o.invitedBy.id,
            ttlSeconds: INVITATION_TTL_DAYS * 86400,
          },
          trx,
        );
        await audit(
          {
            action: "invitation_sent",
            actorId: o.invitedBy.id,
            subjectId: existing.id,
            detail: { email, role: o.role, classId: cls.id, existing: true },
            ip: o.ip,
          },
          trx,
        );
        return { status: "asked_to_join" as const, userId: existing.id, token };
      }
      return { status: "refused" as const, message: "There is already an account for that address." };
    }
    if (existing && existing.role !== o.role) {
      if (o.invitedBy.role !== "admin")
        return {
          status: "refused" as const,
          message: "That address already has a pending invitation for another role. Ask an admin.",
        };
      await trx("users").where({ id: existing.id }).update({ role: o.role });
    }
    const userId =
      existing?.id ??
      (
        await trx("users")
          .insert({ organisation_id: o.invitedBy.organisationId, email, role: o.role, name: "" })
          .returning("id")
      )[0].id;
    const token = await issueToken(
      {
        kind: "invitation",
        email,
        userId,
        role: o.role,
        classId: cls?.id,
        createdBy: o.invitedBy.id,
        ttlSeconds: INVITATION_TTL_DAYS * 86400,
      },
      trx,
    );
    await audit(
      {
        action: "invitation_sent",
        actorId: o.invitedBy.id,
        subjectId: userId,
        detail: { email, role: o.role, classId: cls?.id ?? null },
        ip: o.ip,
      },
      trx,
    );
    return { status: "sent" as const, userId, token };
  });
  if (outcome.status === "refused") return outcome;

  const [inviter, org] = await Promise.all([
    k("users").where({ id: o.invitedBy.id }).first("name", "email"),
    k("organisations").where({ id: o.invitedBy.organisationId }).first("name"),
  ]);
  const inviterName = inviter?.name || inviter?.email || "Someone";
  const message =
    outcome.status === "sent"
      ? invitationMessage({
          to: email,
          link: `${o.origin}/invite/${outcome.token}`,
          inviterName,
          roleLabel: ROLE_LABELS[o.role],
          organisationName: org?.name ?? "Fallwright",
          className: cls?.name,
          expiresDays: INVITATION_TTL_DAYS,
        })
      : noticeMessage({
          to: email,
          subject: `You are invited to join the class "${cls!.name}"`,
          heading: `${inviterName} invites you to a class`,
          paragraphs: [
            `${inviterName} would like you to join "${cls!.name}". If you accept, its trainer sees your attempts at the lessons of your classes and can review them.`,
            `Open the link, sign in with your own account and choose "Join the class". If you do not want to join, ignore this message; the link expires in ${INVITATION_TTL_DAYS} days.`,
          ],
          action: { label: "Accept or decline", url: `${o.origin}/invite/${outcome.token}` },
        });
  let emailSent = true;
  try {
    await sendMail(message);
  } catch (error) {
    emailSent = false;
    console.warn(`[mail] invitation to ${email} not sent:`, error instanceof Error ? error.message : error);
  }
  return { status: outcome.status, userId: outcome.userId, emailSent };
}

/** Sends a fresh link to a pending (not yet accepted) account. */
export async function resendInvitation(o: {
  userId: string;
  invitedBy: Inviter;
  origin: string;
  ip?: string | null;
}): Promise<InvitationResult> {
  const user = await db()("users")
    .where({ id: o.userId, organisation_id: o.invitedBy.organisationId })
    .first<{ email: string; role: Role; password_hash: string | null } | undefined>("email", "role", "password_hash");
  if (!user) return { status: "refused", message: "No such user." };
  if (user.password_hash)
    return {
      status: "refused",
      message: "That account is already set up; they can reset their password if they forgot it.",
    };
  return createInvitation({ email: user.email, role: user.role, invitedBy: o.invitedBy, origin: o.origin, ip: o.ip });
}

export type InvitationView =
  | {
      state: "valid";
      email: string;
      role: Role;
      organisationName: string;
      className: string | null;
      /** An account that is already set up, asked to join a class (it accepts while signed in as itself). */
      existingAccount: boolean;
      userId: string;
    }
  | { state: "used" | "expired" | "unknown" };

/** What the invitation page shows before the link is used. */
export async function findInvitation(token: string): Promise<InvitationView> {
  const found = await peekToken("invitation", token);
  if (found.state !== "valid") return { state: found.state };
  const k = db();
  const user = await k("users as u")
    .join("organisations as o", "o.id", "u.organisation_id")
    .where("u.id", found.row.user_id)
    .first<
      { email: string; role: Role; active: boolean; password_hash: string | null; organisation: string } | undefined
    >("u.email", "u.role", "u.active", "u.password_hash", "o.name as organisation");
  if (!user || !user.active) return { state: "used" };
  const cls = found.row.class_id ? await k("classes").where({ id: found.row.class_id }).first("name") : null;
  const existingAccount = !!user.password_hash;
  // A set-up account's link is only ever a class invitation (to a class that still exists).
  if (existingAccount && (!cls || user.role !== "trainee")) return { state: "used" };
  return {
    state: "valid",
    email: user.email,
    role: user.role,
    organisationName: user.organisation,
    className: cls?.name ?? null,
    existingAccount,
    userId: found.row.user_id!,
  };
}

export type JoinResult = { ok: true; classId: string } | { ok: false; status: 403 | 410; message: string };

/**
 * An existing account accepts a class invitation: only the invited account, signed in, can use
 * the link, and only once.
 */
export async function joinClassByInvitation(
  token: string,
  user: Pick<SessionUser, "id">,
  ip?: string | null,
): Promise<JoinResult> {
  const found = await peekToken("invitation", token);
  if (found.state !== "valid" || !found.row.class_id)
    return {
      ok: false,
      status: 410,
      message: "This invitation link has expired or was already used. Ask your trainer to send a new one.",
    };
  if (found.row.user_id !== user.id)
    return {
      ok: false,
      status: 403,
      message: "This invitation is for another account. Sign out and sign in as the invited address.",
    };
  const classId = await db().transaction(async (trx) => {
    const row = await consumeToken("invitation", token, trx);
    if (!row?.class_id || row.user_id !== user.id) return null;
    const cls = await trx("classes").where({ id: row.class_id }).first("id");
    if (!cls) return null;
    await trx("class_members")
      .insert({ class_id: cls.id, user_id: user.id })
      .onConflict(["class_id", "user_id"])
      .ignore();
    await audit(
      { action: "invitation_accepted", actorId: user.id, subjectId: user.id, detail: { classIds: [cls.id] }, ip },
      trx,
    );
    return cls.id as string;
  });
  if (!classId)
    return {
      ok: false,
      status: 410,
      message: "This invitation link has expired or was already used. Ask your trainer to send a new one.",
    };
  return { ok: true, classId };
}

/** Uses the invitation: sets name and password, joins the invited classes, signs in. */
export async function acceptInvitation(
  request: Request,
  token: string,
  context?: AppLoadContext | null,
): Promise<PasswordFormResult> {
  const form = await request.formData();
  const fields = newPasswordFields(form, { withName: true });
  if (!fields.ok) return fields.result;
  const ip = clientIp(context);
  const limited = await hitAll([
    { key: `token:ip:${ip}`, ...LIMITS.tokenIp },
    { key: `token:invitation:${sha256(token)}`, ...LIMITS.tokenUse },
  ]);
  if (!limited.ok)
    return {
      ok: false,
      status: 429,
      retryAfter: limited.retryAfter,
      formError: `Too many attempts. Wait ${waitPhrase(limited.retryAfter)} and try again.`,
      values: fields.values,
    };

  const hash = await hashPassword(fields.password);
  const userId = await db().transaction(async (trx) => {
    const row = await consumeToken("invitation", token, trx);
    if (!row?.user_id) return null;
    const [user] = await trx("users")
      .where({ id: row.user_id, active: true })
      .whereNull("password_hash")
      .update({ name: fields.name, password_hash: hash, password_changed_at: trx.fn.now() })
      .returning("id");
    if (!user) return null;
    // Every class this person was invited into, not only the one on this link.
    const others = await trx("tokens")
      .where({ kind: "invitation", user_id: row.user_id })
      .whereNull("used_at")
      .update({ used_at: trx.fn.now() })
      .returning("class_id");
    const classIds = [
      ...new Set(
        [row.class_id, ...others.map((t: { class_id: string | null }) => t.class_id)].filter((c): c is string => !!c),
      ),
    ];
    if (classIds.length) {
      const existing = await trx("classes").whereIn("id", classIds).pluck("id");
      if (existing.length) {
        await trx("class_members")
          .insert(existing.map((class_id: string) => ({ class_id, user_id: row.user_id! })))
          .onConflict(["class_id", "user_id"])
          .ignore();
      }
    }
    await audit(
      { action: "invitation_accepted", actorId: row.user_id, subjectId: row.user_id, detail: { classIds }, ip },
      trx,
    );
    return row.user_id;
  });
  if (!userId) {
    return {
      ok: false,
      status: 410,
      formError: "This invitation link has expired or was already used. Ask whoever invited you to send a new one.",
      values: fields.values,
    };
  }
  const setCookie = await createSession(request, userId);
  await audit({ action: "sign_in", actorId: userId, subjectId: userId, ip });
  return { ok: true, userId, setCookie };
}
