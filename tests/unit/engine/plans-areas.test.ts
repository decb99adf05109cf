import { describe, expect, it } from "vitest";
import { parseSpec, type Point } from "~/engine";
import { analyseSpec, close } from "./helpers";

/*
 * Drainage areas divided by ridges (docs/roof-method-plans.md P4), worked by hand from
 * docs/roof-method.md §2-§5.
 *
 * The L-shape: outline (0,0) (20,0) (20,10) (10,10) (10,20) (0,20); the re-entrant corner is
 * (10,10). A ridge from (10,10) to (0,10) cuts it into
 *   - the bottom wing, 20 m × 10 m (y 0..10), outlet O1 at (10, 0): its joists run along y (the
 *     inward normal of its outlet's wall); its own span through O1 is 10 m, so its own need is
 *     10/40 = 0.25 m;
 *   - the top wing, 10 m × 10 m (x 0..10, y 10..20), outlet O2 at (5, 20): joists along -y,
 *     span 10 m, own need 0.25 m.
 * H = max(0.25, 0.25) = 0.25 m. Each wing is a rectangle whose walls not holding its outlet are
 * at H (the ridge, and the ridge's ends as knots at H), so §4 gives in each:
 *   bottom: z = (1 - v)·H·|x - 10|/10 + v·H, v = y/10;
 *   top:    z = (1 - w)·H·|x - 5|/5 + w·H,   w = (20 - y)/10.
 */
const H = 0.25;
const bottom = (x: number, y: number) => (1 - y / 10) * H * (Math.abs(x - 10) / 10) + (y / 10) * H;
const top = (x: number, y: number) => (1 - (20 - y) / 10) * H * (Math.abs(x - 5) / 5) + ((20 - y) / 10) * H;
const L_SHAPE: Point[] = [
  [0, 0],
  [20, 0],
  [20, 10],
  [10, 10],
  [10, 20],
  [0, 20],
];
const lSpec = {
  outline: L_SHAPE,
  outlets: [{ at: [10, 0] as Point }, { at: [5, 20] as Point }],
  baseFall: "1:40",
  ridges: [
    {
      line: [
        [10, 10],
        [0, 10],
      ] as Point[],
    },
  ],
  probes: [
    [15, 5],
    [10, 2],
    [2, 15],
    [5, 18],
    [10, 10],
    [20, 10],
  ] as Point[],
};

describe("an L-shape divided at its re-entrant corner, an outlet in each wing", () => {
  const a = analyseSpec(lSpec, { mesh: true, traces: false });
  const undivided = analyseSpec({ ...lSpec, ridges: undefined }, { mesh: false, traces: false });

  it("has H = 0.25 m, one level rim, from each wing's own span of 10 m at 1:40", () => {
    close(a.shaped.highLevel, H);
    expect(a.shaped.areas).toHaveLength(2);
    for (const area of a.shaped.areas) close(area.highLevel, H);
  });

  it("gives the probes from each wing's own chord rule", () => {
    const [p1, p2, p3, p4, ridgeEnd, corner] = a.shaped.probes;
    close(p1.level, bottom(15, 5)); // 0.5·0.25·0.5 + 0.5·0.25 = 0.1875
    close(p1.level, 0.1875);
    close(p2.level, bottom(10, 2)); // 0 + 0.2·0.25 = 0.05
    close(p3.level, top(2, 15)); // 0.5·0.25·0.6 + 0.5·0.25 = 0.2
    close(p3.level, 0.2);
    close(p4.level, top(5, 18)); // 0 + 0.2·0.25 = 0.05
    close(ridgeEnd.level, H); // the ridge's end is a knot at H
    close(corner.level, H);
  });

  it("has no twist warning; the undivided L does", () => {
    expect(a.warnings.filter((w) => w.code === "twist")).toEqual([]);
    expect(undivided.warnings.some((w) => w.code === "twist")).toBe(true);
  });

  it("lists each wing with its outlet, joist direction and drained area; catchments 200 and 100 m²", () => {
    const byOutlet = (k: number) => a.shaped.areas.find((x) => x.outlets.includes(k))!;
    close(byOutlet(0).area, 200);
    expect(byOutlet(0).outlets).toEqual([0]);
    expect(byOutlet(0).joistDirection).toEqual([0, 1]);
    close(byOutlet(1).area, 100);
    expect(byOutlet(1).joistDirection).toEqual([0, -1]);
    const catchment = (k: number) => a.shaped.catchments.find((c) => c.kind === "outlet" && c.index === k)!.area;
    close(catchment(0), 200, 1e-6);
    close(catchment(1), 100, 1e-6);
    close(a.shaped.fallMap.area, 300, 1e-6);
  });

  it("lists the joists area by area, each carrying its area, and lying in it", () => {
    const ids = a.shaped.joists.map((j) => j.area);
    // Area by area: the ids never come back once left.
    const runs = ids.filter((id, i) => i === 0 || id !== ids[i - 1]);
    expect(runs).toHaveLength(2);
    expect(a.shaped.joists.map((j) => j.index)).toEqual(a.shaped.joists.map((_, i) => i));
    for (const j of a.shaped.joists) {
      const area = a.shaped.areas.find((x) => x.id === j.area)!;
      const inTop = area.outlets.includes(1);
      for (const s of j.spans) {
        for (const p of [s.start, s.end]) {
          if (inTop) expect(p[1]).toBeGreaterThanOrEqual(10 - 1e-9);
          else expect(p[1]).toBeLessThanOrEqual(10 + 1e-9);
        }
        // The schedule's levels are the wing's own surface.
        const f = inTop ? top : bottom;
        close(s.startLevel, f(s.start[0], s.start[1]), 1e-9);
        close(s.endLevel, f(s.end[0], s.end[1]), 1e-9);
      }
    }
  });

  it("a roof without ridges is one area, id 0, holding every joist", () => {
    expect(undivided.shaped.areas).toHaveLength(1);
    expect(undivided.shaped.areas[0].id).toBe(0);
    expect(undivided.shaped.joists.every((j) => j.area === 0)).toBe(true);
  });
});

describe("an area's own joist settings, and H from the area that needs most", () => {
  // The same L with O1 moved to (20, 5) on the bottom wing's right wall: that wing's joists run
  // along -x (its outlet wall's inward normal), its span through O1 is 20 m and its own need
  // 20/40 = 0.5 m (§3), which sets H for both wings; the top wing (own need 0.25 m) rises to it:
  // at (5, 18), w = 0.2: 0 + 0.2·0.5 = 0.1 m. An entry at (15, 5) sets that wing's spacing to 0.5 m.
  const a = analyseSpec({
    ...lSpec,
    outlets: [{ at: [20, 5] }, { at: [5, 20] }],
    areas: [{ at: [15, 5], joists: { spacing: 0.5 } }],
  });
  const wing = a.shaped.areas.find((x) => x.outlets.includes(0))!;
  const other = a.shaped.areas.find((x) => x.outlets.includes(1))!;

  it("H = 0.5 m from the bottom wing; the top wing rises to it", () => {
    expect(wing.at).toEqual([15, 5]);
    expect(wing.joistDirection).toEqual([-1, 0]);
    close(wing.highLevel, 0.5);
    close(other.highLevel, 0.25);
    close(a.shaped.highLevel, 0.5);
    close(a.shaped.probes[3].level, 0.1);
  });

  it("spaces the wing's joists by its entry (0.5 m) and the other's by the default (0.4 m)", () => {
    const gaps = (id: number) => {
      const js = a.shaped.joists.filter((j) => j.area === id);
      return js.slice(1, -1).map((j, k) => j.offset - js[k].offset);
    };
    for (const g of gaps(wing.id).slice(1)) close(g, 0.5, 1e-9);
    for (const g of gaps(other.id).slice(1)) close(g, 0.4, 1e-9);
  });
});

describe("ridges and areas that cannot be built", () => {
  const refused = (spec: unknown) => {
    const r = parseSpec(spec);
    if (r.ok) throw new Error("accepted");
    return r;
  };

  it("an area without a drain: 422 naming a point in it, or the areas entry that names it", () => {
    const r = refused({ ...lSpec, outlets: [{ at: [10, 0] }] });
    expect(r.status).toBe(422);
    expect(r.error.issues[0].path).toBe("ridges");
    expect(r.error.issues[0].message).toMatch(/no outlet and no eaves edge/);
    expect(r.error.issues[0].message).toMatch(/\(5, 15\)/);
    const named = refused({ ...lSpec, outlets: [{ at: [10, 0] }], areas: [{ at: [3, 17] }] });
    expect(named.error.issues[0].path).toBe("areas.0.at");
    // An eaves edge is a drain: the top wing with its top wall as eaves is accepted.
    const eaves = parseSpec({
      ...lSpec,
      outlets: [{ at: [10, 0] }],
      edges: ["parapet", "parapet", "parapet", "parapet", "eaves", "parapet"],
    });
    expect(eaves.ok).toBe(true);
  });

  it("a ridge that does not divide, ends off the outline, or crosses an opening: 422 with its path", () => {
    const along = refused({
      ...lSpec,
      ridges: [
        {
          line: [
            [2, 0],
            [8, 0],
          ],
        },
      ],
    });
    expect(along.error.issues[0].path).toBe("ridges.0.line");
    expect(along.error.issues[0].message).toMatch(/does not divide/);
    const off = refused({
      ...lSpec,
      ridges: [
        {
          line: [
            [10, 10],
            [4, 10],
          ],
        },
      ],
    });
    expect(off.error.issues[0].path).toBe("ridges.0.line");
    expect(off.error.issues[0].message).toMatch(/\(4, 10\)/);
    const second = refused({
      ...lSpec,
      ridges: [
        lSpec.ridges[0],
        {
          line: [
            [5, 5],
            [5, 15],
          ],
        },
      ],
    });
    expect(second.error.issues[0].path).toBe("ridges.1.line");
    const throughOpening = refused({
      ...lSpec,
      openings: [
        {
          outline: [
            [3, 9],
            [5, 9],
            [5, 11],
            [3, 11],
          ],
        },
      ],
    });
    expect(throughOpening.error.issues[0].path).toBe("ridges.0.line");
    expect(throughOpening.error.issues[0].message).toMatch(/opening 1/);
  });

  it("an outlet at a ridge's end, and an areas entry on a ridge or outside: 422", () => {
    const r = refused({ ...lSpec, outlets: [{ at: [10, 0] }, { at: [5, 20] }, { at: [0, 10] }] });
    expect(r.error.issues[0].path).toBe("outlets.2.at");
    expect(refused({ ...lSpec, areas: [{ at: [5, 10] }] }).error.issues[0].path).toBe("areas.0.at");
    expect(refused({ ...lSpec, areas: [{ at: [15, 15] }] }).error.issues[0].path).toBe("areas.0.at");
    const twice = refused({ ...lSpec, areas: [{ at: [1, 1] }, { at: [15, 5] }] });
    expect(twice.error.issues[0].path).toBe("areas.1.at");
    expect(twice.error.issues[0].message).toMatch(/areas\.0/);
  });

  it("a closed ridge: 422, the area it encloses has no drain (outlets sit on walls)", () => {
    // A loop round the L's inner part, and one starting and ending on a wall: neither encloses a
    // wall, so neither inner area could hold an outlet or eaves (docs/roof-method-plans.md P4).
    for (const line of [
      [
        [2, 2],
        [6, 2],
        [6, 6],
        [2, 6],
        [2, 2],
      ],
      [
        [4, 0],
        [6, 3],
        [2, 3],
        [4, 0],
      ],
    ]) {
      const r = refused({ ...lSpec, ridges: [{ line }] });
      expect(r.status).toBe(422);
      expect(r.error.issues[0].path).toBe("ridges.0.line");
      expect(r.error.issues[0].message).toMatch(/closed: the area inside it touches no wall/);
    }
  });

  it("a malformed ridge: 400 with its field", () => {
    const r = refused({ ...lSpec, ridges: [{ line: [[1, 2]] }] });
    expect(r.status).toBe(400);
    expect(r.error.issues[0].path).toBe("ridges.0.line");
  });
});

describe("one-click cricket: the diverting ridge the warning suggests sheds the held water", () => {
  // The plant base of the held-water case (docs/roof-method-plans.md P3, P5): 20 m × 10 m, one
  // outlet at (10, 0), base at x 8..12, y 4..6 across the fall line x = 10. Water is held at
  // (10, 6); the cricket runs from there 1.6 m up the fall at crest level 0.19 m (worked in
  // tests/unit/engine/plans-openings.test.ts). With it built, its faces fall at 1:100 from
  // 0.19 m at (10, 6) to the corners (8, 6) and (12, 6), where the deck is 0.17 m: 0.19 - 2/100
  // = 0.17, so water on the base's high side runs to the corners and round.
  const spec = {
    outline: [
      [0, 0],
      [20, 0],
      [20, 10],
      [0, 10],
    ] as Point[],
    outlets: [{ at: [10, 0] as Point }],
    baseFall: "1:40",
    openings: [
      {
        outline: [
          [8, 4],
          [12, 4],
          [12, 6],
          [8, 6],
        ] as Point[],
        kind: "plant" as const,
      },
    ],
    probes: [[10, 7] as Point],
  };
  const before = analyseSpec(spec, { mesh: false, traces: false });
  const held = before.warnings.find((w) => w.code === "water-held-behind-upstand")!;
  const after = analyseSpec(
    { ...spec, ridges: [{ line: held.cricket!.line, kind: "cricket" }] },
    { mesh: true, traces: false },
  );

  it("no longer reports water held behind the upstand, and leaves no pit there", () => {
    expect(held.cricket).toBeDefined();
    expect(after.warnings.filter((w) => w.code === "water-held-behind-upstand")).toEqual([]);
    const pondedBefore = before.shaped.ponding.reduce((s, p) => s + p.area, 0);
    const pondedAfter = after.shaped.ponding.reduce((s, p) => s + p.area, 0);
    expect(pondedAfter).toBeLessThan(pondedBefore);
    // Everything that drained to the pit now reaches the outlet: 200 - 8 = 192 m².
    close(after.shaped.catchments[0].area + pondedAfter, 192, 1e-6);
  });

  it("builds it on the deck: the crest stands at 0.19 m, the joists and probes keep the deck's levels", () => {
    const m = after.shaped.mesh!;
    let crest = -Infinity;
    for (let i = 0; i < m.positions.length; i += 3) {
      const [x, y, zz] = [m.positions[i], m.positions[i + 1], m.positions[i + 2]];
      if (Math.abs(x - 10) < 1e-6 && Math.abs(y - 6) < 1e-6) crest = Math.max(crest, zz);
    }
    close(crest, 0.19, 1e-9);
    // Probe (10, 7) is the deck: (1 - 0.7)·0.25·0 + 0.7·0.25 = 0.175.
    close(after.shaped.probes[0].level, 0.175);
    expect(after.shaped.joists.map((j) => j.spans)).toEqual(before.shaped.joists.map((j) => j.spans));
    expect(after.shaped.ridges).toEqual([{ index: 0, kind: "cricket", line: held.cricket!.line }]);
  });
});
