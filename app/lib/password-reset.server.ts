/**
 * Password reset by e-mail: the same answer whether or not the address has an account, a
 * single-use link that expires in an hour, and every session ended when the password changes.
 */
import type { AppLoadContext } from "react-router";
import { audit } from "~/lib/audit.server";
import { db } from "~/lib/db.server";
import { appOrigin } from "~/lib/app-url";
import { resetMessage, sendMail } from "~/lib/mail.server";
import { hashPassword } from "~/lib/password.server";
import { newPasswordFields, type PasswordFormResult } from "~/lib/password-form.server";
import { clientIp, hitAll, LIMITS, waitPhrase } from "~/lib/rate-limit.server";
import { createSession, destroyAllSessions } from "~/lib/session.server";
import { consumeToken, issueToken, peekToken, sha256 } from "~/lib/tokens.server";

export const RESET_TTL_MINUTES = 60;

export const RESET_REQUESTED =
  "If that address belongs to an account, we have sent it a link to choose a new password. It works once, for an hour. Check your inbox (and the spam folder).";

export type ResetRequestResult =
  | { ok: true; status: 200; message: string; email: string }
  | { ok: false; status: 400 | 429; formError: string; email: string; retryAfter?: number };

/** Handles the "forgot password" form. Unknown and known addresses get the same answer. */
export async function requestPasswordReset(
  request: Request,
  context?: AppLoadContext | null,
): Promise<ResetRequestResult> {
  const form = await request.formData();
  const typed = String(form.get("email") ?? "")
    .trim()
    .slice(0, 320);
  const email = typed.toLowerCase();
  if (!email || !email.includes("@"))
    return { ok: false, status: 400, formError: "Enter the e-mail address you sign in with.", email: typed };
  const ip = clientIp(context);
  const limited = await hitAll([
    { key: `reset:account:${email}`, ...LIMITS.resetAccount },
    { key: `reset:ip:${ip}`, ...LIMITS.resetIp },
  ]);
  if (!limited.ok) {
    return {
      ok: false,
      status: 429,
      retryAfter: limited.retryAfter,
      formError: `Too many reset requests. Wait ${waitPhrase(limited.retryAfter)} and try again.`,
      email: typed,
    };
  }
  const user = await db()("users")
    .whereRaw("lower(email) = ?", [email])
    .where({ active: true })
    .whereNotNull("password_hash")
    .first<{ id: string; email: string } | undefined>("id", "email");
  if (user) {
    const token = await issueToken({
      kind: "reset",
      email: user.email,
      userId: user.id,
      ttlSeconds: RESET_TTL_MINUTES * 60,
    });
    await audit({ action: "password_reset_requested", subjectId: user.id, ip });
    // Not awaited: the answer must not take longer for a real account than for an unknown one.
    sendMail(
      resetMessage({
        to: user.email,
        link: `${appOrigin()}/reset-password/${token}`,
        expiresMinutes: RESET_TTL_MINUTES,
      }),
    ).catch((error: unknown) =>
      console.warn(`[mail] reset link not sent:`, error instanceof Error ? error.message : error),
    );
  }
  return { ok: true, status: 200, message: RESET_REQUESTED, email: typed };
}

/** Whether a reset link can still be used, and for which address (shown on the form). */
export async function findResetToken(
  token: string,
): Promise<{ state: "valid"; email: string } | { state: "used" | "expired" | "unknown" }> {
  const found = await peekToken("reset", token);
  return found.state === "valid" ? { state: "valid", email: found.row.email } : found;
}

/** Sets the new password, ends every session of the account, and signs this browser in afresh. */
export async function resetPassword(
  request: Request,
  token: string,
  context?: AppLoadContext | null,
): Promise<PasswordFormResult> {
  const form = await request.formData();
  const peek = await peekToken("reset", token);
  const fields = newPasswordFields(form, { email: peek.state === "valid" ? peek.row.email : undefined });
  if (!fields.ok) return fields.result;
  const ip = clientIp(context);
  const limited = await hitAll([
    { key: `token:ip:${ip}`, ...LIMITS.tokenIp },
    { key: `token:reset:${sha256(token)}`, ...LIMITS.tokenUse },
  ]);
  if (!limited.ok)
    return {
      ok: false,
      status: 429,
      retryAfter: limited.retryAfter,
      formError: `Too many attempts. Wait ${waitPhrase(limited.retryAfter)} and try again.`,
      values: {},
    };
  const hash = await hashPassword(fields.password);
  const userId = await db().transaction(async (trx) => {
    const row = await consumeToken("reset", token, trx);
    if (!row?.user_id) return null;
    const [user] = await trx("users")
      .where({ id: row.user_id, active: true })
      .update({ password_hash: hash, password_changed_at: trx.fn.now() })
      .returning("id");
    if (!user) return null;
    // Any other reset links for this account die with the old password.
    await trx("tokens")
      .where({ kind: "reset", user_id: row.user_id })
      .whereNull("used_at")
      .update({ used_at: trx.fn.now() });
    const ended = await destroyAllSessions(row.user_id, trx);
    await audit(
      { action: "password_reset", actorId: row.user_id, subjectId: row.user_id, detail: { sessionsEnded: ended }, ip },
      trx,
    );
    return row.user_id as string;
  });
  if (!userId)
    return {
      ok: false,
      status: 410,
      formError: "This reset link has expired or was already used. Ask for a new one.",
      values: {},
    };
  const setCookie = await createSession(request, userId);
  return { ok: true, userId, setCookie };
}
