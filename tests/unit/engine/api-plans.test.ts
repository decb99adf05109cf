import { describe, expect, it, vi } from "vitest";

// The per-address limiter lives in PostgreSQL; here it is replaced so the route runs alone.
vi.mock("~/lib/rate-limit.server", () => ({ limitApiRequest: async () => null, chargeApiWork: () => 0 }));

const { action } = await import("~/routes/api.v1.analyses");

const spec = {
  outline: [
    [0, 0],
    [20, 0],
    [20, 10],
    [0, 10],
  ],
  outlets: [{ at: [10, 0] }],
  baseFall: "1:40",
};
const call = (body: unknown) =>
  action({
    request: new Request("http://localhost/api/v1/analyses", {
      method: "POST",
      body: JSON.stringify(body),
      headers: { "Content-Type": "application/json" },
    }),
    context: {},
    params: {},
  } as never) as Promise<Response>;

describe("POST /api/v1/analyses with openings and the plan advice (docs/roof-method-plans.md)", () => {
  it("answers 200 with the openings, the joist direction advice and the new warnings' keys", async () => {
    const res = await call({
      ...spec,
      outlets: [{ at: [10, 0] }, { at: [0, 5] }],
      openings: [
        {
          outline: [
            [8, 4],
            [12, 4],
            [12, 6],
            [8, 6],
          ],
          kind: "plant",
        },
      ],
    });
    expect(res.status).toBe(200);
    const a = await res.json();
    expect(a.shaped.openings).toEqual([{ index: 0, kind: "plant", upstand: 0.15, area: 8 }]);
    const total =
      a.shaped.catchments.reduce((s: number, c: { area: number }) => s + c.area, 0) +
      a.shaped.ponding.reduce((s: number, p: { area: number }) => s + p.area, 0);
    expect(total).toBeCloseTo(192, 6);
    for (const key of ["direction", "highLevel", "longestFallRatio", "worstFallRatio", "flatterThanMinimumArea"])
      expect(a.advice.joistDirections[0]).toHaveProperty(key);
    const parallel = a.warnings.find((w: { code: string }) => w.code === "outlet-parallel-to-joists");
    expect(parallel).toMatchObject({ outlet: 1 });
    expect(parallel.drainedArea).toBeGreaterThan(0);
    const held = a.warnings.find((w: { code: string }) => w.code === "water-held-behind-upstand");
    expect(held.at).toEqual([10, 6]);
    expect(held.area).toBeGreaterThan(0);
  });

  it("422 naming the opening that lies outside, crosses the outline or overlaps another", async () => {
    const cases = [
      {
        openings: [
          {
            outline: [
              [25, 2],
              [27, 2],
              [27, 4],
            ],
          },
        ],
        path: "openings.0.outline",
      },
      {
        openings: [
          {
            outline: [
              [18, 2],
              [22, 2],
              [22, 4],
              [18, 4],
            ],
          },
        ],
        path: "openings.0.outline",
      },
      {
        openings: [
          {
            outline: [
              [2, 2],
              [6, 2],
              [6, 6],
              [2, 6],
            ],
          },
          {
            outline: [
              [5, 5],
              [8, 5],
              [8, 8],
              [5, 8],
            ],
          },
        ],
        path: "openings.1.outline",
      },
    ];
    for (const c of cases) {
      const res = await call({ ...spec, openings: c.openings });
      expect(res.status).toBe(422);
      const body = await res.json();
      expect(body.error.issues[0].path).toBe(c.path);
    }
  });

  it("400 naming a malformed opening", async () => {
    const res = await call({ ...spec, openings: [{ outline: "square" }] });
    expect(res.status).toBe(400);
    expect((await res.json()).error.issues[0].path).toBe("openings.0.outline");
  });
});

describe("drainage areas divided by ridges (docs/roof-method-plans.md P4)", () => {
  const divided = {
    ...spec,
    outlets: [{ at: [10, 0] }, { at: [2, 0] }],
    ridges: [
      {
        line: [
          [5, 0],
          [5, 10],
        ],
      },
    ],
  };

  it("answers 200 with shaped.areas, and every joist carries its area", async () => {
    const res = await call(divided);
    expect(res.status).toBe(200);
    const body = await res.json();
    const areas = body.shaped.areas as { id: number; area: number; outlets: number[]; highLevel: number }[];
    expect(areas).toHaveLength(2);
    // 5 m × 10 m on the left (outlet 1, index 1) and 15 m × 10 m on the right (outlet 0).
    expect(areas.map((a) => [a.outlets, Math.round(a.area)]).sort()).toEqual([
      [[0], 150],
      [[1], 50],
    ]);
    expect(body.shaped.joists.every((j: { area: number }) => areas.some((a) => a.id === j.area))).toBe(true);
    expect(body.shaped.ridges).toEqual([{ index: 0, kind: "divide", line: divided.ridges[0].line }]);
  });

  it("422 naming an area without a drain, and a ridge that does not divide", async () => {
    const dry = await call({ ...divided, outlets: [{ at: [10, 0] }] });
    expect(dry.status).toBe(422);
    expect((await dry.json()).error.issues[0].path).toBe("ridges");
    const along = await call({
      ...divided,
      ridges: [
        {
          line: [
            [12, 0],
            [18, 0],
          ],
        },
      ],
    });
    expect(along.status).toBe(422);
    const issue = (await along.json()).error.issues[0];
    expect(issue.path).toBe("ridges.0.line");
    expect(issue.message).toMatch(/does not divide/);
  });

  it("400 naming a malformed area entry", async () => {
    const res = await call({ ...divided, areas: [{ at: "left" }] });
    expect(res.status).toBe(400);
    expect((await res.json()).error.issues[0].path).toBe("areas.0.at");
  });
});
