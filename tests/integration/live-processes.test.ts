import { afterAll, beforeAll, describe, expect, it } from "vitest";
import pg from "pg";
import { createDatabaseFromTemplate, dropDatabase } from "../support/db";
import { startServer, type RunningServer } from "../support/server";
import { DEMO_CLASS, SPEC, sseReader } from "../support/classes";

// Classroom mode across app processes (docs/product.md capability 6): the trainer's change goes to
// process A, a follower streams from process B; PostgreSQL NOTIFY carries it between them.
let a: RunningServer;
let b: RunningServer;
let dbUrl: string;
let classId: string;

beforeAll(async () => {
  dbUrl = await createDatabaseFromTemplate();
  const client = new pg.Client({ connectionString: dbUrl });
  await client.connect();
  classId = (await client.query("select id from classes where name = $1", [DEMO_CLASS])).rows[0].id;
  await client.end();
  [a, b] = await Promise.all([startServer(dbUrl), startServer(dbUrl)]);
}, 120_000);
afterAll(async () => {
  await Promise.all([a?.stop(), b?.stop()]);
  if (dbUrl) await dropDatabase(dbUrl);
});

async function cookieFor(server: RunningServer, email: string) {
  const res = await fetch(`${server.url}/login`, {
    method: "POST",
    redirect: "manual",
    headers: { "Content-Type": "application/x-www-form-urlencoded", Origin: server.url },
    body: new URLSearchParams({ email, password: "fallwright-demo" }),
  });
  expect(res.status).toBe(302);
  return res.headers
    .getSetCookie()
    .map((c) => c.split(";")[0])
    .join("; ");
}

describe("classroom mode on two app processes", () => {
  it("a change posted to one process reaches a follower streaming from the other", async () => {
    const trainer = await cookieFor(a, "trainer@tidemark.example");
    const trainee = await cookieFor(b, "trainee@tidemark.example");
    const ctrl = new AbortController();
    const stream = await fetch(`${b.url}/classes/${classId}/live`, {
      headers: { cookie: trainee, Accept: "text/event-stream" },
      signal: ctrl.signal,
    });
    expect(stream.status).toBe(200);
    expect(stream.headers.get("content-type")).toMatch(/^text\/event-stream/);
    expect(stream.headers.get("content-encoding")).toBeNull();
    const events = sseReader(stream.body!);
    const first = JSON.parse((await events.next(3000)).data);

    // Delivery time is the bench's to measure; the ceilings here only stop a hung test.
    for (const x of [2, 9]) {
      const posted = await fetch(`${a.url}/classes/${classId}/live`, {
        method: "POST",
        headers: { cookie: trainer, "Content-Type": "application/json", Origin: a.url },
        body: JSON.stringify({
          spec: { ...SPEC, outlets: [{ at: [x, 0] }] },
          title: `outlet at ${x}`,
          source: "Two processes",
          deck: "test",
          step: null,
        }),
      });
      expect(posted.status).toBe(200);
      const { seq } = await posted.json();
      const got = await events.next(10_000);
      expect(Number(got.id)).toBe(seq);
      expect(seq).toBeGreaterThan(first.seq);
      expect(JSON.parse(got.data).state).toMatchObject({
        title: `outlet at ${x}`,
        spec: { outlets: [{ at: [x, 0] }] },
      });
    }
    ctrl.abort();
    await events.cancel();
  });

  it("a server shutting down ends its open streams instead of waiting on them", async () => {
    const trainee = await cookieFor(b, "trainee@tidemark.example");
    const ctrl = new AbortController();
    const stream = await fetch(`${b.url}/classes/${classId}/live`, {
      headers: { cookie: trainee },
      signal: ctrl.signal,
    });
    const events = sseReader(stream.body!);
    await events.next(3000);
    // Generous ceiling: a server that waited on the open stream would never stop.
    const t0 = Date.now();
    await b.stop();
    expect(Date.now() - t0).toBeLessThan(30_000);
    ctrl.abort();
    await events.cancel();
  });
});
