import { describe, expect, it } from "vitest";
import type { Analysis } from "~/engine";
import { analyseSpec, close } from "./helpers";

/*
 * An outlet on a wall that the joists run along (docs/roof-method-plans.md P6, P7), worked by
 * hand from docs/roof-method.md §2-§5.
 *
 * Square 10 m × 10 m, outlets at (5, 0) (outlet 1, bottom wall) and (0, 5) (outlet 2, left wall),
 * base fall 1:40, default joists: the inward normal of the first outlet's wall, (0, 1), so the
 * joists run along y at x = 0, 0.4, ..., 10 and the left wall x = 0 lies along them.
 * H: the joist through outlet 1 spans y = 0..10, 10 m at 1:40 = 0.25 m; outlet 2's joist is the
 * wall itself, 5 m from it to either end, 0.125 m: H = 0.25 m.
 * Left wall (§2): corner (0, 0) at H, outlet 2 at 0, corner (0, 10) at H: it falls 0.25 m over
 * 5 m each way, 1:20.
 * Bottom wall: outlet 1 at x = 5, H at both corners, so at x = 0.4 it stands at
 * 0.25 × (5 - 0.4)/5 = 0.23 m; the top wall is at H.
 * Joist 2 (x = 0.4) runs 0.23 → 0.25 m, so at y = 5 it stands at 0.24 m: beside outlet 2 the deck
 * drops 0.24 m within 0.4 m (1:1.7) while no joist ends on outlet 2's wall.
 * The joist on the left wall must follow the wall: (0,0) → (0,5) 0.25 → 0 m, 1:20, and
 * (0,5) → (0,10) 0 → 0.25 m, 1:20. Before the fix the schedule listed it as one level span,
 * 0.25 → 0.25 m, while the surface shown along it fell to 0 at the outlet.
 */
const SQUARE: [number, number][] = [
  [0, 0],
  [10, 0],
  [10, 10],
  [0, 10],
];

function scheduleAgreesWithSurface(spec: Parameters<typeof analyseSpec>[0]) {
  // Probes at both ends and three inner points of every span: the surface the roof shows.
  const first = analyseSpec(spec);
  const points: [number, number][] = [];
  const expected: number[] = [];
  for (const j of first.shaped.joists) {
    for (const s of j.spans) {
      for (const f of [0, 0.25, 0.5, 0.75, 1]) {
        points.push([s.start[0] + f * (s.end[0] - s.start[0]), s.start[1] + f * (s.end[1] - s.start[1])]);
        expected.push(s.startLevel + f * (s.endLevel - s.startLevel));
      }
    }
  }
  const probed = analyseSpec({ ...(spec as object), probes: points.slice(0, 1000) });
  probed.shaped.probes.forEach((p, i) => close(p.level, expected[i], 1e-9));
  return first;
}

describe("square with an outlet on a wall the joists run along", () => {
  const spec = {
    outline: SQUARE,
    outlets: [{ at: [5, 0] }, { at: [0, 5] }],
    baseFall: "1:40",
    probes: [
      [0, 5],
      [0.4, 5],
    ],
  };
  const a: Analysis = analyseSpec(spec, { mesh: true, traces: false });

  it("shapes the roof as worked above", () => {
    expect(a.shaped.joistDirection).toEqual([0, 1]);
    close(a.shaped.highLevel, 0.25);
    close(a.shaped.probes[0].level, 0);
    close(a.shaped.probes[1].level, 0.24);
  });

  it("lists the joist on the left wall with the wall's levels: 0.25 → 0 → 0.25 m at 1:20", () => {
    const wall = a.shaped.joists[0];
    expect(wall.offset).toBe(0);
    expect(wall.spans).toHaveLength(2);
    const [down, up] = wall.spans;
    expect(down.start).toEqual([0, 0]);
    expect(down.end).toEqual([0, 5]);
    close(down.startLevel, 0.25);
    close(down.endLevel, 0);
    close(down.endDrop, 0.25);
    close(down.ratio, 20);
    expect(up.start).toEqual([0, 5]);
    expect(up.end).toEqual([0, 10]);
    close(up.startLevel, 0);
    close(up.endLevel, 0.25);
    close(up.ratio, 20);
  });

  it("lists the next joist as worked: 0.23 → 0.25 m over 10 m, 1:500", () => {
    const next = a.shaped.joists[1];
    expect(next.spans).toHaveLength(1);
    close(next.spans[0].startLevel, 0.23);
    close(next.spans[0].endLevel, 0.25);
    close(next.spans[0].ratio, 500, 1e-6);
  });

  it("warns that outlet 2 is parallel to the joists, with the area it drains and the fixes", () => {
    const w = a.warnings.filter((x) => x.code === "outlet-parallel-to-joists");
    expect(w).toHaveLength(1);
    expect(w[0].outlet).toBe(1);
    const drained = a.shaped.catchments.find((c) => c.drain === "outlet-1")!.area;
    close(w[0].drainedArea, drained);
    // It drains the strip between the wall and the first joists beside it: a few m² of 100.
    expect(drained).toBeGreaterThan(0);
    expect(drained).toBeLessThan(10);
    expect(w[0].at).toEqual([0, 5]);
    expect(w[0].fixes?.map((f) => f.kind)).toEqual(["turn-joists", "move-outlet", "divide-roof"]);
    // Turning the joists: the inward normal of the left wall, +x.
    expect(w[0].fixes?.[0]).toEqual({ kind: "turn-joists", direction: [1, 0] });
  });

  it("the schedule agrees with the surface along every joist", () => {
    scheduleAgreesWithSurface(spec);
  });

  it("with the joists turned toward the left wall, outlet 1 is the one flagged", () => {
    const turned = analyseSpec({ ...spec, joists: { direction: [1, 0] } });
    const w = turned.warnings.filter((x) => x.code === "outlet-parallel-to-joists");
    expect(w.map((x) => x.outlet)).toEqual([0]);
    // The bottom wall is now a joist: it follows the wall down to outlet 1 and up again.
    const bottom = turned.shaped.joists.find((j) => j.spans.some((s) => s.start[1] === 0 && s.end[1] === 0));
    expect(bottom?.spans.map((s) => [s.startLevel, s.endLevel])).toEqual([
      [turned.shaped.highLevel, 0],
      [0, turned.shaped.highLevel],
    ]);
  });

  it("a roof whose outlets all sit on walls the joists end on has no such warning", () => {
    const plain = analyseSpec({ outline: SQUARE, outlets: [{ at: [5, 0] }, { at: [5, 10] }], baseFall: "1:40" });
    expect(plain.warnings.some((x) => x.code === "outlet-parallel-to-joists")).toBe(false);
  });

  it("crowded outlets on a wall across the joists are not this fault", () => {
    const crowded = analyseSpec({
      outline: SQUARE,
      outlets: [{ at: [5, 0] }, { at: [5.3, 0] }, { at: [5.6, 0] }],
      baseFall: "1:40",
    });
    expect(crowded.warnings.some((x) => x.code === "outlet-parallel-to-joists")).toBe(false);
  });
});

describe("a joist along an inner wall of an L-shape", () => {
  // L-shape, the notch at the top right; an outlet on the inner wall x = 6 (it runs along the
  // joists, which run along y from the bottom wall's outlet). The joist at x = 6 lies on that
  // wall from (6, 4) to (6, 10): its schedule must follow the wall down to the outlet at (6, 7).
  const spec = {
    outline: [
      [0, 0],
      [10, 0],
      [10, 4],
      [6, 4],
      [6, 10],
      [0, 10],
    ] as [number, number][],
    outlets: [{ at: [3, 0] }, { at: [6, 7] }],
    baseFall: "1:40",
  };
  it("agrees with the surface along every joist, and flags the outlet on the inner wall", () => {
    const a = scheduleAgreesWithSurface(spec);
    expect(a.warnings.filter((w) => w.code === "outlet-parallel-to-joists").map((w) => w.outlet)).toEqual([1]);
  });

  it("lists the joist against the inner wall with the wall's levels", () => {
    // H: outlet 1's joist x = 3 spans 10 m, 0.25 m at 1:40; outlet 2's is the wall, 3 m each way.
    // The joist x = 6 reads the roof from the right: the chord y = 0..4 under the notch, from the
    // bottom wall (outlet 1 at x = 3, H at x = 10: 0.25 × 3/7 = 0.10714 m) to the reflex corner
    // (6, 4) at H. Then the inner wall (6, 4) → (6, 7) H → 0 and (6, 7) → (6, 10) 0 → H, 3 m at
    // 0.25 m each, 1:12. Before, the schedule stopped at (6, 4) and left the wall's joist out.
    const a = analyseSpec(spec);
    close(a.shaped.highLevel, 0.25);
    const j = a.shaped.joists.find((k) => k.spans[0].start[0] === 6)!;
    expect(j.spans.map((s) => [s.start, s.end])).toEqual([
      [
        [6, 0],
        [6, 4],
      ],
      [
        [6, 4],
        [6, 7],
      ],
      [
        [6, 7],
        [6, 10],
      ],
    ]);
    close(j.spans[0].startLevel, (0.25 * 3) / 7);
    close(j.spans[0].endLevel, 0.25);
    close(j.spans[1].endLevel, 0);
    close(j.spans[1].ratio, 12);
    close(j.spans[2].endLevel, 0.25);
  });
});
