/**
 * Brute-force limits kept in PostgreSQL (table `rate_limits`), so every app process shares them.
 * A sliding-window counter: the current fixed window's count plus the previous window's count
 * weighted by how much of it still overlaps the last `windowSeconds`. That keeps a burst split
 * across a window boundary from doubling the allowance.
 */
import type { AppLoadContext } from "react-router";
import { db } from "~/lib/db.server";

export interface Limit {
  limit: number;
  windowSeconds: number;
}

export interface HitResult {
  ok: boolean;
  /** Whole seconds until one more attempt would be allowed (0 when ok). */
  retryAfter: number;
}

/** The figures docs/security.md holds us to, plus the API's request budget. */
export const LIMITS = {
  // Guessing at one account: 10 failed sign-ins to it in 15 minutes, from anywhere.
  signInAccount: { limit: 10, windowSeconds: 15 * 60 },
  // Spraying from one address: 30 failures in 15 minutes that were not followed by the same
  // account's good sign-in from there (a typo put right is taken back), see auth.server signIn.
  signInIp: { limit: 30, windowSeconds: 15 * 60 },
  resetAccount: { limit: 10, windowSeconds: 15 * 60 },
  resetIp: { limit: 10, windowSeconds: 60 },
  tokenUse: { limit: 10, windowSeconds: 15 * 60 },
  tokenIp: { limit: 10, windowSeconds: 60 },
  signUpIp: { limit: 10, windowSeconds: 15 * 60 },
  // A load test from one address can raise it (API_RATE_LIMIT_PER_MINUTE); 600 otherwise.
  api: { limit: Number(process.env.API_RATE_LIMIT_PER_MINUTE) || 600, windowSeconds: 60 },
} as const satisfies Record<string, Limit>;

/** Counts one attempt against `key`; a refused attempt is not counted, so waiting always helps. */
export async function hit(key: string, { limit, windowSeconds }: Limit): Promise<HitResult> {
  const { rows } = await db().raw<{ rows: { count: number; prev: number; elapsed: number }[] }>(
    `with cur as (
       insert into rate_limits (key, window_start, count)
       values (?, to_timestamp(floor(extract(epoch from clock_timestamp()) / ?) * ?), 1)
       on conflict (key, window_start) do update set count = rate_limits.count + 1
       returning count, window_start
     )
     select cur.count,
            coalesce((select p.count from rate_limits p
                      where p.key = ? and p.window_start = cur.window_start - make_interval(secs => ?)), 0) as prev,
            extract(epoch from clock_timestamp() - cur.window_start)::float8 as elapsed
       from cur`,
    [key, windowSeconds, windowSeconds, key, windowSeconds],
  );
  const { count, prev, elapsed } = rows[0];
  if (Math.random() < 0.01) void sweep();
  const weight = Math.max(0, 1 - elapsed / windowSeconds);
  if (prev * weight + count <= limit) return { ok: true, retryAfter: 0 };
  await undoHit(key, { windowSeconds });
  return { ok: false, retryAfter: retryAfterSeconds(count - 1, prev, elapsed, limit, windowSeconds) };
}

/**
 * Whether one more attempt against `key` would be within its limit, without counting it. Sign-in
 * asks this first and counts only failures, so a class signing in together from one address is
 * not refused for the moments its good attempts are in flight.
 */
export async function peek(key: string, { limit, windowSeconds }: Limit): Promise<HitResult> {
  const { rows } = await db().raw<{ rows: { count: number; prev: number; elapsed: number }[] }>(
    `with w as (select to_timestamp(floor(extract(epoch from clock_timestamp()) / ?) * ?) as start)
     select coalesce((select r.count from rate_limits r, w where r.key = ? and r.window_start = w.start), 0) as count,
            coalesce((select r.count from rate_limits r, w where r.key = ? and r.window_start = w.start - make_interval(secs => ?)), 0) as prev,
            extract(epoch from clock_timestamp() - (select start from w))::float8 as elapsed`,
    [windowSeconds, windowSeconds, key, key, windowSeconds],
  );
  const { count, prev, elapsed } = rows[0];
  const weight = Math.max(0, 1 - elapsed / windowSeconds);
  if (prev * weight + count + 1 <= limit) return { ok: true, retryAfter: 0 };
  return { ok: false, retryAfter: retryAfterSeconds(count, prev, elapsed, limit, windowSeconds) };
}

/** peek() for several keys: refused when any is full, with the longest wait. */
export async function peekAll(keys: (Limit & { key: string })[]): Promise<HitResult> {
  let worst: HitResult = { ok: true, retryAfter: 0 };
  for (const k of keys) {
    const r = await peek(k.key, k);
    if (!r.ok && (worst.ok || r.retryAfter > worst.retryAfter)) worst = r;
  }
  return worst;
}

/** Seconds until the weighted count leaves room for one more attempt. */
function retryAfterSeconds(count: number, prev: number, elapsed: number, limit: number, w: number): number {
  const room = limit - 1;
  let wait: number;
  if (count <= room && prev > 0) {
    // Still in this window: wait for the previous window's weight to fall far enough.
    wait = w * (1 - (room - count) / prev) - elapsed;
  } else {
    // Only the next window helps: this window becomes the weighted "previous" one.
    wait = w - elapsed + (count > 0 ? Math.max(0, w * (1 - room / count)) : 0);
  }
  return Math.max(1, Math.ceil(wait));
}

/** Takes back one counted attempt (a refused one, or a sign-in that succeeded). */
export async function undoHit(key: string, { windowSeconds }: Pick<Limit, "windowSeconds">): Promise<void> {
  await db().raw(
    `update rate_limits set count = greatest(count - 1, 0)
      where key = ? and window_start = to_timestamp(floor(extract(epoch from clock_timestamp()) / ?) * ?)`,
    [key, windowSeconds, windowSeconds],
  );
}

/**
 * Takes back from `from` every attempt counted against `part` in the same windows, then forgets
 * `part`: an account's failures from one address leave that address's count when the account
 * signs in there successfully. Both keys must use the same window length.
 */
export async function takeBackHits(from: string, part: string): Promise<void> {
  await db().transaction(async (trx) => {
    await trx.raw(
      `update rate_limits f set count = greatest(f.count - p.count, 0)
         from rate_limits p
        where p.key = ? and f.key = ? and f.window_start = p.window_start`,
      [part, from],
    );
    await trx("rate_limits").where({ key: part }).delete();
  });
}

/** Forgets every attempt counted against `key` (an account that just signed in successfully). */
export async function clearHits(key: string): Promise<void> {
  await db()("rate_limits").where({ key }).delete();
}

/**
 * Counts one attempt against each key; when any is over its limit nothing is counted and the
 * longest wait is returned.
 */
export async function hitAll(hits: (Limit & { key: string })[]): Promise<HitResult> {
  const done: (Limit & { key: string })[] = [];
  for (const h of hits) {
    const r = await hit(h.key, h);
    if (!r.ok) {
      for (const d of done) await undoHit(d.key, d);
      return r;
    }
    done.push(h);
  }
  return { ok: true, retryAfter: 0 };
}

async function sweep() {
  try {
    await db()("rate_limits").where("window_start", "<", db().raw("now() - interval '1 day'")).delete();
  } catch {
    // Housekeeping only: the next sweep will try again.
  }
}

/** The client address the Express host put in the load context ("unknown" outside it). */
export function clientIp(context: AppLoadContext | undefined | null): string {
  return context?.clientIp || "unknown";
}

/** The Retry-After header for a refused attempt, or nothing. */
export function retryAfterHeaders(seconds: number | undefined | null): Record<string, string> | undefined {
  return seconds ? { "Retry-After": String(seconds) } : undefined;
}

/** "2 minutes" / "40 seconds" for a Retry-After in a sentence. */
export function waitPhrase(seconds: number): string {
  if (seconds < 60) return `${seconds} second${seconds === 1 ? "" : "s"}`;
  const minutes = Math.ceil(seconds / 60);
  return `${minutes} minute${minutes === 1 ? "" : "s"}`;
}

/**
 * Per-IP budget for the open analysis API, charged by work done: a request costs one unit up
 * front and one more per 10 ms its analysis took in the worker (ANALYSIS_MS_PER_UNIT), from a
 * bucket of 600 units that refills at 600 a minute (API_RATE_LIMIT_PER_MINUTE). Six hundred small
 * roofs a minute fit, as a class behind one address needs; a two-second analysis costs 200 units,
 * so three in a row empty the bucket and the next request waits until it has refilled. Unlike sign-in, this budget is kept in each process's memory: it guards
 * against a runaway script, and a database round trip per analysis would halve the API's
 * throughput. With several processes behind a load balancer the budget applies per process.
 * Returns a 429 JSON response with Retry-After, or null when the request may go ahead.
 */
export async function limitApiRequest(context: AppLoadContext | undefined | null): Promise<Response | null> {
  const r = hitInMemory(apiKey(context), LIMITS.api);
  if (r.ok) return null;
  return Response.json(
    {
      error: {
        message: `Too many requests from this address. Wait ${waitPhrase(r.retryAfter)} and try again.`,
        issues: [],
      },
    },
    { status: 429, headers: { "Retry-After": String(r.retryAfter), "Cache-Control": "no-store" } },
  );
}

/** Milliseconds of worker time that cost one unit of the API budget. */
export const ANALYSIS_MS_PER_UNIT = 10;

/** Charges the work an analysis took, after the fact (the unit paid up front is not counted again). */
export function chargeApiWork(context: AppLoadContext | undefined | null, workMs: number): number {
  const units = Math.floor(Math.max(0, workMs) / ANALYSIS_MS_PER_UNIT);
  if (units > 0) chargeInMemory(apiKey(context), LIMITS.api, units);
  return units;
}

function apiKey(context: AppLoadContext | undefined | null) {
  return `api:${clientIp(context)}`;
}

/**
 * In-memory budgets are token buckets: each key holds up to `limit` units and refills
 * continuously at `limit` per `windowSeconds`. Unlike a window aligned to the clock's minutes,
 * a charge made just before a minute turns still counts just after it.
 */
const buckets = new Map<string, { tokens: number; at: number }>();

function bucketFor(key: string, { limit, windowSeconds }: Limit, now: number) {
  const rate = limit / (windowSeconds * 1000);
  let b = buckets.get(key);
  if (!b) {
    if (buckets.size > 50_000) {
      for (const [k, v] of buckets) if (v.tokens + (now - v.at) * rate >= limit) buckets.delete(k);
    }
    b = { tokens: limit, at: now };
    buckets.set(key, b);
  } else {
    b.tokens = Math.min(limit, b.tokens + Math.max(0, now - b.at) * rate);
    b.at = now;
  }
  return { b, rate };
}

/** Takes one unit from the key's bucket when it has one; a refused request takes nothing. */
export function hitInMemory(key: string, limit: Limit, now = Date.now()): HitResult {
  const { b, rate } = bucketFor(key, limit, now);
  if (b.tokens < 1) return { ok: false, retryAfter: Math.max(1, Math.ceil((1 - b.tokens) / rate / 1000)) };
  b.tokens -= 1;
  return { ok: true, retryAfter: 0 };
}

/** Takes `units` from the key's bucket; it may go below zero (the next requests wait longer). */
export function chargeInMemory(key: string, limit: Limit, units: number, now = Date.now()): void {
  bucketFor(key, limit, now).b.tokens -= units;
}
