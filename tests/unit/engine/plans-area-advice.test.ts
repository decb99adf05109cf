import { describe, expect, it } from "vitest";
import type { RoofSpec } from "~/engine";
import { setAreaJoistDirection } from "~/components/sandbox/state/spec-edit";
import { analyseSpec, close } from "./helpers";

/*
 * Joist direction advice on a roof divided by ridges (docs/roof-method-plans.md P4, P8), worked by
 * hand from the undivided case of plans-joist-directions.test.ts.
 *
 * Rectangle 30 m × 16 m divided by a ridge along y = 8 into two 30 m × 8 m areas; outlet O1 at
 * (0, 4) on the west wall of the south area, O2 at (0, 12) on the west wall of the north area;
 * base fall 1:40, joists along y, (0, 1), so both outlets sit on walls that run along them.
 * Each area is a roof of its own (P4) whose walls are the outline's pieces and the ridge, which
 * stands at H like a corner: each is the 30 m × 8 m rectangle drained from its short wall.
 * - Along y: an area's own need is the outlet's wall, 4 m either side at 1:40 = 0.1 m. The far
 *   corners' fall lines run √(30² + 4²) = 30.2655 m (Pythagoras) over 0.1 m: 1:302.65, flatter
 *   than the minimum 1:100 (default rule set, common practice, no source).
 * - Along x, (1, 0), the inward normal of the west wall: the outlet's joist spans 30 m,
 *   need 30/40 = 0.75 m. Turning one area alone puts the whole roof's H at
 *   max(0.75, the other area's 0.1) = 0.75 m; its far corners' fall lines: 30.2655/0.75 = 1:40.354.
 */
const divided = (extra: Partial<RoofSpec> = {}): RoofSpec => ({
  outline: [
    [0, 0],
    [30, 0],
    [30, 16],
    [0, 16],
  ],
  outlets: [{ at: [0, 4] }, { at: [0, 12] }],
  baseFall: "1:40",
  joists: { direction: [0, 1] },
  ridges: [
    {
      line: [
        [0, 8],
        [30, 8],
      ],
    },
  ],
  ...extra,
});
const diagonal = Math.hypot(30, 4);

describe("joist direction advice on a divided roof, area by area", () => {
  const a = analyseSpec(divided());
  const options = a.advice.joistDirections;
  const areaOf = (outlet: number) => a.shaped.areas.find((x) => x.outlets.includes(outlet))!.id;

  it("gives each area its own candidates: the current direction and its outlet wall's normal", () => {
    expect(a.shaped.areas).toHaveLength(2);
    for (const outlet of [0, 1]) {
      const mine = options.filter((o) => o.area === areaOf(outlet));
      expect(mine.map((o) => o.direction)).toEqual([
        [0, 1],
        [1, 0],
      ]);
      expect(mine.map((o) => o.current)).toEqual([true, false]);
      // The west wall is request edge 3, (0, 16) → (0, 0), cut by the ridge into two pieces.
      expect(mine[1].edges).toEqual([3]);
    }
    expect(options).toHaveLength(4);
  });

  it("works each candidate's figures up to the H the whole roof would need, and flags along x", () => {
    for (const outlet of [0, 1]) {
      const [along, across] = options.filter((o) => o.area === areaOf(outlet));
      close(along.highLevel, 0.1);
      close(along.worstFallRatio, diagonal / 0.1, 1e-9);
      expect(along.meetsMinimumFall).toBe(false);
      close(across.highLevel, 0.75);
      close(across.longestFallRatio, diagonal / 0.75, 1e-9);
      close(across.worstFallRatio, diagonal / 0.75, 1e-9);
      expect(across.meetsMinimumFall).toBe(true);
      expect([along.best, across.best]).toEqual([false, true]);
    }
  });

  it("keeps its promise: the south area turned as advised stands at the H and falls the advice gave", () => {
    const best = options.find((o) => o.area === areaOf(0) && o.best)!;
    const area = a.shaped.areas.find((x) => x.id === areaOf(0))!;
    const turned = analyseSpec(setAreaJoistDirection(divided(), area, best.direction));
    close(turned.shaped.highLevel, best.highLevel);
    expect(turned.shaped.areas.find((x) => x.outlets.includes(0))!.joistDirection).toEqual([1, 0]);
    // The north area keeps its joists along y, now shaped up to 0.75 m: its far corners fall 1:40.354 too.
    expect(turned.shaped.areas.find((x) => x.outlets.includes(1))!.joistDirection).toEqual([0, 1]);
    const south = turned.advice.joistDirections.filter((o) => o.area === areaOf(0));
    expect(south.find((o) => o.current)!.direction).toEqual([1, 0]);
    expect(south.find((o) => o.current)!.best).toBe(true);
  });

  it("counts the other area's need: with the north area already along x, the south area's current H is 0.75 m", () => {
    const b = analyseSpec(divided({ areas: [{ at: [15, 12], joists: { direction: [1, 0] } }] }));
    const north = b.shaped.areas.find((x) => x.outlets.includes(1))!.id;
    const south = b.advice.joistDirections.filter((o) => o.area !== north);
    close(b.shaped.highLevel, 0.75);
    close(south.find((o) => o.current)!.highLevel, 0.75);
    // Turning the south area too needs no more height (0.75 either way).
    close(south.find((o) => !o.current)!.highLevel, 0.75);
    const mine = b.advice.joistDirections.filter((o) => o.area === north);
    expect(mine.find((o) => o.current)!.direction).toEqual([1, 0]);
    expect(mine.find((o) => o.current)!.best).toBe(true);
  });
});

describe("applying the advice to one area", () => {
  const area = {
    at: [15, 4] as [number, number],
    outline: [
      [0, 0],
      [30, 0],
      [30, 8],
      [0, 8],
    ] as [number, number][],
  };
  it("adds an areas entry at the area's point when none names it", () => {
    expect(setAreaJoistDirection(divided(), area, [1, 0]).areas).toEqual([
      { at: [15, 4], joists: { direction: [1, 0] } },
    ]);
  });
  it("turns the entry that names the area, keeping its other settings and the other areas' entries", () => {
    const spec = divided({
      areas: [
        { at: [2, 12], joists: { direction: [1, 0] } },
        { at: [3, 3], joists: { spacing: 0.6 } },
      ],
    });
    expect(setAreaJoistDirection(spec, area, [1, 0]).areas).toEqual([
      { at: [2, 12], joists: { direction: [1, 0] } },
      { at: [3, 3], joists: { spacing: 0.6, direction: [1, 0] } },
    ]);
  });
});
