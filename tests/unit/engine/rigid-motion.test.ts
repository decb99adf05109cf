import { describe, expect, it } from "vitest";
import type { Analysis, Point, RoofSpec } from "~/engine";
import { analyseSpec, close } from "./helpers";

/*
 * Roofs the rigid-motion property (invariants.test.ts) once found changing under a move, kept as
 * examples with their shortest paths worked by hand. A turn by θ and a shift by (tx, ty) maps
 * p = (x, y) to (x cos θ − y sin θ + tx, x sin θ + y cos θ + ty); distances are unchanged because
 * the rotation matrix R has RᵀR = I, so |Rp − Rq| = |p − q|. Every length below is therefore the
 * same before and after the move, and the engine must say so. The straight-line lengths are
 * Euclidean distances, √(Δx² + Δy²) (Pythagoras, Euclid's Elements I.47).
 */

/** Where the move puts plan point p. */
function place(p: Point, angle: number, tx: number, ty: number): Point {
  const c = Math.cos(angle);
  const s = Math.sin(angle);
  return [c * p[0] - s * p[1] + tx, s * p[0] + c * p[1] + ty];
}

function moved(spec: RoofSpec, angle: number, tx: number, ty: number): RoofSpec {
  const at = (p: Point) => place(p, angle, tx, ty);
  const out: RoofSpec = {
    ...structuredClone(spec),
    outline: spec.outline.map(at),
    outlets: spec.outlets.map((o) => ({ ...o, at: at(o.at) })),
  };
  if (spec.openings) out.openings = spec.openings.map((o) => ({ ...o, outline: o.outline.map(at) }));
  // A direction turns but does not shift.
  if (spec.joists?.direction) out.joists = { ...spec.joists, direction: place(spec.joists.direction, angle, 0, 0) };
  return out;
}

/** The fall line starting at plan point p (within 1 mm). */
function lineFrom(a: Analysis, p: Point) {
  const line = a.shaped.fallLines.find((l) => Math.hypot(l.from[0] - p[0], l.from[1] - p[1]) < 1e-3);
  expect(line, `a fall line from (${p})`).toBeDefined();
  return line!;
}

const MOVES: [string, number, number, number][] = [
  ["as given", 0, 0, 0],
  ["turned by 1e-16 rad (rounding only)", -9.251858538542973e-17, 0, 0],
  ["turned 30° and shifted", Math.PI / 6, 120, -45],
  ["turned 90° (plus rounding) and shifted", Math.PI / 2 + 1e-12, -300, 210],
];

describe("an outlet on an edge that runs along the joists (collinear with its joist line)", () => {
  // L-shape; outlet 1 at the corner (6, 1.5), whose longer edge (6, 1.5)→(1.5, 1.5) sets the
  // joists along y; outlet 2 at (0, 5.7) on the edge x = 0, which is itself a joist line.
  const spec: RoofSpec = {
    outline: [
      [0, 0],
      [6, 0],
      [6, 1.5],
      [1.5, 1.5],
      [1.5, 6],
      [0, 6],
    ],
    outlets: [{ at: [6, 1.5] }, { at: [0, 5.7] }],
    baseFall: "1:40",
  };

  for (const [name, angle, tx, ty] of MOVES) {
    it(`${name}: H = 5.7 / 40 from outlet 2's span along its own edge; fall lines 5.7 m and √(1.5² + 0.3²) m`, () => {
      const a = analyseSpec(moved(spec, angle, tx, ty));
      // The joist line through (0, 5.7) is the edge x = 0, from y = 0 to y = 6: the span from the
      // outlet to its far end is 5.7 m (the near end is 0.3 m). Outlet 1's chord is x = 6 from
      // y = 0 to 1.5: 1.5 m. H = max(5.7, 1.5) / 40 = 0.1425 m (docs/roof-method.md §3).
      close(a.shaped.highLevel, 5.7 / 40, 1e-9);
      // From the corner (0, 0) straight up the edge to (0, 5.7): 5.7 m, the longest.
      close(a.shaped.longestFallLine?.length, 5.7, 1e-9);
      close(lineFrom(a, place([0, 0], angle, tx, ty)).length, 5.7, 1e-9);
      // From the corner (1.5, 6) to (0, 5.7): run 1.5 m across, 0.3 m along: √(2.25 + 0.09) = 1.52971 m.
      const l = lineFrom(a, place([1.5, 6], angle, tx, ty));
      close(l.length, Math.sqrt(1.5 ** 2 + 0.3 ** 2), 1e-9);
      expect(l.drain).toBe("outlet-1");
      close(a.shaped.worstFallRatio, 5.7 / (5.7 / 40), 1e-7);
    });
  }
});

describe("a start on a water divide takes the nearest drain its neighbourhood reaches, whatever the rounding", () => {
  // A convex octagon whose east corner (4, 0) sits where two catchments meet: which way one mesh
  // cell's diagonal runs used to decide its drain. Shifting the spec by (0, −4) flipped it.
  const octagon: RoofSpec = {
    outline: [
      [4, 0],
      [2.3585157509026087, 13.4319827563362],
      [-0.9251714084011607, 16.179497161977352],
      [-3.3276170309186823, 9.228553280860044],
      [-3.9918540568287395, -1.0608118200132939],
      [-3.098915858753752, -10.515322031047559],
      [-0.8571030183167765, -16.24417353462091],
      [2.1270335522993453, -14.084259491756674],
    ],
    outlets: [
      { at: [-3.94720714692499, -1.533537330565007] },
      { at: [2.3585157509026087, 13.4319827563362] },
      { at: [-3.098915858753752, -10.515322031047559] },
    ],
    baseFall: "1:40",
  };
  // A skew-joisted quadrilateral with an eaves edge, mostly flat near its top corner, where a
  // steepest-descent tie between two cells used to go either way. Shifting by (−7.97, 0) flipped it.
  const quad: RoofSpec = {
    outline: [
      [4, 0],
      [-1.218701726372152, 4.2841479047797],
      [-3.5720289325385064, -2.024290198752728],
      [1.5365175522300334, -4.1529099263311675],
    ],
    edges: ["parapet", "parapet", "parapet", "eaves"],
    outlets: [{ at: [-3.5720289325385064, -2.024290198752728] }, { at: [3.7390649136813923, 0.21420739523898502] }],
    baseFall: "1:40",
    joists: { direction: [1, 0.3], spacing: 0.5 },
  };

  for (const [name, angle, tx, ty] of [
    ...MOVES,
    ["shifted by (0, −4)", 0, 0, -4.000000000179745] as const,
    ["shifted by (−7.97, 0)", 0, -7.968505996573179, 0] as const,
  ]) {
    it(`${name}: the octagon's corner (4, 0) drains to outlet 1 at |(7.9472, 1.5335)| = 8.0938 m`, () => {
      const a = analyseSpec(moved(octagon, angle, tx, ty));
      const l = lineFrom(a, place([4, 0], angle, tx, ty));
      // The outline is convex, so the shortest path is the straight line:
      // √((4 + 3.947207)² + (0 + 1.533537)²) = √(63.15810 + 2.35174) = 8.093815 m.
      close(l.length, Math.hypot(4 + 3.94720714692499, 1.533537330565007), 1e-9);
      expect(l.drain).toBe("outlet-0");
      close(a.shaped.longestFallLine?.length, Math.hypot(4 + 3.94720714692499, 1.533537330565007), 1e-9);
    });

    it(`${name}: the quadrilateral's corner (−1.2187, 4.2841) drains to outlet 2, a straight 6.4143 m away`, () => {
      const a = analyseSpec(moved(quad, angle, tx, ty));
      const l = lineFrom(a, place(quad.outline[1], angle, tx, ty));
      // Convex again: √((3.739065 + 1.218702)² + (0.214207 − 4.284148)²) = √(24.57944 + 16.56442) = 6.414348 m.
      close(l.length, Math.hypot(3.7390649136813923 + 1.218701726372152, 0.21420739523898502 - 4.2841479047797), 1e-9);
      expect(l.drain).toBe("outlet-1");
    });
  }
});

describe("an opening right in front of an outlet (docs/roof-method-plans.md P2, P3)", () => {
  // Rectangle 10 m × 8 m, outlet at (5, 0) in the middle of the south wall, base fall 1:40; the
  // joists run along y, toward the outlet's wall. A 1 m rooflight sits on the outlet's joist line,
  // from (4.5, 0.5) to (5.5, 1.5). Its west and east sides run along the joists: each must stay
  // one mesh line after a move. (Before they were made exactly one, a turn of 1e-16 rad split
  // each into two lines a rounding apart, and the held water's catchment went from 56.7 m² to
  // 5.8 m².)
  const spec: RoofSpec = {
    outline: [
      [0, 0],
      [10, 0],
      [10, 8],
      [0, 8],
    ],
    outlets: [{ at: [5, 0] }],
    baseFall: "1:40",
    openings: [
      {
        outline: [
          [4.5, 0.5],
          [5.5, 0.5],
          [5.5, 1.5],
          [4.5, 1.5],
        ],
      },
    ],
  };
  const given = analyseSpec(spec);
  const heldArea = (a: Analysis) => a.warnings.find((w) => w.code === "water-held-behind-upstand")?.area ?? 0;

  for (const [name, angle, tx, ty] of [...MOVES, ["shifted by (100, 50)", 0, 100, 50] as const]) {
    it(`${name}: water is held at (5, 1.5), 37.5 mm up, draining the same area`, () => {
      const a = analyseSpec(moved(spec, angle, tx, ty));
      // H: the outlet's joist spans the 8 m from the outlet to the north wall, 8/40 = 0.2 m (§3).
      close(a.shaped.highLevel, 0.2, 1e-9);
      // On that joist line the chord rises from the outlet at 0 to H at y = 8, so the upstand's
      // high side, y = 1.5, is lowest where the line meets it: 0.2 × 1.5 / 8 = 0.0375 m (P3).
      const held = a.warnings.find((w) => w.code === "water-held-behind-upstand");
      expect(held, "water held behind the upstand").toBeDefined();
      const at = place([5, 1.5], angle, tx, ty);
      close(held!.at![0], at[0], 1e-6);
      close(held!.at![1], at[1], 1e-6);
      expect(a.shaped.ponding).toHaveLength(1);
      close(a.shaped.ponding[0].level, 0.0375, 1e-9);
      // The held area is found on the mesh (to within its cells): the same under every move, up to
      // a few cells (0.4 m × 0.4 m each); a rounding-only move changes nothing.
      const tolerance = angle === 0 || Math.abs(angle) < 1e-15 ? 1e-6 : 0.5;
      expect(Math.abs(heldArea(a) - heldArea(given))).toBeLessThanOrEqual(tolerance);
      // Everything else reaches the outlet: 80 − 1 (the opening) − held.
      const outlet = a.shaped.catchments.find((c) => c.drain === "outlet-0")!;
      close(outlet.area + heldArea(a), 79, 1e-6);
    });
  }
});
