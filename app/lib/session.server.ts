/**
 * Sessions are database rows (table `sessions`). The cookie carries a random value; the row's id
 * is its SHA-256, so a copy of the table cannot be turned back into cookies.
 */
import { db } from "~/lib/db.server";
import type { Role } from "~/lib/permissions";
import { randomToken, sha256 } from "~/lib/tokens.server";
import type { UnitsPreference } from "./units";

export const SESSION_COOKIE = "fw_session";
/** Signed out after this long without a request (sliding). */
export const IDLE_TIMEOUT_SECONDS = 2 * 60 * 60;
/** Signed out this long after signing in, however busy. */
export const ABSOLUTE_LIFETIME_SECONDS = 7 * 24 * 60 * 60;
/** last_seen_at is written at most this often, not on every request. */
const TOUCH_AFTER_SECONDS = 60;

export interface SessionRow {
  id: string;
  user_id: string;
  created_at: Date;
  last_seen_at: Date;
  expires_at: Date;
  user_agent: string | null;
}

export function readCookie(request: Request, name: string): string | null {
  const header = request.headers.get("cookie");
  if (!header) return null;
  for (const part of header.split(";")) {
    const eq = part.indexOf("=");
    if (eq < 0) continue;
    if (part.slice(0, eq).trim() === name) {
      try {
        return decodeURIComponent(part.slice(eq + 1).trim());
      } catch {
        return null;
      }
    }
  }
  return null;
}

/** Secure when the request came over https (or the operator says it is behind TLS), so plain-http localhost still works. */
function isSecure(request: Request): boolean {
  return process.env.HTTPS === "1" || new URL(request.url).protocol === "https:";
}

function cookieHeader(request: Request, value: string, maxAge: number): string {
  const parts = [`${SESSION_COOKIE}=${value}`, "Path=/", "HttpOnly", "SameSite=Lax", `Max-Age=${maxAge}`];
  if (isSecure(request)) parts.push("Secure");
  return parts.join("; ");
}

export function clearSessionCookie(request: Request): string {
  return cookieHeader(request, "", 0);
}

export function sessionIdFrom(request: Request): string | null {
  const value = readCookie(request, SESSION_COOKIE);
  return value && /^[A-Za-z0-9_-]{43}$/.test(value) ? sha256(value) : null;
}

/**
 * Starts a new session for the user and returns the Set-Cookie header. Any session the request
 * already carried is ended first: the id always changes at sign-in.
 */
export async function createSession(request: Request, userId: string): Promise<string> {
  const previous = sessionIdFrom(request);
  const value = randomToken();
  await db().transaction(async (trx) => {
    if (previous) await trx("sessions").where({ id: previous }).delete();
    await trx("sessions")
      .where({ user_id: userId })
      .andWhere((q) =>
        q
          .where("expires_at", "<=", trx.fn.now())
          .orWhere("last_seen_at", "<=", trx.raw(`now() - make_interval(secs => ?)`, [IDLE_TIMEOUT_SECONDS])),
      )
      .delete();
    await trx("sessions").insert({
      id: sha256(value),
      user_id: userId,
      expires_at: trx.raw(`now() + make_interval(secs => ?)`, [ABSOLUTE_LIFETIME_SECONDS]),
      user_agent: (request.headers.get("user-agent") ?? "").slice(0, 300) || null,
    });
  });
  return cookieHeader(request, value, ABSOLUTE_LIFETIME_SECONDS);
}

export interface SessionUser {
  id: string;
  email: string;
  name: string;
  role: Role;
  organisationId: string;
  /** Metric, US customary, or null to follow each roof's rule set (app/lib/units.ts). */
  units?: UnitsPreference;
}

export interface LiveSession {
  sessionId: string;
  user: SessionUser;
}

/** The live session the request carries: unexpired, not idle, user active. Ends a stale one it finds. */
export async function findLiveSession(request: Request): Promise<LiveSession | null> {
  const id = sessionIdFrom(request);
  if (!id) return null;
  const k = db();
  const row = await k("sessions as s")
    .join("users as u", "u.id", "s.user_id")
    .where("s.id", id)
    .first<
      | {
          id: string;
          email: string;
          name: string;
          role: Role;
          organisation_id: string;
          units: UnitsPreference;
          active: boolean;
          expired: boolean;
          idle: boolean;
          stale: boolean;
        }
      | undefined
    >(
      "u.id",
      "u.email",
      "u.name",
      "u.role",
      "u.organisation_id",
      "u.units",
      "u.active",
      k.raw("s.expires_at <= now() as expired"),
      k.raw("s.last_seen_at <= now() - make_interval(secs => ?) as idle", [IDLE_TIMEOUT_SECONDS]),
      k.raw("s.last_seen_at <= now() - make_interval(secs => ?) as stale", [TOUCH_AFTER_SECONDS]),
    );
  if (!row) return null;
  if (row.expired || row.idle || !row.active) {
    await k("sessions").where({ id }).delete();
    return null;
  }
  if (row.stale) await k("sessions").where({ id }).update({ last_seen_at: k.fn.now() });
  return {
    sessionId: id,
    user: {
      id: row.id,
      email: row.email,
      name: row.name,
      role: row.role,
      organisationId: row.organisation_id,
      units: row.units ?? null,
    },
  };
}

export async function destroySession(sessionId: string): Promise<void> {
  await db()("sessions").where({ id: sessionId }).delete();
}

/** Ends every session of a user (sign out everywhere, password change or reset, deactivation). */
export async function destroyAllSessions(userId: string, trx = db()): Promise<number> {
  return trx("sessions").where({ user_id: userId }).delete();
}

export async function listSessions(userId: string): Promise<SessionRow[]> {
  return db()("sessions")
    .where({ user_id: userId })
    .andWhere("expires_at", ">", db().fn.now())
    .andWhere("last_seen_at", ">", db().raw(`now() - make_interval(secs => ?)`, [IDLE_TIMEOUT_SECONDS]))
    .orderBy("last_seen_at", "desc")
    .select("id", "user_id", "created_at", "last_seen_at", "expires_at", "user_agent");
}
