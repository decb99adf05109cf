import { describe, expect, it } from "vitest";
import { parseSpec } from "~/engine";
import { analyseSpec, close, RECT_20_10 } from "./helpers";

/*
 * Openings with upstands (docs/roof-method-plans.md P2, P3, P5), worked by hand from
 * docs/roof-method.md §2-§7. Common to all: the 20 m × 10 m rectangle, one outlet at (10, 0),
 * base fall 1:40, joists along y every 0.4 m. H = 10 m × 1/40 = 0.25 m and the surface is
 * z = (1 - v)·H·|x - 10|/10 + v·H with v = y/10 (§4), the openings taking no part in it.
 */
const H = 0.25;
const z = (x: number, y: number) => (1 - y / 10) * H * (Math.abs(x - 10) / 10) + (y / 10) * H;

describe("a rooflight off the fall line", () => {
  // Rooflight 2 m × 2 m at x 4..6, y 5..7: it lies wholly left of the fall line x = 10.
  const rooflight: [number, number][] = [
    [4, 5],
    [6, 5],
    [6, 7],
    [4, 7],
  ];
  const spec = {
    outline: RECT_20_10,
    outlets: [{ at: [10, 0] }],
    baseFall: "1:40",
    openings: [{ outline: rooflight, kind: "rooflight" as const, upstand: 0.2 }],
    probes: [
      [2, 2],
      [15, 8],
      [5, 6],
      [5, 5],
      [4, 7],
    ] as [number, number][],
  };
  const a = analyseSpec(spec, { mesh: true, traces: false });
  const without = analyseSpec({ ...spec, openings: undefined }, { mesh: false, traces: false });

  it("keeps the deck's levels: probes away from it and on its edge as without it; none inside", () => {
    close(a.shaped.highLevel, H);
    close(a.shaped.probes[0].level, z(2, 2)); // 0.8·0.25·0.8 + 0.2·0.25 = 0.21
    close(a.shaped.probes[0].level, 0.21);
    close(a.shaped.probes[1].level, z(15, 8)); // 0.2·0.25·0.5 + 0.8·0.25 = 0.225
    expect(a.shaped.probes[2].level).toBeNull(); // (5, 6) is inside the rooflight
    expect(a.warnings.some((w) => w.code === "probe-outside" && w.at?.[0] === 5 && w.at?.[1] === 6)).toBe(true);
    close(a.shaped.probes[3].level, z(5, 5)); // on its upstand: the deck's level, 0.5·0.125 + 0.125 = 0.1875
    close(a.shaped.probes[4].level, z(4, 7));
    expect(a.shaped.probes.filter((p, i) => i !== 2).map((p) => p.level)).toEqual(
      without.shaped.probes.filter((p, i) => i !== 2).map((p) => p.level),
    );
  });

  it("drains the outline's area less the opening: 200 - 4 = 196 m², and lists the opening", () => {
    const total =
      a.shaped.catchments.reduce((s, c) => s + c.area, 0) + a.shaped.ponding.reduce((s, p) => s + p.area, 0);
    close(total, 196, 1e-6);
    close(a.shaped.fallMap.area, 196, 1e-6);
    expect(a.shaped.openings).toEqual([{ index: 0, kind: "rooflight", upstand: 0.2, area: 4 }]);
  });

  it("reports no fall inside it: no mesh face has its middle in the rooflight", () => {
    const m = a.shaped.mesh!;
    for (let f = 0; f < m.indices.length; f += 3) {
      let cx = 0,
        cy = 0;
      for (let k = 0; k < 3; k++) {
        cx += m.positions[3 * m.indices[f + k]] / 3;
        cy += m.positions[3 * m.indices[f + k] + 1] / 3;
      }
      expect(cx > 4 && cx < 6 && cy > 5 && cy < 7).toBe(false);
    }
  });

  it("trims the joists it cuts: the joist at x = 4.8 stops at y = 5 and starts again at y = 7 with the uncut levels", () => {
    const j = a.shaped.joists.find((k) => Math.abs(k.spans[0].start[0] - 4.8) < 1e-9)!;
    expect(j.spans.map((s) => [s.start[1], s.end[1]])).toEqual([
      [0, 5],
      [7, 10],
    ]);
    close(j.spans[0].startLevel, z(4.8, 0)); // 0.25 × 5.2/10 = 0.13
    close(j.spans[0].startLevel, 0.13);
    close(j.spans[0].endLevel, z(4.8, 5)); // 0.5·0.13 + 0.125 = 0.19
    close(j.spans[1].startLevel, z(4.8, 7)); // 0.3·0.13 + 0.175 = 0.214
    close(j.spans[1].endLevel, H);
    // The uncut joist rises 0.12 m over 10 m, 1:83.33; each piece keeps that fall.
    close(j.spans[0].ratio, 10 / 0.12, 1e-6);
    close(j.spans[1].ratio, 10 / 0.12, 1e-6);
    // A joist clear of it (x = 2) is one span, as without the rooflight.
    const clear = a.shaped.joists.find((k) => Math.abs(k.spans[0].start[0] - 2) < 1e-9)!;
    expect(clear.spans).toHaveLength(1);
  });

  it("sends the longest fall line round it: (0, 10) → (4, 5) → (10, 0), √41 + √61 = 14.2134 m", () => {
    // Straight, (0, 10) → (10, 0) runs along y = 10 - x, through (4, 6) and (5, 5): inside the
    // rooflight. Round its corners: by (4, 5) √(4² + 5²) + √(6² + 5²) = 6.4031 + 7.8102 =
    // 14.2134 m; by (6, 7) √(6² + 3²) + √(4² + 7²) = 6.7082 + 8.0623 = 14.7705 m. The shorter one.
    const line = a.shaped.longestFallLine!;
    expect(line.from).toEqual([0, 10]);
    expect(line.path).toEqual([
      [0, 10],
      [4, 5],
      [10, 0],
    ]);
    close(line.length, Math.sqrt(41) + Math.sqrt(61), 1e-9);
    close(line.ratio, (Math.sqrt(41) + Math.sqrt(61)) / H, 1e-6);
    // Without the rooflight the same corner's line is the straight √200 = 14.1421 m.
    close(without.shaped.longestFallLine!.length, Math.sqrt(200), 1e-9);
  });

  it("holds no water: its high side falls all along toward the fall line", () => {
    expect(a.warnings.some((w) => w.code === "water-held-behind-upstand")).toBe(false);
    expect(a.shaped.ponding).toEqual([]);
  });
});

describe("an opening across the fall line holds water on its high side", () => {
  // Plant base at x 8..12, y 4..6, across x = 10. Along its high side y = 6 the deck is
  // 0.4·0.25·|x - 10|/10 + 0.15: lowest, 0.15 m, at (10, 6), rising to 0.17 m at both corners.
  // Water runs along the upstand into (10, 6) and stays.
  // The cricket (P5): zc = max(0.17 + 2/100, 0.17 + 2/100) = 0.19 m (minimum fall 1:100), 0.04 m
  // above the deck at the held point; the deck rises along the joist x = 10 at 0.25/10 = 0.025,
  // so the crest runs 0.04/0.025 = 1.6 m, from (10, 6) to (10, 7.6).
  const a = analyseSpec(
    {
      outline: RECT_20_10,
      outlets: [{ at: [10, 0] }],
      baseFall: "1:40",
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
    },
    { mesh: false, traces: false },
  );
  const held = a.warnings.filter((w) => w.code === "water-held-behind-upstand");

  it("warns once, at (10, 6), with the area draining there", () => {
    expect(held).toHaveLength(1);
    expect(held[0].at).toEqual([10, 6]);
    expect(held[0].opening).toBe(0);
    const pit = a.shaped.ponding.find((p) => p.at[0] === 10 && p.at[1] === 6)!;
    close(held[0].area, pit.area);
    close(pit.level, 0.15);
    // Water from the strip above the base gathers there: several m², less than the deck above it (4 m × 4 m = 16 m² plus its sides).
    expect(held[0].area).toBeGreaterThan(4);
    expect(held[0].area).toBeLessThan(40);
  });

  it("gives the cricket as worked", () => {
    const c = held[0].cricket!;
    close(c.crestLevel, 0.19);
    close(c.height, 0.04);
    close(c.length, 1.6);
    expect(c.line[0]).toEqual([10, 6]);
    close(c.line[1][0], 10);
    close(c.line[1][1], 7.6);
    expect(held[0].message).toMatch(/cricket/);
  });

  it("drains 200 - 8 = 192 m² in all", () => {
    const total =
      a.shaped.catchments.reduce((s, c) => s + c.area, 0) + a.shaped.ponding.reduce((s, p) => s + p.area, 0);
    close(total, 192, 1e-6);
  });
});

describe("openings that cannot be built", () => {
  const base = { outline: RECT_20_10, outlets: [{ at: [10, 0] }], baseFall: "1:40" };
  const refused = (openings: unknown) => {
    const r = parseSpec({ ...base, openings });
    if (r.ok) throw new Error("accepted");
    return r;
  };

  it("outside the outline: 422 naming the opening", () => {
    const r = refused([
      {
        outline: [
          [25, 2],
          [27, 2],
          [27, 4],
        ],
      },
    ]);
    expect(r.status).toBe(422);
    expect(r.error.issues[0].path).toBe("openings.0.outline");
    expect(r.error.issues[0].message).toMatch(/outside/);
  });

  it("crossing or touching the outline: 422", () => {
    for (const outline of [
      [
        [18, 2],
        [22, 2],
        [22, 4],
        [18, 4],
      ],
      [
        [18, 2],
        [20, 2],
        [20, 4],
        [18, 4],
      ],
    ]) {
      const r = refused([{ outline }]);
      expect(r.status).toBe(422);
      expect(r.error.issues[0].path).toBe("openings.0.outline");
      expect(r.error.issues[0].message).toMatch(/outline/);
    }
  });

  it("overlapping another, or inside another: 422 naming the second", () => {
    const a: [number, number][] = [
      [2, 2],
      [6, 2],
      [6, 6],
      [2, 6],
    ];
    for (const b of [
      [
        [5, 5],
        [8, 5],
        [8, 8],
        [5, 8],
      ],
      [
        [3, 3],
        [4, 3],
        [4, 4],
        [3, 4],
      ],
    ]) {
      const r = refused([{ outline: a }, { outline: b }]);
      expect(r.status).toBe(422);
      expect(r.error.issues[0].path).toBe("openings.1.outline");
      expect(r.error.issues[0].message).toMatch(/opening 1/);
    }
  });

  it("a self-crossing opening: 422; a malformed one: 400 with the field", () => {
    expect(
      refused([
        {
          outline: [
            [2, 2],
            [6, 6],
            [6, 2],
            [2, 6],
          ],
        },
      ]).status,
    ).toBe(422);
    const bad = refused([
      {
        outline: [
          [2, 2],
          [6, 2],
        ],
      },
    ]);
    expect(bad.status).toBe(400);
    expect(bad.error.issues[0].path).toBe("openings.0.outline");
    const kind = refused([
      {
        outline: [
          [2, 2],
          [6, 2],
          [6, 6],
        ],
        kind: "chimney",
      },
    ]);
    expect(kind.status).toBe(400);
    expect(kind.error.issues[0].path).toBe("openings.0.kind");
  });
});
