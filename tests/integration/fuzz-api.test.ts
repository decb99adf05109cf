import fc from "fast-check";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createDatabaseFromTemplate, dropDatabase } from "../support/db";
import { startServer, type RunningServer } from "../support/server";
import { allRoutePaths } from "../support/routes";
import { checkApiResponse } from "../support/openapi";

// docs/quality.md, Reliability → Bad input: every JSON route, random and hostile JSON, never 500.
const ALLOWED = new Set([200, 201, 204, 400, 401, 403, 404, 405, 409, 413, 415, 422, 429]);
const UUID = "00000000-0000-4000-8000-000000000000";

let server: RunningServer;
let dbUrl: string;
let cookie = "";

beforeAll(async () => {
  dbUrl = await createDatabaseFromTemplate();
  server = await startServer(dbUrl);
  const res = await fetch(`${server.url}/login`, {
    method: "POST",
    redirect: "manual",
    headers: { "Content-Type": "application/x-www-form-urlencoded", Origin: server.url },
    body: new URLSearchParams({ email: "trainer@tidemark.example", password: "fallwright-demo" }),
  });
  cookie = res.headers
    .getSetCookie()
    .map((c) => c.split(";")[0])
    .join("; ");
}, 120_000);
afterAll(async () => {
  await server?.stop();
  if (dbUrl) await dropDatabase(dbUrl);
});

const hostileNumber = fc.oneof(
  fc.constantFrom(0, -0, 1e308, -1e308, 5e-324, Number.MAX_SAFE_INTEGER, -1, 1e9),
  fc.double({ noNaN: true, noDefaultInfinity: true }),
);
const point = fc.tuple(hostileNumber, hostileNumber);
// Shaped like a roof spec, but with anything in any field: reaches deep validation paths.
const specLike = fc.record(
  {
    outline: fc.oneof(fc.array(point, { maxLength: 12 }), fc.anything()),
    edges: fc.oneof(fc.array(fc.constantFrom("parapet", "eaves", "gutter", 3)), fc.anything()),
    outlets: fc.oneof(
      fc.array(fc.record({ at: point, level: hostileNumber, size: hostileNumber }), { maxLength: 4 }),
      fc.anything(),
    ),
    baseFall: fc.oneof(
      fc.constantFrom("1:40", "2°", "0%", "1:0", "-3%", "1e999 mm/m", "∞"),
      fc.string(),
      hostileNumber,
    ),
    highLevel: hostileNumber,
    joists: fc.oneof(fc.record({ spacing: hostileNumber, direction: point, offset: hostileNumber }), fc.anything()),
    minFall: fc.oneof(fc.string(), hostileNumber),
    probes: fc.oneof(fc.array(point, { maxLength: 5 }), fc.anything()),
  },
  { requiredKeys: [] },
);
const body = fc.oneof(
  fc.anything().map((v) => JSON.stringify(v) ?? "null"),
  specLike.map((s) => JSON.stringify(s)),
  fc.record({ name: fc.string(), spec: specLike, version: hostileNumber }).map((v) => JSON.stringify(v)),
  fc
    .record({ lesson: fc.string(), answers: fc.anything(), spec: specLike, idempotencyKey: fc.string() })
    .map((v) => JSON.stringify(v)),
  fc.string(), // not JSON at all
);

function apiRoutes() {
  return allRoutePaths()
    .filter((r) => r.path.startsWith("/api/"))
    .map((r) => r.path.replace(/:[^/]+/g, UUID));
}

describe("JSON API fuzzing", () => {
  it("finds the API routes to fuzz", () => {
    expect(apiRoutes()).toContain("/api/v1/analyses");
  });

  it("never answers 500 or leaks a stack trace, signed in or not", async () => {
    const routes = apiRoutes();
    await fc.assert(
      fc.asyncProperty(
        fc.constantFrom(...routes),
        fc.constantFrom("GET", "POST", "PUT", "DELETE"),
        body,
        fc.boolean(),
        async (route, method, payload, signedIn) => {
          const res = await fetch(server.url + route, {
            method,
            headers: { "Content-Type": "application/json", Origin: server.url, ...(signedIn ? { cookie } : {}) },
            body: method === "GET" ? undefined : payload,
            redirect: "manual",
          });
          // Hostile input too gets only answers the OpenAPI document describes.
          await checkApiResponse(method, route, res);
          const text = await res.text();
          expect(
            ALLOWED.has(res.status) || (res.status >= 300 && res.status < 400),
            `${method} ${route} → ${res.status}: ${text.slice(0, 300)}`,
          ).toBe(true);
          expect(text).not.toMatch(/\bat [^\s]+ \(?[^\s]*\.(js|ts):\d+/);
        },
      ),
      { numRuns: 300 },
    );
    const alive = await fetch(`${server.url}/healthz`);
    expect(alive.status).toBe(200);
  }, 240_000);

  it("refuses bodies over the limit with 413 and wrong content types with 415", async () => {
    const big = JSON.stringify({ outline: Array.from({ length: 40_000 }, (_, i) => [i, i]) });
    const r1 = await fetch(`${server.url}/api/v1/analyses`, {
      method: "POST",
      headers: { "Content-Type": "application/json" },
      body: big,
    });
    expect(r1.status).toBe(413);
    await checkApiResponse("POST", "/api/v1/analyses", r1);
    const r2 = await fetch(`${server.url}/api/v1/analyses`, {
      method: "POST",
      headers: { "Content-Type": "text/plain" },
      body: "{}",
    });
    expect(r2.status).toBe(415);
    await checkApiResponse("POST", "/api/v1/analyses", r2);
    const alive = await fetch(`${server.url}/healthz`);
    expect(alive.status).toBe(200);
  });
});
