import { beforeEach, describe, expect, it, vi } from "vitest";

// The per-address limiter lives in PostgreSQL; here it is replaced so the route runs alone.
const limiter = vi.hoisted(() => ({ next: null as Response | null | "throw" }));
vi.mock("~/lib/rate-limit.server", () => ({
  limitApiRequest: async () => {
    if (limiter.next === "throw") throw new Error("database unavailable");
    return limiter.next;
  },
}));

const { action, loader } = await import("~/routes/api.v1.analyses.as-built");

const URL_ = "http://localhost/api/v1/analyses/as-built";
// 4 m x 2 m, outlet at (2, 0), 1:40: the outlet at level 0, the far edge at 50 mm
// (docs/roof-method.md §2-§3: H = 2 m / 40).
const spec = {
  outline: [
    [0, 0],
    [4, 0],
    [4, 2],
    [0, 2],
  ],
  outlets: [{ at: [2, 0] }],
  baseFall: "1:40",
  joists: { spacing: 0.4 },
};
const points = [
  { at: [0, 0], level: 0.05 },
  { at: [2, 0], level: 0 },
  { at: [4, 0], level: 0.05 },
  { at: [0, 2], level: 0.05 },
  { at: [2, 2], level: 0.05 },
  { at: [4, 2], level: 0.05 },
];

function post(body: unknown, headers: Record<string, string> = { "Content-Type": "application/json" }) {
  return new Request(URL_, {
    method: "POST",
    body: typeof body === "string" ? body : JSON.stringify(body),
    headers,
    duplex: "half",
  } as RequestInit);
}
const call = (request: Request) => action({ request, context: {}, params: {} } as never) as Promise<Response>;

beforeEach(() => {
  limiter.next = null;
});

describe("POST /api/v1/analyses/as-built", () => {
  it("answers 200 with the contract's keys", async () => {
    const res = await call(post({ spec, points }));
    expect(res.status).toBe(200);
    const a = await res.json();
    expect(Object.keys(a).sort()).toEqual(["deviations", "fixes", "surface", "tolerance", "verdict"]);
    expect(Object.keys(a.surface).sort()).toEqual(["catchments", "designPoints", "fallMap", "ponds"]);
    expect(a.deviations).toHaveLength(6);
    expect(a.deviations[1]).toMatchObject({ at: [2, 0], measured: 0 });
    expect(a.deviations[1].design).toBeCloseTo(0, 9);
    expect(a.deviations[4].design).toBeCloseTo(0.05, 9);
    expect(a.verdict.passed).toBe(true);
    expect(a.fixes).toEqual([]);
  });

  it("a low point fails the deviation with its place and a fix", async () => {
    const low = points.map((p, i) => (i === 4 ? { ...p, level: 0.03, label: "top middle" } : p));
    const a = await (await call(post({ spec, points: low, tolerance: { deviation: 0.005 } }))).json();
    expect(a.verdict.passed).toBe(false);
    expect(a.verdict.failures[0]).toMatchObject({ code: "deviation", at: [2, 2] });
    expect(a.verdict.failures[0].message).toContain("20 mm low");
    expect(a.fixes).toEqual([expect.objectContaining({ end: "end", change: 0.02 })]);
  });

  it("400 names the offending path and keeps to the error shape", async () => {
    const res = await call(post({ spec, points: [{ at: [0, "x"], level: 0 }] }));
    expect(res.status).toBe(400);
    const e = await res.json();
    expect(e.error.issues[0].path).toBe("points.0.at.1");
    const noPoints = await (await call(post({ spec, points: [] }))).json();
    expect(noPoints.error.issues[0].path).toBe("points");
    const badSpec = await call(post({ spec: { ...spec, outline: "no" }, points }));
    expect(badSpec.status).toBe(400);
    expect((await badSpec.json()).error.issues[0].path).toBe("spec.outline");
    const badTol = await (await call(post({ spec, points, tolerance: { deviation: -1 } }))).json();
    expect(badTol.error.issues[0].path).toBe("tolerance.deviation");
  });

  it("422 for a roof that cannot be built or a point off the roof", async () => {
    const crossing = await call(
      post({
        spec: {
          ...spec,
          outline: [
            [0, 0],
            [4, 2],
            [4, 0],
            [0, 2],
          ],
        },
        points,
      }),
    );
    expect(crossing.status).toBe(422);
    const outside = await call(post({ spec, points: [...points, { at: [9, 9], level: 0 }] }));
    expect(outside.status).toBe(422);
    expect((await outside.json()).error.issues[0].path).toBe("points.6.at");
  });

  it("405 on GET, 415 unless JSON, 400 for broken JSON, 429 passed on, works when the limiter fails", async () => {
    expect((loader() as Response).status).toBe(405);
    expect((await call(post({ spec, points }, { "Content-Type": "text/plain" }))).status).toBe(415);
    expect((await call(post("{not json"))).status).toBe(400);
    limiter.next = new Response("slow down", { status: 429 });
    expect((await call(post({ spec, points }))).status).toBe(429);
    limiter.next = "throw";
    expect((await call(post({ spec, points }))).status).toBe(200);
  });
});
