import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createDatabaseFromTemplate, dropDatabase } from "../support/db";
import { startServer, type RunningServer } from "../support/server";

// Several app processes on one PostgreSQL (docs/quality.md, Reliability → Several processes; README "behind a load balancer"):
// sessions, rate limits and classroom mode live in the database, not in a process.
let a: RunningServer;
let b: RunningServer;
let dbUrl: string;

beforeAll(async () => {
  dbUrl = await createDatabaseFromTemplate();
  [a, b] = await Promise.all([startServer(dbUrl), startServer(dbUrl)]);
}, 120_000);
afterAll(async () => {
  await Promise.all([a?.stop(), b?.stop()]);
  if (dbUrl) await dropDatabase(dbUrl);
});

function login(server: RunningServer, email: string, password: string) {
  return fetch(`${server.url}/login`, {
    method: "POST",
    redirect: "manual",
    headers: { "Content-Type": "application/x-www-form-urlencoded", Origin: server.url },
    body: new URLSearchParams({ email, password }),
  });
}

describe("two app processes on one database", () => {
  it("a session made on one is honoured and ended on the other", async () => {
    const res = await login(a, "designer@tidemark.example", "fallwright-demo");
    expect(res.status).toBe(302);
    const cookie = res.headers
      .getSetCookie()
      .map((c) => c.split(";")[0])
      .join("; ");
    const onB = await fetch(`${b.url}/roofs`, { headers: { cookie }, redirect: "manual" });
    expect(onB.status).toBe(200);
    const out = await fetch(`${b.url}/logout`, {
      method: "POST",
      headers: { cookie, Origin: b.url },
      redirect: "manual",
    });
    expect(out.status).toBe(302);
    const onA = await fetch(`${a.url}/roofs`, { headers: { cookie }, redirect: "manual" });
    expect(onA.status).toBe(302); // back to sign-in: the row is gone for both
  });

  it("lets a class sign in together from one address: good sign-ins are never counted (before the failures below fill its count)", async () => {
    const emails = ["trainee@tidemark.example", "trainee3@tidemark.example", "trainee4@tidemark.example"];
    const results = await Promise.all(
      Array.from({ length: 15 }, (_, i) => login(i % 2 ? a : b, emails[i % emails.length], "fallwright-demo")),
    );
    expect(results.map((r) => r.status)).toEqual(Array(15).fill(302));
  });

  it("counts failed sign-ins across both processes", async () => {
    const statuses: number[] = [];
    for (let i = 0; i < 11; i++) {
      const server = i % 2 === 0 ? a : b;
      statuses.push((await login(server, "trainer2@tidemark.example", `wrong-password-${i}`)).status);
    }
    expect(statuses.slice(0, 10).every((s) => s !== 429)).toBe(true);
    expect(statuses[10]).toBe(429);
  });
});
