import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { useTestDatabase } from "../support/db";
import { callRoute, ORIGIN, sessionCookie } from "../support/accounts";
import { demoClassId, SPEC, sseReader } from "../support/classes";
import * as handUps from "~/routes/classes.$id.hand-ups";
import * as live from "~/routes/classes.$id.live";
import { closeListeners, LiveHub, publishLiveState, readLiveState } from "~/lib/live.server";
import { closePools, runInPool } from "~/lib/pool.server";

// Issue 16 item 7: trainees hand up a roof during a live session; only the class's trainer sees
// the wall; the wall's changes travel over the live feed's LISTEN/NOTIFY channel to every process.
const database = useTestDatabase();
let classId: string;
const cookies: Record<string, string> = {};
const hubs: LiveHub[] = [];

beforeAll(async () => {
  classId = await demoClassId();
  for (const who of ["trainer", "trainee", "trainee2", "trainee4", "designer", "admin"])
    cookies[who] = await sessionCookie(`${who}@tidemark.example`);
  // Start the engine's worker before the tests: its first start on a busy machine is slow.
  await runInPool("engine", { kind: "shape", spec: SPEC, mesh: false }, 55_000);
});
afterAll(async () => {
  for (const h of hubs) await h.close();
  await closeListeners();
  await closePools();
});

const roof = (x: number) => ({ ...SPEC, outlets: [{ at: [x, 0] }] });

function post(cookie: string | null, body: unknown, path = "hand-ups") {
  const headers: Record<string, string> = { "Content-Type": "application/json" };
  if (cookie) headers.cookie = cookie;
  const request = new Request(`${ORIGIN}/classes/${classId}/${path}`, {
    method: "POST",
    headers,
    body: typeof body === "string" ? body : JSON.stringify(body),
  });
  return callRoute(path === "live" ? live.action : handUps.action, request, { params: { id: classId } });
}

async function wallJson(cookie: string) {
  const res = (await handUps.loader({
    request: new Request(`${ORIGIN}/classes/${classId}/hand-ups`, { headers: { cookie, Accept: "application/json" } }),
    params: { id: classId },
    context: {},
  } as never)) as Response;
  return { status: res.status, body: (await res.json()) as { wallSeq: number; handUps: Record<string, unknown>[] } };
}

async function present() {
  await publishLiveState(classId, {
    spec: SPEC,
    title: "Start",
    source: "Test deck",
    deck: "test",
    step: null,
    presenter: "Tomas Verrall",
    at: new Date().toISOString(),
  });
}

describe("hands up", () => {
  it("are refused while nothing is presented, and after the trainer stops presenting", async () => {
    const before = await post(cookies.trainee, { spec: roof(3) });
    expect(before.status).toBe(409);
    await present();
    expect((await post(cookies.trainee, { spec: roof(3) })).status).toBe(201);
    const ended = await post(cookies.trainer, { phase: "ended" }, "live");
    expect(ended.status).toBe(200);
    expect((await readLiveState(classId))!.phase).toBe("ended");
    // Ending the session clears its wall.
    expect((await wallJson(cookies.trainer)).body.handUps).toEqual([]);
    expect((await post(cookies.trainee, { spec: roof(3) })).status).toBe(409);
  });

  it("a trainee of the class hands up; the trainer's wall shows the roof, its owner and its key figures", async () => {
    await present();
    const res = await post(cookies.trainee, { spec: roof(2), title: "Outlet near the corner" });
    expect(res.status).toBe(201);
    const { status, body } = await wallJson(cookies.trainer);
    expect(status).toBe(200);
    expect(body.handUps).toHaveLength(1);
    const h = body.handUps[0] as { name: string; title: string; spec: typeof SPEC; figures: Record<string, number> };
    expect(h.name).toBe("Tess Quinlan");
    expect(h.title).toBe("Outlet near the corner");
    expect(h.spec.outlets).toEqual([{ at: [2, 0] }]);
    // The figures are the engine's for this roof. By hand (docs/roof-method.md §3): H = span through
    // the outlet / N_base; the joists run the short way, so the span is the 8 m depth: 8 / 60 m.
    expect(h.figures.highLevel).toBeCloseTo(8 / 60, 6);
    expect(h.figures.minFallRatio).toBeGreaterThan(0);
    await post(cookies.trainee2, { spec: { ...roof(6), baseFall: "1:40" } });
    const both = (await wallJson(cookies.trainer)).body.handUps as unknown as {
      name: string;
      figures: { highLevel: number };
    }[];
    expect(both.map((b) => b.name)).toEqual(["Tess Quinlan", "Marco Ellery"]);
    // Each tile has its own roof's figure: at 1:40 the same 8 m span needs 8 / 40 m.
    expect(both[1].figures.highLevel).toBeCloseTo(8 / 40, 6);

    // A second hand-up replaces the first: one tile per trainee.
    await post(cookies.trainee, { spec: roof(4), title: "Better" });
    const after = (await wallJson(cookies.trainer)).body;
    expect(after.handUps).toHaveLength(2);
    expect(after.handUps.find((x) => x.name === "Tess Quinlan")).toMatchObject({ title: "Better" });
    expect(after.wallSeq).toBeGreaterThan(body.wallSeq);
  });

  it("only trainees of the class hand up, and only its trainer (or an admin) sees the wall", async () => {
    await present();
    expect((await post(null, { spec: roof(3) })).status).toBe(401);
    expect((await post(cookies.trainer, { spec: roof(3) })).status).toBe(403);
    expect((await post(cookies.trainee4, { spec: roof(3) })).status).toBe(404);
    expect((await post(cookies.designer, { spec: roof(3) })).status).toBe(404);
    expect((await wallJson(cookies.trainee)).status).toBe(403);
    expect((await wallJson(cookies.designer)).status).toBe(404);
    expect((await wallJson(cookies.admin)).status).toBe(200);
    const other = await handUps.loader({
      request: new Request(`${ORIGIN}/classes/not-a-uuid/hand-ups`, { headers: { cookie: cookies.trainer } }),
      params: { id: "not-a-uuid" },
      context: {},
    } as never);
    expect((other as Response).status).toBe(404);
  });

  it("bad input gets a 4xx naming the field, and changes nothing", async () => {
    await present();
    const seq = (await wallJson(cookies.trainer)).body.wallSeq;
    const bad = [
      "{not json",
      { title: "no roof" },
      { spec: { outline: "square" } },
      { spec: roof(3), title: "x".repeat(500) },
      { spec: roof(3), title: 7 },
      [1, 2],
    ];
    for (const body of bad) {
      const res = await post(cookies.trainee, body);
      expect(res.status, JSON.stringify(body).slice(0, 60)).toBeGreaterThanOrEqual(400);
      expect(res.status).toBeLessThan(500);
    }
    const titled = await callRoute(
      handUps.action,
      new Request(`${ORIGIN}/classes/${classId}/hand-ups`, {
        method: "POST",
        headers: { cookie: cookies.trainee, "Content-Type": "application/json" },
        body: JSON.stringify({ spec: roof(3), title: "x".repeat(500) }),
      }),
      { params: { id: classId } },
    );
    expect(titled.status).toBe(400);
    expect((await wallJson(cookies.trainer)).body.wallSeq).toBe(seq);
    const put = await callRoute(
      handUps.action,
      new Request(`${ORIGIN}/classes/${classId}/hand-ups`, { method: "PUT", headers: { cookie: cookies.trainee } }),
      { params: { id: classId } },
    );
    expect(put.status).toBe(405);
    // Phase changes are checked too.
    expect((await post(cookies.trainer, { phase: "asleep" }, "live")).status).toBe(400);
    expect((await post(cookies.trainer, { phase: "paused", spec: SPEC }, "live")).status).toBe(400);
    expect((await post(cookies.trainee, { phase: "ended" }, "live")).status).toBe(404);
  });

  it("pause and end reach followers as the session's phase", async () => {
    await present();
    const ctrl = new AbortController();
    const res = (await live.loader({
      request: new Request(`${ORIGIN}/classes/${classId}/live`, {
        headers: { cookie: cookies.trainee },
        signal: ctrl.signal,
      }),
      params: { id: classId },
      context: {},
    } as never)) as Response;
    const events = sseReader(res.body!);
    expect(JSON.parse((await events.next(10_000)).data).phase).toBe("live");
    expect((await post(cookies.trainer, { phase: "paused" }, "live")).status).toBe(200);
    expect(JSON.parse((await events.next(10_000)).data)).toMatchObject({ phase: "paused", state: { title: "Start" } });
    expect((await post(cookies.trainer, { phase: "ended" }, "live")).status).toBe(200);
    expect(JSON.parse((await events.next(10_000)).data).phase).toBe("ended");
    // Nothing to pause once ended.
    expect((await post(cookies.trainer, { phase: "paused" }, "live")).status).toBe(409);
    ctrl.abort();
    await events.cancel();
  });

  it("the trainer's wall stream hears a hand-up made through another process's connection", async () => {
    await present();
    // A second app process: its own listening connection, told of the wall change only by NOTIFY.
    const other = new LiveHub({ connectionString: () => database.url(), read: readLiveState, probeMs: 500 });
    hubs.push(other);
    let told = 0;
    const sub = other.subscribeWall(classId, () => (told += 1));
    await sub.ready;

    const ctrl = new AbortController();
    const stream = (await handUps.loader({
      request: new Request(`${ORIGIN}/classes/${classId}/hand-ups`, {
        headers: { cookie: cookies.trainer, Accept: "text/event-stream" },
        signal: ctrl.signal,
      }),
      params: { id: classId },
      context: {},
    } as never)) as Response;
    expect(stream.headers.get("content-type")).toBe("text/event-stream; charset=utf-8");
    const events = sseReader(stream.body!);
    const first = JSON.parse((await events.next(10_000, "wall")).data) as { wallSeq: number };
    expect((await post(cookies.trainee2, { spec: roof(9), title: "From afar" })).status).toBe(201);
    const next = JSON.parse((await events.next(10_000, "wall")).data) as {
      wallSeq: number;
      handUps: { name: string; title: string }[];
    };
    expect(next.wallSeq).toBeGreaterThan(first.wallSeq);
    expect(next.handUps.find((h) => h.name === "Marco Ellery")?.title).toBe("From afar");
    const end = Date.now() + 10_000;
    while (told === 0 && Date.now() < end) await new Promise((r) => setTimeout(r, 20));
    expect(told).toBeGreaterThan(0);
    sub.unsubscribe();
    ctrl.abort();
    await events.cancel();
  });
});
