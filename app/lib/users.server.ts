/** Account changes made by admins (role, deactivation, sign-up setting) and by users themselves. */
import type { AppLoadContext } from "react-router";
import { z } from "zod";
import { audit } from "~/lib/audit.server";
import { db } from "~/lib/db.server";
import { hashPassword, verifyPassword } from "~/lib/password.server";
import { newPasswordFields, NAME_MAX, type PasswordFormResult } from "~/lib/password-form.server";
import { ROLES, type Role } from "~/lib/permissions";

const isRole = (value: string): value is Role => (ROLES as readonly string[]).includes(value);
import { clientIp, hit, hitAll, LIMITS, waitPhrase } from "~/lib/rate-limit.server";
import { createSession, destroyAllSessions, type SessionUser } from "~/lib/session.server";
import { isUnitSystem } from "~/lib/units";

export type UserStatus = "active" | "invited" | "deactivated";

export interface UserListRow {
  id: string;
  email: string;
  name: string;
  role: Role;
  status: UserStatus;
  createdAt: string;
  lastSignInAt: string | null;
}

export async function listUsers(o: {
  organisationId: string;
  q?: string;
  role?: Role | null;
  status?: UserStatus | null;
  limit?: number;
}): Promise<{ rows: UserListRow[]; total: number }> {
  const k = db();
  const base = k("users as u").where("u.organisation_id", o.organisationId);
  if (o.q) {
    const like = `%${o.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    base.andWhere((w) => w.whereILike("u.email", like).orWhereILike("u.name", like));
  }
  if (o.role) base.andWhere("u.role", o.role);
  if (o.status === "deactivated") base.andWhere("u.active", false);
  if (o.status === "invited") base.andWhere("u.active", true).whereNull("u.password_hash");
  if (o.status === "active") base.andWhere("u.active", true).whereNotNull("u.password_hash");
  const [{ total }] = await base.clone().count<{ total: string }[]>({ total: "*" });
  const rows = await base
    .orderByRaw("lower(nullif(u.name, '')) nulls last, lower(u.email)")
    .limit(o.limit ?? 200)
    .select(
      "u.id",
      "u.email",
      "u.name",
      "u.role",
      k.raw(
        `case when not u.active then 'deactivated' when u.password_hash is null then 'invited' else 'active' end as status`,
      ),
      k.raw(`to_char(u.created_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS"Z"') as "createdAt"`),
      k.raw(
        `(select to_char(max(a.at) at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS"Z"') from audit_log a where a.subject_id = u.id and a.action = 'sign_in') as "lastSignInAt"`,
      ),
    );
  return { rows, total: Number(total) };
}

export type AdminResult = { ok: true; message: string } | { ok: false; message: string };

async function targetUser(actor: SessionUser, userId: string) {
  if (!z.uuid().safeParse(userId).success) return undefined;
  return db()("users")
    .where({ id: userId, organisation_id: actor.organisationId })
    .first<{ id: string; email: string; role: Role; active: boolean } | undefined>("id", "email", "role", "active");
}

async function otherActiveAdmins(actor: SessionUser, exceptId: string): Promise<number> {
  const [{ n }] = await db()("users")
    .where({ organisation_id: actor.organisationId, role: "admin", active: true })
    .whereNot({ id: exceptId })
    .count<{ n: string }[]>({ n: "*" });
  return Number(n);
}

export async function changeRole(
  actor: SessionUser,
  userId: string,
  role: string,
  ip?: string | null,
): Promise<AdminResult> {
  if (!isRole(role)) return { ok: false, message: "Choose one of the four roles." };
  const user = await targetUser(actor, userId);
  if (!user) return { ok: false, message: "No such user." };
  if (user.id === actor.id) return { ok: false, message: "You cannot change your own role; ask another admin." };
  if (user.role === role) return { ok: true, message: `${user.email} is already a ${role}.` };
  if (user.role === "admin" && (await otherActiveAdmins(actor, user.id)) === 0)
    return { ok: false, message: "Keep at least one active admin." };
  await db().transaction(async (trx) => {
    await trx("users").where({ id: user.id }).update({ role });
    await audit(
      { action: "role_changed", actorId: actor.id, subjectId: user.id, detail: { from: user.role, to: role }, ip },
      trx,
    );
  });
  return { ok: true, message: `${user.email} is now a ${role}.` };
}

/** Deactivation ends every session at once and blocks sign-in; reactivation lets the old password work again. */
export async function setActive(
  actor: SessionUser,
  userId: string,
  active: boolean,
  ip?: string | null,
): Promise<AdminResult> {
  const user = await targetUser(actor, userId);
  if (!user) return { ok: false, message: "No such user." };
  if (user.id === actor.id) return { ok: false, message: "You cannot deactivate your own account." };
  if (user.active === active)
    return { ok: true, message: `${user.email} is already ${active ? "active" : "deactivated"}.` };
  await db().transaction(async (trx) => {
    await trx("users").where({ id: user.id }).update({ active });
    const ended = active ? 0 : await destroyAllSessions(user.id, trx);
    await audit(
      {
        action: active ? "user_reactivated" : "user_deactivated",
        actorId: actor.id,
        subjectId: user.id,
        detail: active ? {} : { sessionsEnded: ended },
        ip,
      },
      trx,
    );
  });
  return {
    ok: true,
    message: active ? `${user.email} can sign in again.` : `${user.email} is deactivated and signed out everywhere.`,
  };
}

/** The organisation whose sign-up page this is: there is one per installation. */
export async function primaryOrganisation(): Promise<
  { id: string; name: string; open_designer_signup: boolean } | undefined
> {
  return db()("organisations").orderBy("created_at").first("id", "name", "open_designer_signup");
}

export async function setOpenSignup(actor: SessionUser, open: boolean, ip?: string | null): Promise<AdminResult> {
  await db().transaction(async (trx) => {
    await trx("organisations").where({ id: actor.organisationId }).update({ open_designer_signup: open });
    await audit({ action: "signup_setting_changed", actorId: actor.id, detail: { open }, ip }, trx);
  });
  return { ok: true, message: open ? "Designers can now sign up on their own at /signup." : "Self sign-up is closed." };
}

export async function changeName(user: SessionUser, rawName: string, ip?: string | null): Promise<AdminResult> {
  const name = rawName.trim().replace(/\s+/g, " ");
  if (!name) return { ok: false, message: "Enter your name." };
  if (name.length > NAME_MAX) return { ok: false, message: `Use at most ${NAME_MAX} characters.` };
  await db()("users").where({ id: user.id }).update({ name });
  await audit({ action: "profile_changed", actorId: user.id, subjectId: user.id, ip });
  return { ok: true, message: "Your name is saved." };
}

/** Metric, US customary, or "auto" (null: follow each roof's rule set). */
export async function changeUnits(user: SessionUser, raw: unknown, ip?: string | null): Promise<AdminResult> {
  const units = raw === "auto" || raw === "" ? null : isUnitSystem(raw) ? raw : undefined;
  if (units === undefined) return { ok: false, message: "Choose metric, US customary or the roof's rule set." };
  await db()("users").where({ id: user.id }).update({ units });
  await audit({
    action: "profile_changed",
    actorId: user.id,
    subjectId: user.id,
    detail: { units: units ?? "auto" },
    ip,
  });
  return { ok: true, message: "Your units are saved." };
}

/** Needs the current password; ends every session (other devices too) and keeps this browser signed in with a new one. */
export async function changePassword(
  request: Request,
  user: SessionUser,
  form: FormData,
  context?: AppLoadContext | null,
): Promise<PasswordFormResult> {
  const fields = newPasswordFields(form, { email: user.email });
  if (!fields.ok) return fields.result;
  const ip = clientIp(context);
  const limited = await hit(`password-change:${user.id}`, LIMITS.signInAccount);
  if (!limited.ok)
    return {
      ok: false,
      status: 429,
      retryAfter: limited.retryAfter,
      formError: `Too many attempts. Wait ${waitPhrase(limited.retryAfter)} and try again.`,
      values: {},
    };
  const row = await db()("users").where({ id: user.id }).first("password_hash");
  if (!(await verifyPassword(String(form.get("current") ?? ""), row?.password_hash))) {
    return { ok: false, status: 400, fieldErrors: { current: "That is not your current password." }, values: {} };
  }
  const hash = await hashPassword(fields.password);
  await db().transaction(async (trx) => {
    await trx("users").where({ id: user.id }).update({ password_hash: hash, password_changed_at: trx.fn.now() });
    const ended = await destroyAllSessions(user.id, trx);
    await audit(
      { action: "password_changed", actorId: user.id, subjectId: user.id, detail: { sessionsEnded: ended }, ip },
      trx,
    );
  });
  const setCookie = await createSession(request, user.id);
  return { ok: true, userId: user.id, setCookie };
}

const SignUpEmail = z.email("Enter a valid e-mail address.").max(320);

/** Open self sign-up for designers, when the admin has switched it on. */
export async function signUpDesigner(
  request: Request,
  form: FormData,
  context?: AppLoadContext | null,
): Promise<PasswordFormResult> {
  const org = await primaryOrganisation();
  if (!org?.open_designer_signup) return { ok: false, status: 404, formError: "Sign-up is closed.", values: {} };
  const typedEmail = String(form.get("email") ?? "")
    .trim()
    .slice(0, 320);
  const email = SignUpEmail.safeParse(typedEmail.toLowerCase());
  const fields = newPasswordFields(form, { withName: true, email: typedEmail });
  const values = { email: typedEmail, ...(fields.ok ? fields.values : fields.result.values) };
  if (!email.success || !fields.ok) {
    const fieldErrors = fields.ok ? {} : { ...fields.result.fieldErrors };
    if (!email.success) fieldErrors.email = "Enter a valid e-mail address.";
    return { ok: false, status: 400, fieldErrors, values };
  }
  const ip = clientIp(context);
  const limited = await hitAll([{ key: `signup:ip:${ip}`, ...LIMITS.signUpIp }]);
  if (!limited.ok)
    return {
      ok: false,
      status: 429,
      retryAfter: limited.retryAfter,
      formError: `Too many sign-ups from this address. Wait ${waitPhrase(limited.retryAfter)} and try again.`,
      values,
    };
  const hash = await hashPassword(fields.password);
  const userId = await db().transaction(async (trx) => {
    const taken = await trx("users").whereRaw("lower(email) = ?", [email.data]).first("id");
    if (taken) return null;
    const [row] = await trx("users")
      .insert({
        organisation_id: org.id,
        email: email.data,
        name: fields.name,
        role: "designer",
        password_hash: hash,
        password_changed_at: trx.fn.now(),
      })
      .returning("id");
    await audit({ action: "signed_up", actorId: row.id, subjectId: row.id, detail: { role: "designer" }, ip }, trx);
    return row.id as string;
  });
  if (!userId) {
    return {
      ok: false,
      status: 400,
      fieldErrors: { email: "There is already an account for that address. Sign in, or reset your password." },
      values,
    };
  }
  const setCookie = await createSession(request, userId);
  await audit({ action: "sign_in", actorId: userId, subjectId: userId, ip });
  return { ok: true, userId, setCookie };
}
