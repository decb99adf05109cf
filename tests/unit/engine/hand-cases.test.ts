import { describe, expect, it } from "vitest";
import { analyseSpec, close, RECT_20_10 } from "./helpers";

/*
 * Exact cases worked by hand from docs/roof-method.md. Common to all: a 20 m × 10 m rectangle,
 * outlets on the bottom edge (y = 0), base fall 1:40, joists 0.4 m apart along y (the inward
 * normal of the outlet edge), gutter defaults of the common-practice set: width 0.3 m,
 * depth 0.05 m, sole fall 1:100.
 */

const joistAt = (a: ReturnType<typeof analyseSpec>, x: number) => {
  const j = a.shaped.joists.find((k) => Math.abs(k.spans[0].start[0] - x) < 1e-9);
  if (!j) throw new Error(`no joist at x = ${x}`);
  return j;
};

describe("rectangle with one outlet mid-way along the long edge", () => {
  // Outlet at (10, 0), L = 10 m from the outlet to each corner, depth D = 10 m.
  const a = analyseSpec(
    {
      outline: RECT_20_10,
      outlets: [{ at: [10, 0] }],
      baseFall: "1:40",
      rainfall: { intensity: 75 },
      probes: [
        [12, 4],
        [5, 5],
        [10, 0],
        [0, 0],
        [20, 5],
        [10, 5],
      ],
    },
    { mesh: true, traces: false },
  );

  it("derives H from the joist through the outlet: 10 m at 1:40 = 0.25 m (§3)", () => {
    close(a.shaped.highLevel, 0.25);
    expect(a.shaped.highLevelSource).toBe("derived");
    expect(a.shaped.joistDirection).toEqual([0, 1]);
  });

  it("rises from the outlet to H at both corners: 10 m over 0.25 m = 1:40 each (§2)", () => {
    expect(a.shaped.edgeFalls).toHaveLength(2);
    for (const f of a.shaped.edgeFalls) {
      expect(f.edge).toBe(0);
      expect(f.from).toEqual([10, 0]);
      close(f.ratio, 40);
    }
    expect(a.shaped.edgeFalls.map((f) => f.to[0]).sort((x, y) => x - y)).toEqual([0, 20]);
  });

  it("probes follow z = (1 - v)·H·|x - xo|/L + v·H (§4)", () => {
    const level = (i: number) => a.shaped.probes[i].level;
    close(level(0), 0.6 * 0.25 * (2 / 10) + 0.4 * 0.25); // (12, 4): v = 0.4 → 0.03 + 0.10 = 0.13
    close(level(1), 0.5 * 0.25 * (5 / 10) + 0.5 * 0.25); // (5, 5): 0.0625 + 0.125 = 0.1875
    close(level(2), 0); // the outlet
    close(level(3), 0.25); // a corner at H
    close(level(4), 0.25); // (20, 5) on the end parapet, level at H
    close(level(5), 0.125); // (10, 5): half-way up the joist through the outlet
  });

  it("drop schedule: 51 joists; the joist at x = 4 runs 0.15 → 0.25, drops 0.10 and 0, falls 1:100 (§5)", () => {
    expect(a.shaped.joists).toHaveLength(51); // 0, 0.4, ..., 20
    const j = joistAt(a, 4);
    expect(j.spans).toHaveLength(1);
    const s = j.spans[0];
    close(s.length, 10);
    close(s.startLevel, 0.25 * (6 / 10)); // bottom edge at x = 4: H·|4 − 10|/10
    close(s.endLevel, 0.25);
    close(s.startDrop, 0.1);
    close(s.endDrop, 0);
    close(s.ratio, 10 / 0.1);
    const through = joistAt(a, 10).spans[0];
    close(through.startLevel, 0);
    close(through.ratio, 40);
    expect(joistAt(a, 0).spans[0].ratio).toBeNull(); // along the end parapet, level at H
  });

  it("longest fall line runs from a far corner to the outlet: √(10² + 10²) = 14.142 m over 0.25 m = 1:56.6 (§7)", () => {
    const l = a.shaped.longestFallLine!;
    close(l.length, Math.SQRT2 * 10);
    close(l.drop, 0.25);
    close(l.ratio, (Math.SQRT2 * 10) / 0.25);
    expect(l.to).toEqual([10, 0]);
    expect([0, 20]).toContain(l.from[0]);
    expect(l.from[1]).toBe(10);
    close(a.shaped.worstFallRatio, 56.568542494923804);
  });

  it("all 200 m² drain to the one outlet: Q = 75 × 200 / 3600 = 4.167 L/s", () => {
    expect(a.shaped.catchments).toHaveLength(1);
    close(a.shaped.catchments[0].area, 200, 1e-6);
    close(a.shaped.catchments[0].flow, (75 * 200) / 3600, 1e-6);
    expect(a.shaped.ponding).toEqual([]);
  });

  it("gutter layout: sole 10 m at 1:100 = 0.10, lip 0.15, field 9.7 m at 1:40 → H = 0.3925 (§8)", () => {
    expect(a.gutter.comparable).toBe(true);
    close(a.gutter.lipLevel, 0.15);
    close(a.gutter.highLevel, 0.15 + 9.7 / 40);
    close(a.gutter.gutterLength, 20);
    close(a.gutter.soleArea, 20 * 0.3);
    // What the gutter adds: 2 × 20 m (the sole-to-side corner and the lip; the sole-to-parapet
    // corner is shared with the shaped roof) + 2 ends × (0.3 m sole + 0.05 m side)
    close(a.gutter.detailLength, 40 + 2 * (0.3 + 0.05));
    close(a.comparison.heightSaved, 0.3925 - 0.25);
    close(a.openEdge.highLevel, 10 / 40);
  });

  it("advice: fall lines reach 1:100 when H = 14.142/100, i.e. base fall 10/0.14142 = 1:70.7 (§7)", () => {
    close(a.advice.minimumBaseFall!.ratio, 10 / ((Math.SQRT2 * 10) / 100), 1e-6);
  });

  it("mesh covers exactly 200 m²", () => {
    const m = a.shaped.mesh!;
    let total = 0;
    for (let f = 0; f < m.indices.length; f += 3) {
      const [p, q, r] = [m.indices[f], m.indices[f + 1], m.indices[f + 2]].map((i) => 3 * i);
      total +=
        ((m.positions[q] - m.positions[p]) * (m.positions[r + 1] - m.positions[p + 1]) -
          (m.positions[q + 1] - m.positions[p + 1]) * (m.positions[r] - m.positions[p])) /
        2;
    }
    close(total, 200, 1e-6);
    close(
      a.shaped.fallMap.areaByBand.reduce((s, b) => s + b.area, 0),
      200,
      1e-6,
    );
  });
});

describe("rectangle with an off-centre outlet at (5, 0)", () => {
  const a = analyseSpec({ outline: RECT_20_10, outlets: [{ at: [5, 0] }], baseFall: "1:40", probes: [[12, 4]] });

  it("H = 0.25; edge pieces 5 m and 15 m over 0.25 m: 1:20 and 1:60", () => {
    close(a.shaped.highLevel, 0.25);
    const ratios = a.shaped.edgeFalls.map((f) => f.ratio).sort((x, y) => x - y);
    close(ratios[0], 20);
    close(ratios[1], 60);
  });

  it("probe (12, 4): 0.6 × 0.25 × 7/15 + 0.4 × 0.25 = 0.17", () => {
    close(a.shaped.probes[0].level, 0.6 * 0.25 * (7 / 15) + 0.1);
  });

  it("joist at x = 12 starts at 0.25 × 7/15 and falls 10 m over 0.1333 m = 1:75", () => {
    const s = joistAt(a, 12).spans[0];
    close(s.startLevel, 0.25 * (7 / 15));
    close(s.ratio, 75);
  });

  it("longest fall line from (20, 10): √(15² + 10²) = 18.028 m → 1:72.1", () => {
    const l = a.shaped.longestFallLine!;
    expect(l.from).toEqual([20, 10]);
    close(l.length, Math.sqrt(325));
    close(l.ratio, Math.sqrt(325) / 0.25);
  });

  it("gutter: the 15 m side rises 0.15, lip 0.20, H = 0.20 + 9.7/40 = 0.4425", () => {
    close(a.gutter.lipLevel, 0.2);
    close(a.gutter.highLevel, 0.2 + 9.7 / 40);
  });

  it("advice: 18.028/100 = 0.18028 m needed → base fall 10/0.18028 = 1:55.5", () => {
    close(a.advice.minimumBaseFall!.ratio, 10 / (Math.sqrt(325) / 100), 1e-6);
  });

  it("advice: one more outlet on the long side brings the worst fall line from 1:72.1 to 1:44.7", () => {
    // Candidates sit at (k + 0.5)/12 of the edge. The first one within √125 = 11.18 m of (20, 10)
    // is x = 15.83 (√(4.17² + 10²) = 10.83 m); then (0, 10) → (5, 0), 11.18 m over 0.25, governs.
    const extra = a.advice.extraOutlet!;
    close(extra.at[0], (9.5 / 12) * 20, 1e-9);
    close(extra.at[1], 0, 1e-9);
    close(extra.currentLongestFallRatio, Math.sqrt(325) / 0.25, 1e-9);
    close(extra.longestFallRatio, Math.sqrt(125) / 0.25, 1e-9);
  });
});

describe("two outlets on one edge, at (5, 0) and (15, 0)", () => {
  const a = analyseSpec({
    outline: RECT_20_10,
    outlets: [{ at: [5, 0] }, { at: [15, 0] }],
    baseFall: "1:40",
    rainfall: { intensity: 100 },
    probes: [
      [10, 5],
      [5, 5],
      [7.5, 2],
    ],
  });

  it("edge rises to H at the corners and half-way (x = 10): four pieces of 5 m over 0.25 m = 1:20", () => {
    close(a.shaped.highLevel, 0.25);
    expect(a.shaped.edgeFalls).toHaveLength(4);
    for (const f of a.shaped.edgeFalls) close(f.ratio, 20);
    expect(a.shaped.edgeFalls.filter((f) => f.to[0] === 10)).toHaveLength(2);
  });

  it("probes: the chord at x = 10 is level at H; (7.5, 2) = 0.125 + 0.125 × 0.2 = 0.15", () => {
    close(a.shaped.probes[0].level, 0.25);
    close(a.shaped.probes[1].level, 0.125);
    close(a.shaped.probes[2].level, 0.15);
  });

  it("longest fall line √(5² + 10²) = 11.18 m → 1:44.7; the half-way point is only 5 m from an outlet", () => {
    close(a.shaped.longestFallLine!.length, Math.sqrt(125));
    close(a.shaped.worstFallRatio, Math.sqrt(125) / 0.25);
    const mid = a.shaped.fallLines.find((l) => l.from[0] === 10 && l.from[1] === 0)!;
    close(mid.length, 5);
  });

  it("catchments split at the ridge x = 10: 100 m² each (to one mesh cell), 100 × 100/3600 = 2.78 L/s", () => {
    expect(a.shaped.catchments).toHaveLength(2);
    for (const c of a.shaped.catchments) {
      close(c.area, 100, 0.4 * 0.4);
      close(c.flow, (100 * c.area) / 3600, 1e-9);
    }
    close(a.shaped.catchments[0].area + a.shaped.catchments[1].area, 200, 1e-6);
  });

  it("gutter: 5 m pieces rise 0.05, lip 0.10, H = 0.10 + 9.7/40 = 0.3425", () => {
    close(a.gutter.lipLevel, 0.1);
    close(a.gutter.highLevel, 0.1 + 9.7 / 40);
  });
});

describe("corner outlet at (0, 0)", () => {
  const a = analyseSpec({
    outline: RECT_20_10,
    outlets: [{ at: [0, 0] }],
    baseFall: "1:40",
    probes: [
      [10, 5],
      [0, 5],
    ],
  });

  it("joists run the short way (normal of the 20 m edge); the span is the 10 m end wall: H = 0.25", () => {
    expect(a.shaped.joistDirection).toEqual([0, 1]);
    close(a.shaped.highLevel, 0.25);
  });

  it("both edges at the corner rise from it: 20 m → 1:80 and 10 m → 1:40", () => {
    const byEdge = Object.fromEntries(a.shaped.edgeFalls.map((f) => [f.edge, f.ratio]));
    close(byEdge[0], 80);
    close(byEdge[3], 40);
  });

  it("probe (10, 5): bottom edge 0.125, chord halfway to 0.25 → 0.1875; (0, 5) on the end wall 0.125", () => {
    close(a.shaped.probes[0].level, 0.1875);
    close(a.shaped.probes[1].level, 0.125);
  });

  it("joist at x = 10 runs 0.125 → 0.25: 10 m over 0.125 m = 1:80", () => {
    const s = joistAt(a, 10).spans[0];
    close(s.startLevel, 0.125);
    close(s.ratio, 80);
  });

  it("longest fall line from the far corner: √(20² + 10²) = 22.36 m → 1:89.4", () => {
    const l = a.shaped.longestFallLine!;
    expect(l.from).toEqual([20, 10]);
    close(l.length, Math.sqrt(500));
    close(l.ratio, Math.sqrt(500) / 0.25);
  });

  it("gutter along the 20 m edge: sole 20 m at 1:100 = 0.20, lip 0.25, H = 0.25 + 9.7/40 = 0.4925", () => {
    close(a.gutter.lipLevel, 0.25);
    close(a.gutter.highLevel, 0.4925);
  });
});

describe("open edge: eaves along the bottom, no outlets", () => {
  const a = analyseSpec({
    outline: RECT_20_10,
    edges: ["eaves", "parapet", "parapet", "parapet"],
    outlets: [],
    baseFall: "1:40",
    probes: [
      [3, 4],
      [7, 10],
      [20, 2.5],
    ],
  });

  it("is one plane z = H·y/10 with H = 10/40 = 0.25", () => {
    close(a.shaped.highLevel, 0.25);
    close(a.shaped.probes[0].level, 0.1);
    close(a.shaped.probes[1].level, 0.25);
    close(a.shaped.probes[2].level, 0.0625); // side parapet rises linearly from the eaves
    expect(a.shaped.edgeFalls).toEqual([]);
    for (const j of a.shaped.joists) {
      close(j.spans[0].startLevel, 0);
      close(j.spans[0].ratio, 40);
    }
  });

  it("longest fall line 10 m straight to the eaves at 1:40; all 200 m² drain to the eaves", () => {
    close(a.shaped.longestFallLine!.length, 10);
    close(a.shaped.longestFallLine!.ratio, 40);
    expect(a.shaped.catchments.map((c) => c.drain)).toEqual(["eaves-0"]);
    close(a.shaped.catchments[0].area, 200, 1e-6);
  });

  it("fall map: every face of the plane falls at 1:40, so all 200 m² sit in the first band", () => {
    const bands = a.shaped.fallMap.areaByBand;
    expect(bands.map((b) => b.label)).toEqual([
      "steeper than 1:40",
      "1:40-1:60",
      "1:60-1:80",
      "1:80-1:100",
      "flatter than 1:100",
    ]);
    close(bands[0].area, 200, 1e-6);
    close(a.shaped.fallMap.flatterThanMinimumArea, 0, 1e-9);
  });

  it.each([
    // A face exactly on a band edge counts with the steeper band: 1:80 is in "1:60-1:80".
    ["1:80", 2, 0],
    // Flatter than the 1:100 minimum: the last band, and all of it flatter than the minimum.
    ["1:120", 4, 200],
  ] as const)("fall map of a %s plane: all 200 m² in band %i", (fall, band, flatter) => {
    const p = analyseSpec({
      outline: RECT_20_10,
      edges: ["eaves", "parapet", "parapet", "parapet"],
      outlets: [],
      baseFall: fall,
    });
    p.shaped.fallMap.areaByBand.forEach((b, i) => close(b.area, i === band ? 200 : 0, 1e-6));
    close(p.shaped.fallMap.flatterThanMinimumArea, flatter, 1e-6);
  });

  it("has no gutter to compare and the same high level as the open-edge option", () => {
    expect(a.gutter.comparable).toBe(false);
    expect(a.gutter.reason).toMatch(/no outlets/i);
    close(a.openEdge.highLevel, 0.25);
  });
});

describe("L-shape: the fall line bends round the re-entrant corner", () => {
  // L: 10 × 4 strip along the bottom and a 4 × 6 arm up the left; outlet at (9, 0).
  // The joist through the outlet spans 4 m → H = 4/40 = 0.1.
  const a = analyseSpec({
    outline: [
      [0, 0],
      [10, 0],
      [10, 4],
      [4, 4],
      [4, 10],
      [0, 10],
    ],
    outlets: [{ at: [9, 0] }],
    baseFall: "1:40",
  });

  it("longest path from (0, 10) goes via (4, 4): √(4² + 6²) + √(5² + 4²) = 13.614 m", () => {
    const l = a.shaped.longestFallLine!;
    expect(l.from).toEqual([0, 10]);
    close(a.shaped.highLevel, 0.1);
    close(l.length, Math.sqrt(52) + Math.sqrt(41));
    expect(l.path).toEqual([
      [0, 10],
      [4, 4],
      [9, 0],
    ]);
    close(l.ratio, (Math.sqrt(52) + Math.sqrt(41)) / 0.1);
    expect(a.warnings.some((w) => w.code === "fall-line-too-flat")).toBe(true);
  });

  it("warns of the twist at the line x = 4: chord 0.0556 → 0.1 over 10 m meets the arm's parapet at H", () => {
    // Bottom edge at x = 4: 0.1 × 5/9. Just left of x = 4 the chord runs to y = 10, so at y = 4
    // it is 0.0556 + 0.0444 × 0.4 = 0.0733, while just right of it the chord ends at (4, 4) at H.
    const twist = a.warnings.find((w) => w.code === "twist")!;
    expect(twist).toBeDefined();
    close(twist.size!, 0.1 - ((0.1 * 5) / 9 + (0.1 - (0.1 * 5) / 9) * 0.4), 1e-9);
    close(twist.at![0], 4);
    close(twist.at![1], 4, 1e-6);
  });
});

describe("outlets facing each other across the joists", () => {
  // Outlets at (10, 0) and (10, 10): the joist between them has both ends at 0, so it lies level.
  const a = analyseSpec({ outline: RECT_20_10, outlets: [{ at: [10, 0] }, { at: [10, 10] }], baseFall: "1:40" });

  it("warns that a joist lies level between two drains", () => {
    const w = a.warnings.find((x) => x.code === "level-joist")!;
    expect(w).toBeDefined();
    expect(w.at).toEqual([10, 5]);
    const s = joistAt(a, 10).spans[0];
    expect(s.ratio).toBeNull();
    close(s.startDrop, 0.25);
  });
});
