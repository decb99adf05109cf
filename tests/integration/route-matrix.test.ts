import { randomUUID } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { useTestDatabase } from "../support/db";
import { allRoutePaths } from "../support/routes";
import { startServer, type RunningServer } from "../support/server";
import { sessionCookie } from "../support/accounts";
import { checkApiResponse } from "../support/openapi";

/**
 * Route × role matrix (docs/security.md, Permissions by role): every route in app/routes.ts,
 * requested with GET by an anonymous visitor and by each role, against the production server.
 *
 * ADDING A ROUTE? Add a row to MATRIX below with the status each role should get. Dynamic
 * segments take a placeholder: {uuid} (a random id: expect 404 for the signed-in, or 403),
 * {token} (a random link token), or a real id from the demo seed listed in SEED_IDS.
 * Anonymous visitors to a page that needs an account get 302 (to /login); to the JSON API, 401.
 */
type Who = "anonymous" | "admin" | "trainer" | "trainee" | "designer";
const WHO: Who[] = ["anonymous", "admin", "trainer", "trainee", "designer"];
const EMAIL: Record<Exclude<Who, "anonymous">, string> = {
  admin: "admin@tidemark.example",
  trainer: "trainer@tidemark.example",
  trainee: "trainee@tidemark.example",
  designer: "designer@tidemark.example",
};

type Expect = Record<Who, number>;
/** Statuses in the order anonymous, admin, trainer, trainee, designer. */
const s = (anonymous: number, admin: number, trainer: number, trainee: number, designer: number): Expect => ({
  anonymous,
  admin,
  trainer,
  trainee,
  designer,
});
const ALL = (status: number) => s(status, status, status, status, status);
const SIGNED_IN = (status: number) => s(302, status, status, status, status);

interface Case {
  /** The path to request, with {placeholders} for dynamic segments. */
  path: string;
  expect: Expect;
  why?: string;
}

const MATRIX: Record<string, Case[]> = {
  // Host and API
  "/healthz": [{ path: "/healthz", expect: ALL(200) }],
  // Accounts (issue 3)
  "/logout": [{ path: "/logout", expect: ALL(302), why: "GET never signs out; it goes home" }],
  "/login": [{ path: "/login", expect: s(200, 302, 302, 302, 302), why: "signed-in visitors go on to /" }],
  "/signup": [{ path: "/signup", expect: s(404, 302, 302, 302, 302), why: "closed unless an admin opens it" }],
  "/forgot-password": [{ path: "/forgot-password", expect: ALL(200) }],
  "/reset-password/:token": [{ path: "/reset-password/{token}", expect: ALL(404) }],
  "/invite/:token": [{ path: "/invite/{token}", expect: ALL(404) }],
  "/account": [{ path: "/account", expect: SIGNED_IN(200) }],
  "/admin": [{ path: "/admin", expect: s(302, 200, 403, 403, 403) }],
  "/admin/audit": [{ path: "/admin/audit", expect: s(302, 200, 403, 403, 403) }],
  "/admin/outbox": [{ path: "/admin/outbox", expect: s(302, 200, 403, 403, 403) }],
  // Home
  "/": [{ path: "/", expect: ALL(200) }],
  "/api/v1": [{ path: "/api/v1", expect: ALL(200), why: "the API index is public" }],
  "/api/v1/openapi.json": [{ path: "/api/v1/openapi.json", expect: ALL(200), why: "the API description is public" }],
  "/api/v1/docs": [{ path: "/api/v1/docs", expect: ALL(200), why: "the API description is public" }],
  "/api/v1/roofs": [{ path: "/api/v1/roofs", expect: s(401, 200, 200, 200, 200) }],
  "/api/v1/roofs/:id": [
    { path: "/api/v1/roofs/{uuid}", expect: s(401, 404, 404, 404, 404) },
    { path: "/api/v1/roofs/{designerRoof}", expect: s(401, 200, 200, 200, 200), why: "demo roofs are shared" },
  ],
  "/api/v1/analyses": [
    {
      path: "/api/v1/analyses",
      expect: ALL(405),
      why: "roofs are POSTed to be analysed; anyone may, within the per-address limit",
    },
  ],
  "/api/v1/analyses/as-built": [
    {
      path: "/api/v1/analyses/as-built",
      expect: ALL(405),
      why: "surveys are POSTed to be checked; anyone may, within the per-address limit",
    },
  ],
  "/api/v1/lessons": [{ path: "/api/v1/lessons", expect: ALL(200) }],
  "/api/v1/lessons/:slug": [
    { path: "/api/v1/lessons/{uuid}", expect: ALL(404) },
    { path: "/api/v1/lessons/{lessonSlug}", expect: ALL(200), why: "lessons are public to read" },
  ],
  "/api/v1/attempts": [
    { path: "/api/v1/attempts", expect: s(401, 400, 400, 400, 400), why: "GET needs a lesson to list attempts of" },
  ],
  "/api/v1/attempts/:id": [{ path: "/api/v1/attempts/{uuid}", expect: s(401, 404, 404, 404, 404) }],
  // Sandbox and roofs
  "/sandbox": [{ path: "/sandbox", expect: ALL(200) }],
  "/sandbox/sheet": [{ path: "/sandbox/sheet", expect: ALL(200) }],
  "/sandbox/schedule.csv": [
    { path: "/sandbox/schedule.csv", expect: ALL(405), why: "the schedule is POSTed from the sandbox" },
  ],
  "/sandbox/sheet.pdf": [{ path: "/sandbox/sheet.pdf", expect: ALL(405), why: "the roof on screen is POSTed" }],
  "/sandbox/plan.dxf": [{ path: "/sandbox/plan.dxf", expect: ALL(405), why: "the roof on screen is POSTed" }],
  "/sandbox/roof.glb": [{ path: "/sandbox/roof.glb", expect: ALL(405), why: "the roof on screen is POSTed" }],
  "/roofs": [{ path: "/roofs", expect: SIGNED_IN(200) }],
  "/roofs/new": [{ path: "/roofs/new", expect: ALL(302), why: "GET goes back to the list; only POST creates" }],
  "/roofs/:id": [
    { path: "/roofs/{uuid}", expect: SIGNED_IN(404) },
    { path: "/roofs/{designerRoof}", expect: SIGNED_IN(200), why: "demo roofs are shared" },
  ],
  "/roofs/:id/export": [
    { path: "/roofs/{uuid}/export", expect: SIGNED_IN(404) },
    { path: "/roofs/{designerRoof}/export", expect: SIGNED_IN(200) },
  ],
  "/roofs/:id/sheet": [
    { path: "/roofs/{uuid}/sheet", expect: SIGNED_IN(404) },
    { path: "/roofs/{designerRoof}/sheet", expect: SIGNED_IN(200) },
  ],
  "/roofs/:id/checks": [
    { path: "/roofs/{uuid}/checks", expect: SIGNED_IN(404) },
    { path: "/roofs/{designerRoof}/checks", expect: SIGNED_IN(200), why: "whoever may read the roof reads its checks" },
  ],
  "/roofs/:id/checks/:checkId": [
    { path: "/roofs/{designerRoof}/checks/{uuid}", expect: SIGNED_IN(404), why: "no such check on that roof" },
  ],
  "/roofs/:id/checks/:checkId.pdf": [
    { path: "/roofs/{designerRoof}/checks/{uuid}.pdf", expect: SIGNED_IN(404), why: "no such check on that roof" },
  ],
  "/roofs/:id/schedule.csv": [
    { path: "/roofs/{uuid}/schedule.csv", expect: SIGNED_IN(404) },
    {
      path: "/roofs/{designerRoof}/schedule.csv",
      expect: SIGNED_IN(200),
      why: "readable by whoever may read the roof",
    },
  ],
  "/roofs/:id/sheet.pdf": [
    { path: "/roofs/{uuid}/sheet.pdf", expect: SIGNED_IN(404) },
    { path: "/roofs/{designerRoof}/sheet.pdf", expect: SIGNED_IN(200) },
  ],
  "/roofs/:id/plan.dxf": [
    { path: "/roofs/{uuid}/plan.dxf", expect: SIGNED_IN(404) },
    { path: "/roofs/{designerRoof}/plan.dxf", expect: SIGNED_IN(200) },
  ],
  "/roofs/:id/roof.glb": [
    { path: "/roofs/{uuid}/roof.glb", expect: SIGNED_IN(404) },
    { path: "/roofs/{designerRoof}/roof.glb", expect: SIGNED_IN(200) },
  ],
  "/s/:token": [
    { path: "/s/{token}", expect: ALL(404), why: "no account needed; an unknown or revoked link is 404 for everyone" },
  ],
  "/s/:token/:file": [
    { path: "/s/{token}/schedule.csv", expect: ALL(404) },
    { path: "/s/{token}/anything", expect: ALL(404) },
  ],
  "/roofs/:id/underlay": [
    { path: "/roofs/{uuid}/underlay", expect: ALL(404) },
    {
      path: "/roofs/{designerRoof}/underlay",
      expect: ALL(404),
      why: "no underlay uploaded; unknown and hidden look the same",
    },
  ],
  // Lessons and attempts
  "/lessons": [{ path: "/lessons", expect: ALL(200) }],
  "/lessons/:slug": [
    { path: "/lessons/{uuid}", expect: ALL(404) },
    { path: "/lessons/{lessonSlug}", expect: ALL(200), why: "lessons are public to read" },
  ],
  "/lessons/new": [
    { path: "/lessons/new", expect: s(302, 200, 200, 403, 403), why: "trainers and admins write lessons" },
  ],
  "/lessons/:slug/edit": [
    { path: "/lessons/{uuid}/edit", expect: s(302, 404, 404, 403, 403) },
    {
      path: "/lessons/{lessonSlug}/edit",
      expect: s(302, 200, 200, 403, 403),
      why: "a built-in lesson's edit page offers only Duplicate",
    },
  ],
  "/lessons/:slug/export": [
    { path: "/lessons/{uuid}/export", expect: ALL(404) },
    { path: "/lessons/{lessonSlug}/export", expect: ALL(200), why: "built-in lessons are public to read" },
  ],
  "/attempts": [{ path: "/attempts", expect: SIGNED_IN(200) }],
  "/attempts/:id": [{ path: "/attempts/{uuid}", expect: SIGNED_IN(404) }],
  "/attempts/:id/review": [{ path: "/attempts/{uuid}/review", expect: SIGNED_IN(404) }],
  // Classes (the demo class belongs to trainer@; trainee@ is a member, designer@ is not)
  "/classes": [{ path: "/classes", expect: SIGNED_IN(200) }],
  "/classes/:id": [
    { path: "/classes/{uuid}", expect: s(302, 404, 404, 403, 403) },
    {
      path: "/classes/{trainerClass}",
      expect: s(302, 200, 200, 403, 403),
      why: "trainees follow a class, they do not manage it",
    },
  ],
  "/classes/:id/gradebook": [
    { path: "/classes/{uuid}/gradebook", expect: s(302, 404, 404, 403, 403) },
    { path: "/classes/{trainerClass}/gradebook", expect: s(302, 200, 200, 403, 403) },
  ],
  "/classes/:id/gradebook.csv": [
    { path: "/classes/{uuid}/gradebook.csv", expect: s(401, 404, 404, 403, 403) },
    { path: "/classes/{trainerClass}/gradebook.csv", expect: s(401, 200, 200, 403, 403) },
  ],
  "/classes/:id/present": [
    { path: "/classes/{uuid}/present", expect: s(302, 404, 404, 403, 403) },
    { path: "/classes/{trainerClass}/present", expect: s(302, 200, 200, 403, 403) },
  ],
  "/classes/:id/follow": [
    { path: "/classes/{uuid}/follow", expect: SIGNED_IN(404) },
    {
      path: "/classes/{trainerClass}/follow",
      expect: s(302, 200, 200, 200, 404),
      why: "members and staff follow; others do not see the class",
    },
  ],
  "/classes/:id/live": [
    { path: "/classes/{uuid}/live", expect: s(401, 404, 404, 404, 404) },
    { path: "/classes/{trainerClass}/live", expect: s(401, 200, 200, 200, 404) },
  ],
  "/classes/:id/hand-ups": [
    { path: "/classes/{uuid}/hand-ups", expect: s(401, 404, 404, 404, 404) },
    {
      path: "/classes/{trainerClass}/hand-ups",
      expect: s(401, 200, 200, 403, 404),
      why: "only the class's trainer (or an admin) sees the wall; a member is told so, others do not see the class",
    },
  ],
  "/gradebook": [{ path: "/gradebook", expect: s(302, 200, 200, 403, 403) }],
  // Courses and certificates (docs/product.md capability 10)
  "/courses": [
    { path: "/courses", expect: s(302, 200, 200, 200, 403), why: "trainees see the courses their classes follow" },
  ],
  "/courses/:id": [{ path: "/courses/{uuid}", expect: s(302, 404, 404, 404, 403) }],
  "/certificates/:id": [{ path: "/certificates/{uuid}", expect: SIGNED_IN(404) }],
  "/certificates/:id.pdf": [{ path: "/certificates/{uuid}.pdf", expect: SIGNED_IN(404) }],
  "/verify": [
    { path: "/verify", expect: ALL(200), why: "public: where a code from a printed certificate is typed" },
    { path: "/verify?code=0000", expect: ALL(400), why: "what cannot be a code stays on the page with its error" },
  ],
  "/verify/:code": [
    { path: "/verify/0000-0000-0000", expect: ALL(404), why: "public: a code no certificate has is 404 for everyone" },
  ],
  "/*": [{ path: "/no-such-page/{uuid}", expect: ALL(404), why: "the 404 page inside the shell, with its navigation" }],
};

/** Real ids from the demo seed, looked up once. */
const SEED_IDS: Record<string, (k: ReturnType<typeof database.db>) => Promise<string>> = {
  designerRoof: async (k) => (await k("roofs").where({ name: "Library annex, Harrow Lane" }).first("id"))!.id,
  trainerClass: async (k) => (await k("classes").where({ name: "Parapet roofs, spring cohort" }).first("id"))!.id,
  lessonSlug: async (k) => (await k("lessons").orderBy("position").first("slug"))!.slug,
};

const database = useTestDatabase();
let server: RunningServer;
const cookies: Partial<Record<Who, string>> = {};
const values: Record<string, string> = {};

beforeAll(async () => {
  server = await startServer(database.url());
  for (const who of WHO) if (who !== "anonymous") cookies[who] = await sessionCookie(EMAIL[who]);
  values.uuid = randomUUID();
  values.token = "Zq".repeat(21) + "x";
  for (const [name, find] of Object.entries(SEED_IDS)) values[name] = await find(database.db());
}, 120_000);
afterAll(async () => {
  await server?.stop();
});

function concrete(path: string): string {
  return path.replace(/\{(\w+)\}/g, (_, name: string) => {
    if (!(name in values)) throw new Error(`unknown placeholder {${name}} in ${path}: add it to SEED_IDS`);
    return encodeURIComponent(values[name]);
  });
}

async function statuses(path: string): Promise<Expect> {
  const out = {} as Expect;
  await Promise.all(
    WHO.map(async (who) => {
      const res = await fetch(server.url + path, {
        redirect: "manual",
        headers: cookies[who] ? { cookie: cookies[who]! } : {},
      });
      // The JSON API's answers, whoever asks, are the ones its OpenAPI document describes.
      if (path.startsWith("/api/v1")) await checkApiResponse("GET", path, res);
      await res.body?.cancel(); // event streams never end; the status is all we need
      out[who] = res.status;
    }),
  );
  return out;
}

const asArgs = (e: Expect) => `s(${WHO.map((w) => e[w]).join(", ")})`;

const routes = [...new Map(allRoutePaths().map((r) => [r.path, r])).values()];

describe("route × role matrix", () => {
  it("has a row for every route in app/routes.ts, and none for routes that are gone", async () => {
    const missing = routes.filter((r) => !MATRIX[r.path]);
    const hints = await Promise.all(
      missing.map(async (r) => {
        const sample = r.path.replace(/:(\w+)/g, "{uuid}");
        const seen = await statuses(concrete(sample));
        return `  ${JSON.stringify(r.path)}: [{ path: ${JSON.stringify(sample)}, expect: ${asArgs(seen)} }],  // ${r.file}: statuses seen now, check each`;
      }),
    );
    expect(
      missing.map((r) => r.path),
      `Route(s) not in the route × role matrix. Add a row to MATRIX in tests/integration/route-matrix.test.ts with the status each role should get:\n${hints.join("\n")}\n`,
    ).toEqual([]);
    const stale = Object.keys(MATRIX).filter((p) => !routes.some((r) => r.path === p));
    expect(stale, "MATRIX rows for routes no longer in app/routes.ts: remove them").toEqual([]);
  });

  for (const r of routes.filter((route) => MATRIX[route.path])) {
    it(`${r.path} answers each role as the matrix says`, async () => {
      for (const c of MATRIX[r.path]) {
        const path = concrete(c.path);
        const seen = await statuses(path);
        expect
          .soft(seen, `GET ${c.path} (${path}) answered ${asArgs(seen)}${c.why ? ` — ${c.why}` : ""}`)
          .toEqual(c.expect);
      }
    });
  }

  it("sends anonymous visitors who need an account to /login with the way back", async () => {
    const res = await fetch(server.url + "/account", { redirect: "manual" });
    expect(res.headers.get("location")).toBe("/login?redirectTo=%2Faccount");
  });
});
