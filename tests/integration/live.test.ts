import fc from "fast-check";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { useTestDatabase } from "../support/db";
import { callRoute, ORIGIN, sessionCookie } from "../support/accounts";
import { demoClassId, SPEC, sseReader } from "../support/classes";
import * as live from "~/routes/classes.$id.live";
import {
  closeListeners,
  LiveHub,
  liveHub,
  publishLiveState,
  readLiveState,
  type LiveContent,
  type LiveSnapshot,
} from "~/lib/live.server";

// Classroom mode (docs/product.md capability 6): LISTEN/NOTIFY through PostgreSQL reaches every app process.
const database = useTestDatabase();
let classId: string;
let trainer: string;
let trainee: string;
const hubs: LiveHub[] = [];

beforeAll(async () => {
  classId = await demoClassId();
  trainer = await sessionCookie("trainer@tidemark.example");
  trainee = await sessionCookie("trainee@tidemark.example");
});
afterAll(async () => {
  for (const h of hubs) await h.close();
  await closeListeners();
});

const content = (title: string, x = 6): LiveContent => ({
  spec: { ...SPEC, outlets: [{ at: [x, 0] }] },
  title,
  source: "Test deck",
  deck: "test",
  step: { index: 0, count: 1 },
  presenter: "Tomas Verrall",
  at: new Date().toISOString(),
});

/** A hub as a second app process would have: its own listening connection. */
function newHub() {
  const hub = new LiveHub({ connectionString: () => database.url(), read: readLiveState, probeMs: 500 });
  hubs.push(hub);
  return hub;
}

function collector(hub: LiveHub, id: string) {
  const got: LiveSnapshot[] = [];
  const sub = hub.subscribe(id, (s) => got.push(s));
  return {
    got,
    ready: sub.ready,
    async waitFor(pred: (s: LiveSnapshot) => boolean, ms = 10_000) {
      const end = Date.now() + ms;
      while (Date.now() < end) {
        const hit = got.find(pred);
        if (hit) return hit;
        await new Promise((r) => setTimeout(r, 10));
      }
      throw new Error(`not delivered within ${ms} ms; got ${JSON.stringify(got.map((g) => g.seq))}`);
    },
  };
}

async function listenerPids(): Promise<number[]> {
  const { rows } = await database
    .db()
    .raw(
      `select pid from pg_stat_activity where datname = current_database() and pid <> pg_backend_pid() and (query ilike 'listen class_live%' or query = 'select 1')`,
    );
  return rows.map((r: { pid: number }) => r.pid);
}

describe("LISTEN/NOTIFY", () => {
  // Delivery time is the bench's to measure; the ceilings here only stop a hung test.
  it("a change published once reaches two separate listening connections", async () => {
    const a = collector(newHub(), classId);
    const b = collector(newHub(), classId);
    await Promise.all([a.ready, b.ready]);
    const seq = await publishLiveState(classId, content("two listeners"));
    expect(seq).toBeGreaterThan(0);
    const [ga, gb] = await Promise.all([a.waitFor((s) => s.seq === seq), b.waitFor((s) => s.seq === seq)]);
    expect(ga.state?.title).toBe("two listeners");
    expect(gb.state?.spec).toEqual({ ...SPEC, outlets: [{ at: [6, 0] }] });
    const row = await database.db()("classes").where({ id: classId }).first("live_seq", "live_state");
    expect(row!.live_seq).toBe(seq);
    expect((row!.live_state as { title: string }).title).toBe("two listeners");
  });

  it("this process's own followers get its change as it is committed, before the notification comes back", async () => {
    const c = collector(liveHub(), classId);
    await c.ready;
    const seq = await publishLiveState(classId, content("at once", 4));
    // No waiting here: the notification and the read it sets off have not come back yet.
    expect(c.got.map((s) => s.seq)).toEqual([seq]);
    expect(c.got[0].state).toMatchObject({ title: "at once", spec: { outlets: [{ at: [4, 0] }] } });
  });

  it("other classes' subscribers hear nothing", async () => {
    const hub = newHub();
    const other = collector(hub, "00000000-0000-4000-8000-000000000001");
    // A follower of the changed class on the same hub and connection: once the change reaches
    // it, anything the change could have set off for the other class would be here too.
    const followed = collector(hub, classId);
    await Promise.all([other.ready, followed.ready]);
    const seq = await publishLiveState(classId, content("not for you"));
    await followed.waitFor((s) => s.seq === seq);
    expect(other.got).toEqual([]);
  });

  it("a listener whose connection is killed reconnects and catches up on what it missed", async () => {
    const hub = newHub();
    const c = collector(hub, classId);
    await c.ready;
    const first = hub.connections;
    const before = await listenerPids();
    expect(before.length).toBeGreaterThan(0);
    await database.db().raw(`select pg_terminate_backend(pid) from pg_stat_activity where pid = any(?)`, [before]);
    // Published while the listener is down: no notification reaches it.
    const seq = await publishLiveState(classId, content("while you were away", 3));
    const got = await c.waitFor((s) => s.seq === seq, 5000);
    expect(got.state?.title).toBe("while you were away");
    expect(hub.connections).toBeGreaterThan(first);
  });
});

describe("GET /classes/:id/live (server-sent events)", () => {
  function open(cookie: string, lastEventId?: string) {
    const ctrl = new AbortController();
    const headers: Record<string, string> = { cookie };
    if (lastEventId !== undefined) headers["Last-Event-ID"] = lastEventId;
    const request = new Request(`${ORIGIN}/classes/${classId}/live`, { headers, signal: ctrl.signal });
    return {
      ctrl,
      response: live.loader({ request, params: { id: classId }, context: {} } as never) as Promise<Response>,
    };
  }

  it("sends the current state at once with its seq as the event id, then every change", async () => {
    const now = (await publishLiveState(classId, content("current")))!;
    const { ctrl, response } = open(trainee);
    const res = await response;
    expect(res.headers.get("content-type")).toBe("text/event-stream; charset=utf-8");
    expect(res.headers.get("cache-control")).toMatch(/no-cache/);
    const events = sseReader(res.body!);
    const first = await events.next();
    expect(first.id).toBe(String(now));
    expect(JSON.parse(first.data)).toMatchObject({ seq: now, state: { title: "current" } });

    const post = new Request(`${ORIGIN}/classes/${classId}/live`, {
      method: "POST",
      headers: { cookie: trainer, "Content-Type": "application/json" },
      body: JSON.stringify({
        spec: { ...SPEC, outlets: [{ at: [2, 0] }] },
        title: "moved",
        source: "Test deck",
        deck: "test",
        step: { index: 0, count: 1 },
      }),
    });
    const posted = await callRoute(live.action, post, { params: { id: classId } });
    expect(posted.status).toBe(200);
    const next = await events.next(10_000);
    expect(next.id).toBe(String(now + 1));
    expect(JSON.parse(next.data).state).toMatchObject({
      title: "moved",
      presenter: "Tomas Verrall",
      spec: { outlets: [{ at: [2, 0] }] },
    });
    ctrl.abort();
    await events.cancel();
  });

  it("on reconnect, Last-Event-ID decides: behind → the current state; up to date → nothing until the next change", async () => {
    const now = (await publishLiveState(classId, content("catch-up")))!;
    const behind = open(trainee, String(now - 1));
    const eventsBehind = sseReader((await behind.response).body!);
    expect((await eventsBehind.next()).id).toBe(String(now));
    behind.ctrl.abort();

    const current = open(trainee, String(now));
    const eventsCurrent = sseReader((await current.response).body!);
    // The server says it has decided to send nothing; the next state event is the next change.
    await eventsCurrent.comment("up to date", 10_000);
    const later = await publishLiveState(classId, content("after reconnect"));
    expect((await eventsCurrent.next(10_000)).id).toBe(String(later));
    expect(eventsCurrent.waiting.filter((e) => e.event === "state")).toEqual([]);
    current.ctrl.abort();
    await eventsCurrent.cancel();
  });

  it("the presenter's update is checked: JSON only, a roof the engine accepts", async () => {
    const send = (body: string, type = "application/json") =>
      callRoute(
        live.action,
        new Request(`${ORIGIN}/classes/${classId}/live`, {
          method: "POST",
          headers: { cookie: trainer, "Content-Type": type },
          body,
        }),
        { params: { id: classId } },
      );
    const seq = (await readLiveState(classId))!.seq;
    expect((await send("spec=1", "application/x-www-form-urlencoded")).status).toBe(415);
    expect((await send("{not json")).status).toBe(400);
    expect((await send(JSON.stringify({ spec: { outline: "square" } }))).status).toBe(400);
    const crossing = await send(
      JSON.stringify({
        spec: {
          ...SPEC,
          outline: [
            [0, 0],
            [10, 10],
            [10, 0],
            [0, 10],
          ],
        },
      }),
    );
    expect([400, 422]).toContain(crossing.status);
    expect((await send(JSON.stringify({ spec: SPEC, title: "x".repeat(500) }))).status).toBe(400);
    expect((await readLiveState(classId))!.seq).toBe(seq);
    const get = await callRoute(
      live.action,
      new Request(`${ORIGIN}/classes/${classId}/live`, { method: "PUT", headers: { cookie: trainer } }),
      { params: { id: classId } },
    );
    expect(get.status).toBe(405);
  });

  it("never answers 500 to random or hostile bodies (docs/quality.md, Reliability → Bad input)", async () => {
    const num = fc.oneof(
      fc.constantFrom(0, -0, 1e308, -1e308, 5e-324, -1),
      fc.double({ noNaN: true, noDefaultInfinity: true }),
    );
    const specLike = fc.record(
      {
        outline: fc.oneof(fc.array(fc.tuple(num, num), { maxLength: 8 }), fc.anything()),
        outlets: fc.anything(),
        baseFall: fc.oneof(fc.string(), num),
        joists: fc.anything(),
      },
      { requiredKeys: [] },
    );
    const body = fc.oneof(
      fc.anything().map((v) => JSON.stringify(v) ?? "null"),
      fc
        .record(
          { spec: specLike, title: fc.anything(), source: fc.anything(), deck: fc.anything(), step: fc.anything() },
          { requiredKeys: [] },
        )
        .map((v) => JSON.stringify(v)),
      fc.string(),
    );
    const allowed = new Set([200, 400, 413, 415, 422]);
    await fc.assert(
      fc.asyncProperty(body, async (payload) => {
        const request = new Request(`${ORIGIN}/classes/${classId}/live`, {
          method: "POST",
          headers: { cookie: trainer, "Content-Type": "application/json" },
          body: payload,
        });
        const res = await callRoute(live.action, request, { params: { id: classId } });
        expect(allowed.has(res.status), `${res.status} for ${payload.slice(0, 200)}`).toBe(true);
      }),
      { numRuns: 150 },
    );
  });
});
