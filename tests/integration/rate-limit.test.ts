import { describe, expect, it } from "vitest";
import { useTestDatabase } from "../support/db";
import { chargeInMemory, clearHits, hit, hitInMemory, limitApiRequest, undoHit } from "~/lib/rate-limit.server";

// Counters live in PostgreSQL so that several app processes share them (docs/security.md, Sign-in and brute force).
const database = useTestDatabase();

describe("hit()", () => {
  it("allows `limit` attempts in a window, then refuses with a Retry-After within the window's reach", async () => {
    const key = `test:${Math.random()}`;
    const limit = { limit: 3, windowSeconds: 60 };
    const results = [];
    for (let i = 0; i < 4; i++) results.push(await hit(key, limit));
    expect(results.map((r) => r.ok)).toEqual([true, true, true, false]);
    expect(results[3].retryAfter).toBeGreaterThan(0);
    expect(results[3].retryAfter).toBeLessThanOrEqual(120);
    // A refused attempt is not counted: the stored count stays at the limit.
    const [{ sum }] = await database.db()("rate_limits").where({ key }).sum<{ sum: string }[]>({ sum: "count" });
    expect(Number(sum)).toBe(3);
  });

  it("is atomic: 25 simultaneous attempts against a limit of 10 let exactly 10 through", async () => {
    const key = `race:${Math.random()}`;
    const results = await Promise.all(Array.from({ length: 25 }, () => hit(key, { limit: 10, windowSeconds: 300 })));
    expect(results.filter((r) => r.ok)).toHaveLength(10);
  });

  it("counts the previous window, weighted, so a burst across a window boundary is still caught", async () => {
    const key = `slide:${Math.random()}`;
    const w = 600;
    // A flood in the window that just ended: it weighs (1 - elapsed/600) × 10000 now.
    await database.db().raw(
      `insert into rate_limits (key, window_start, count)
       values (?, to_timestamp(floor(extract(epoch from clock_timestamp()) / ?) * ? - ?), 10000)`,
      [key, w, w, w],
    );
    const r = await hit(key, { limit: 10, windowSeconds: w });
    // Refused unless this runs in the last half-second of the 10-minute window.
    expect(r.ok).toBe(false);
  });

  it("undoHit takes one back and clearHits forgets the key", async () => {
    const key = `undo:${Math.random()}`;
    const limit = { limit: 1, windowSeconds: 60 };
    expect((await hit(key, limit)).ok).toBe(true);
    expect((await hit(key, limit)).ok).toBe(false);
    await undoHit(key, limit);
    expect((await hit(key, limit)).ok).toBe(true);
    await clearHits(key);
    expect(await database.db()("rate_limits").where({ key }).first()).toBeUndefined();
  });

  it("limitApiRequest answers 429 JSON with Retry-After after 600 requests a minute from one address", async () => {
    const context = { clientIp: `198.18.0.${Math.floor(Math.random() * 250)}` };
    for (let i = 0; i < 600; i++) expect(await limitApiRequest(context)).toBeNull();
    const refused = await limitApiRequest(context);
    expect(refused?.status).toBe(429);
    expect(Number(refused?.headers.get("retry-after"))).toBeGreaterThan(0);
    expect((await refused!.json()).error.message).toMatch(/Too many requests/);
    expect(await limitApiRequest({ clientIp: "198.18.1.1" })).toBeNull();
  });

  it("the in-memory API budget refills steadily: one unit per limit/window", () => {
    // 3 a minute refills one unit every 20 s.
    const limit = { limit: 3, windowSeconds: 60 };
    const t0 = Date.UTC(2026, 11, 1, 12, 0, 10);
    for (let i = 0; i < 3; i++) expect(hitInMemory("k", limit, t0).ok).toBe(true);
    expect(hitInMemory("k", limit, t0)).toEqual({ ok: false, retryAfter: 20 });
    expect(hitInMemory("k", limit, t0 + 19_000).ok).toBe(false);
    expect(hitInMemory("k", limit, t0 + 20_000).ok).toBe(true);
    expect(hitInMemory("k", limit, t0 + 20_000).ok).toBe(false);
  });

  it("work charged just before the clock's minute turns still counts after it", () => {
    // A window aligned to whole minutes forgot this charge at 12:01:00 and let the next request in.
    const limit = { limit: 100, windowSeconds: 60 };
    const t0 = Date.UTC(2026, 11, 1, 12, 0, 59, 500);
    expect(hitInMemory("w", limit, t0).ok).toBe(true);
    chargeInMemory("w", limit, 250, t0);
    const next = hitInMemory("w", limit, t0 + 1_000);
    expect(next.ok).toBe(false);
    // 151 units short at 100 a minute: about 91 s.
    expect(next.retryAfter).toBeGreaterThan(85);
  });
});
