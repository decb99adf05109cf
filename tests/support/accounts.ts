/** Helpers for account tests: call route modules like React Router does, sign in, read e-mail from the SMTP fake's spool. */
import type { AppLoadContext } from "react-router";
import { db } from "~/lib/db.server";
import { readOutbox, type SpooledMessage } from "~/lib/outbox.server";
import { createSession } from "~/lib/session.server";

export const ORIGIN = "http://localhost";
export const DEMO_PASSWORD = "fallwright-demo";

export interface Outcome {
  status: number;
  headers: Headers;
  /** The loader's or action's data (for `data()` and plain returns), or null for a Response. */
  data: any;
  /** Location of a redirect. */
  location: string | null;
}

type RouteFn = (args: never) => unknown;

/**
 * Runs a loader or action with a Request, params and a load context (client IP), and folds
 * every way it can answer (return, `data()`, thrown redirect or Response) into one shape.
 */
export async function callRoute(
  fn: RouteFn,
  request: Request,
  o: { params?: Record<string, string>; ip?: string } = {},
): Promise<Outcome> {
  const context: AppLoadContext = { clientIp: o.ip ?? "192.0.2.10" };
  let out: unknown;
  try {
    out = await fn({ request, params: o.params ?? {}, context } as never);
  } catch (e) {
    out = e;
    if (!(e instanceof Response) && (e as { type?: string })?.type !== "DataWithResponseInit") throw e;
  }
  if (out instanceof Response) {
    return { status: out.status, headers: out.headers, data: null, location: out.headers.get("location") };
  }
  const d = out as { type?: string; data?: unknown; init?: ResponseInit | null };
  if (d?.type === "DataWithResponseInit") {
    const headers = new Headers(d.init?.headers);
    return { status: d.init?.status ?? 200, headers, data: d.data, location: headers.get("location") };
  }
  return { status: 200, headers: new Headers(), data: out, location: null };
}

export function formPost(path: string, fields: Record<string, string>, cookie?: string): Request {
  return new Request(ORIGIN + path, {
    method: "POST",
    headers: { "Content-Type": "application/x-www-form-urlencoded", ...(cookie ? { cookie } : {}) },
    body: new URLSearchParams(fields),
  });
}

export function get(path: string, cookie?: string): Request {
  return new Request(ORIGIN + path, { headers: cookie ? { cookie } : {} });
}

/** "name=value" from a Set-Cookie header, ready for a Cookie header. */
export function cookiePair(setCookie: string | null): string {
  if (!setCookie) throw new Error("no Set-Cookie header");
  return setCookie.split(";")[0];
}

export async function userIdOf(email: string): Promise<string> {
  const u = await db()("users").whereRaw("lower(email) = ?", [email.toLowerCase()]).first("id");
  if (!u) throw new Error(`no user ${email}`);
  return u.id;
}

/** A session cookie for a user, made the way sign-in makes one (no password check, no rate limit). */
export async function sessionCookie(email: string): Promise<string> {
  return cookiePair(await createSession(new Request(`${ORIGIN}/login`), await userIdOf(email)));
}

/** An address nobody else's test will use. */
export function uniqueAddress(tag: string): string {
  return `${tag}-${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 8)}@fallwright-test.example`;
}

/** Waits for the SMTP fake to keep a message to `to` (and matching `subject`), newest first. */
const LOADED_AT = Date.now() - 1000;

export async function waitForMail(
  to: string,
  o: { subject?: RegExp; timeoutMs?: number } = {},
): Promise<SpooledMessage> {
  const end = Date.now() + (o.timeoutMs ?? 10_000);
  for (;;) {
    const { configured, messages } = await readOutbox({ to, limit: 20 });
    if (!configured) throw new Error("MAIL_SPOOL_DIR is not set: run through `npm test`");
    // The spool outlives a run: only messages sent since this test file started count.
    const found = messages.find(
      (m) => Date.parse(m.receivedAt) >= LOADED_AT && (!o.subject || o.subject.test(m.subject)),
    );
    if (found) return found;
    if (Date.now() > end) throw new Error(`no e-mail to ${to} within ${o.timeoutMs ?? 10_000} ms`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** The first link in a message's text part whose path starts with `prefix` (e.g. "/invite/"). */
export function linkIn(message: SpooledMessage, prefix: string): URL {
  const m = new RegExp(`https?://[^\\s"<>]+${prefix.replace(/\//g, "\\/")}[A-Za-z0-9_-]+`).exec(message.text);
  if (!m) throw new Error(`no ${prefix} link in:\n${message.text}`);
  return new URL(m[0]);
}
