/**
 * Who is signed in, and the guards every loader and action uses. Sign-in goes through
 * remix-auth's Authenticator with the form strategy (fields `email`, `password`); the session
 * itself is a database row (see session.server.ts).
 */
import { data, redirect, type AppLoadContext } from "react-router";
import { Authenticator } from "remix-auth";
import { FormStrategy } from "remix-auth-form";
import { z } from "zod";
import { audit } from "~/lib/audit.server";
import { db, isDbUnavailable } from "~/lib/db.server";
import { hashPassword, needsRehash, verifyPassword } from "~/lib/password.server";
import { can, type Permission, type Role } from "~/lib/permissions";
import { noteUser } from "~/lib/request-context.server";
import { clearHits, clientIp, hit, LIMITS, peek, takeBackHits, waitPhrase } from "~/lib/rate-limit.server";
import {
  clearSessionCookie,
  createSession,
  destroySession,
  findLiveSession,
  type LiveSession,
  type SessionUser,
} from "~/lib/session.server";

export type { SessionUser } from "~/lib/session.server";

/** Thrown by the form strategy when the e-mail and password do not identify an active account. */
class InvalidCredentials extends Error {
  constructor(readonly userId: string | null) {
    super("invalid credentials");
  }
}

export const authenticator = new Authenticator<SessionUser>();

authenticator.use(
  new FormStrategy(async ({ form }) => {
    const email = String(form.get("email") ?? "")
      .trim()
      .toLowerCase();
    const password = String(form.get("password") ?? "");
    const row = await db()("users").whereRaw("lower(email) = ?", [email]).first<
      | {
          id: string;
          email: string;
          name: string;
          role: Role;
          organisation_id: string;
          password_hash: string | null;
          active: boolean;
        }
      | undefined
    >("id", "email", "name", "role", "organisation_id", "password_hash", "active");
    // Always one bcrypt compare (a dummy one without a hash), so unknown addresses take as long.
    const matches = await verifyPassword(password, row?.password_hash);
    if (!row || !matches || !row.active) throw new InvalidCredentials(row?.id ?? null);
    if (row.password_hash && needsRehash(row.password_hash)) {
      await db()("users")
        .where({ id: row.id })
        .update({ password_hash: await hashPassword(password) });
    }
    return { id: row.id, email: row.email, name: row.name, role: row.role, organisationId: row.organisation_id };
  }),
  "form",
);

const SignInForm = z.object({
  email: z.string().trim().min(1, "Enter your e-mail address.").max(320, "That e-mail address is too long."),
  password: z.string().min(1, "Enter your password.").max(1024, "That password is too long."),
});

export const SIGN_IN_FAILED = "That e-mail and password do not match an active account. Check both and try again.";

export type SignInResult =
  | { ok: true; user: SessionUser; setCookie: string }
  | {
      ok: false;
      status: 400 | 429;
      email: string;
      formError?: string;
      fieldErrors?: Partial<Record<"email" | "password", string>>;
      retryAfter?: number;
    };

/**
 * The whole sign-in: validate, count the attempt against the account and the address (before
 * any bcrypt work), check the password, start a fresh session. Unknown e-mail and wrong
 * password give the same answer.
 */
export async function signIn(request: Request, context?: AppLoadContext | null): Promise<SignInResult> {
  const form = await request.clone().formData();
  const typed = String(form.get("email") ?? "").slice(0, 320);
  const parsed = SignInForm.safeParse({ email: form.get("email") ?? "", password: form.get("password") ?? "" });
  if (!parsed.success) {
    const fieldErrors: Partial<Record<"email" | "password", string>> = {};
    for (const issue of parsed.error.issues) fieldErrors[issue.path[0] as "email" | "password"] ??= issue.message;
    return { ok: false, status: 400, email: typed, fieldErrors };
  }
  const email = parsed.data.email.toLowerCase();
  const ip = clientIp(context);
  const accountKey = { key: `signin:account:${email}`, ...LIMITS.signInAccount };
  const ipKey = { key: `signin:ip:${ip}`, ...LIMITS.signInIp };
  // This account's failures from this address, so its good sign-in here can take them back.
  const pairKey = { key: `signin:ip-account:${ip}:${email}`, ...LIMITS.signInIp };
  // Checked before bcrypt runs; only failures are counted (below). The account's limit always
  // holds. The address's limit stops spraying, yet an account that has signed in from this
  // address before is still let through to the password check: a class behind one address
  // is not locked out by someone spraying, or by its own typos, from the same network.
  let limited = await peek(accountKey.key, accountKey);
  if (limited.ok) {
    const fromIp = await peek(ipKey.key, ipKey);
    if (!fromIp.ok && !(await signedInFromHereBefore(email, ip))) limited = fromIp;
  }
  if (!limited.ok) {
    await audit({ action: "sign_in_limited", detail: { email }, ip });
    return {
      ok: false,
      status: 429,
      email: typed,
      retryAfter: limited.retryAfter,
      formError: `Too many sign-in attempts. Wait ${waitPhrase(limited.retryAfter)} and try again, or reset your password.`,
    };
  }
  let user: SessionUser;
  try {
    user = await authenticator.authenticate("form", request);
  } catch (error) {
    if (!(error instanceof InvalidCredentials)) throw error;
    await hit(accountKey.key, accountKey);
    await hit(ipKey.key, ipKey);
    await hit(pairKey.key, pairKey);
    await audit({ action: "sign_in_failed", subjectId: error.userId, detail: { email }, ip });
    return { ok: false, status: 400, email: typed, formError: SIGN_IN_FAILED };
  }
  // A good sign-in forgets the account's earlier failures, and takes its failures from this
  // address back from the address's count (a typo put right is not spraying).
  await takeBackHits(ipKey.key, pairKey.key);
  await clearHits(accountKey.key);
  noteUser(user.id);
  const setCookie = await createSession(request, user.id);
  await audit({ action: "sign_in", actorId: user.id, subjectId: user.id, ip });
  return { ok: true, user, setCookie };
}

/** Whether this e-mail's account signed in successfully from this address in the last 30 days (audit log). */
async function signedInFromHereBefore(email: string, ip: string): Promise<boolean> {
  const row = await db()("audit_log as a")
    .join("users as u", "u.id", "a.subject_id")
    .whereRaw("lower(u.email) = ?", [email])
    .andWhere("a.action", "sign_in")
    .andWhere("a.ip", ip)
    .andWhereRaw("a.at > now() - interval '30 days'")
    .first("a.id");
  return Boolean(row);
}

/** Ends the request's session; returns the Set-Cookie header that clears the cookie. */
export async function signOut(request: Request, context?: AppLoadContext | null): Promise<string> {
  const live = await getLiveSession(request);
  if (live) {
    await destroySession(live.sessionId);
    await audit({ action: "sign_out", actorId: live.user.id, subjectId: live.user.id, ip: clientIp(context) });
  }
  return clearSessionCookie(request);
}

const cache = new WeakMap<Request, Promise<LiveSession | null>>();

/** The live session and its user; looked up once per request however many loaders ask. */
export function getLiveSession(request: Request): Promise<LiveSession | null> {
  let found = cache.get(request);
  if (!found) {
    found = findLiveSession(request).then((live) => {
      noteUser(live?.user.id);
      return live;
    });
    cache.set(request, found);
  }
  return found;
}

export async function getOptionalUser(request: Request): Promise<SessionUser | null> {
  try {
    return (await getLiveSession(request))?.user ?? null;
  } catch (error) {
    // Every page asks this first: a database that is down becomes the friendly 503 page.
    if (isDbUnavailable(error))
      throw data("The database is not answering.", { status: 503, headers: { "Retry-After": "5" } });
    throw error;
  }
}

/** Stands in for the app's own origin while a target is parsed; it never appears in a redirect. */
const HERE = "http://fallwright.invalid";

/**
 * Only a same-origin path may be a redirect target. The target is parsed the way a browser
 * would parse a Location header (WHATWG URL parser, against the app's origin), which drops tabs
 * and newlines and reads backslashes as slashes, so "/\t/evil.example" or "/\\evil.example"
 * come out on another host and fall back. What is returned is the parsed path, query and
 * fragment, re-serialised: nothing the parser would read differently from us.
 */
export function safeRedirect(to: FormDataEntryValue | string | null | undefined, fallback = "/"): string {
  if (typeof to !== "string" || !to.startsWith("/") || to.length > 2048) return fallback;
  let url: URL;
  try {
    url = new URL(to, HERE);
  } catch {
    return fallback;
  }
  if (url.origin !== HERE) return fallback;
  const target = url.pathname + url.search + url.hash;
  return target.startsWith("/") && !target.startsWith("//") ? target : fallback;
}

/** The signed-in user, or a redirect to /login that comes back here afterwards. */
export async function requireUser(request: Request): Promise<SessionUser> {
  const user = await getOptionalUser(request);
  if (user) return user;
  const url = new URL(request.url);
  const back = request.method === "GET" ? url.pathname + url.search : url.pathname;
  throw redirect(`/login?${new URLSearchParams({ redirectTo: back })}`);
}

/** For JSON endpoints: 401 with a JSON body instead of a redirect to the sign-in page. */
export async function requireApiUser(request: Request): Promise<SessionUser> {
  const user = await getOptionalUser(request);
  if (user) return user;
  throw Response.json({ error: { message: "Sign in first.", issues: [] } }, { status: 401 });
}

/** Pages for signed-out visitors only (sign-in, sign-up): a signed-in user goes on to `to`. */
export async function requireAnonymous(request: Request, to = "/"): Promise<void> {
  if (await getOptionalUser(request)) throw redirect(to);
}

function forbidden(): never {
  throw data("Your account does not have access to this page.", { status: 403 });
}

export async function requirePermission(request: Request, permission: Permission): Promise<SessionUser> {
  const user = await requireUser(request);
  if (!can(user.role, permission)) forbidden();
  return user;
}

export async function requireRole(request: Request, ...roles: Role[]): Promise<SessionUser> {
  const user = await requireUser(request);
  if (!roles.includes(user.role)) forbidden();
  return user;
}
