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

describe("drainage areas, not built yet", () => {
  it("refuses ridges and areas by name rather than ignoring them", async () => {
    for (const [key, value] of [
      [
        "ridges",
        [
          {
            line: [
              [10, 0],
              [10, 10],
            ],
          },
        ],
      ],
      ["areas", [{ at: [5, 5], joists: { direction: [1, 0] } }]],
    ] as const) {
      const res = await call({ ...spec, [key]: value });
      expect(res.status).toBe(422);
      expect((await res.json()).error.issues[0].path).toBe(key);
    }
  });
});
