import { describe, expect, it } from "vitest";
import { analyseSpec, close } from "./helpers";

/*
 * Joist direction advice (docs/roof-method-plans.md P8), worked by hand.
 *
 * Rectangle 30 m × 8 m, one outlet at (0, 4) on the short left wall, base fall 1:40, joists given
 * along y, (0, 1): the outlet's wall runs along them. Minimum fall: 1:100 (the default rule set's
 * longest-fall-line value, common practice, no source).
 * - Along y (the user's own): H from the outlet's joist, the wall itself, 4 m either side of it at
 *   1:40 = 0.1 m. The far corners (30, 0) and (30, 8) are at H; their water reaches the outlet by
 *   a straight path of √(30² + 4²) = 30.2655 m (Pythagoras), falling 0.1 m: 1:302.65, flatter
 *   than 1:100.
 * - Along x, (1, 0), the inward normal of the left wall (request edge 3, (0, 8) → (0, 0)): the
 *   outlet's joist spans the whole 30 m, H = 30/40 = 0.75 m; the same corners' fall lines are
 *   30.2655 m over 0.75 m: 1:40.354, which meets 1:100. So along x is the best, though its H is
 *   higher: meeting the minimum fall comes first.
 */
describe("joist direction advice on a rectangle drained from its short wall", () => {
  const a = analyseSpec({
    outline: [
      [0, 0],
      [30, 0],
      [30, 8],
      [0, 8],
    ],
    outlets: [{ at: [0, 4] }],
    baseFall: "1:40",
    joists: { direction: [0, 1] },
  });
  const options = a.advice.joistDirections;
  const diagonal = Math.hypot(30, 4);

  it("lists the user's own direction first, then the outlet wall's normal", () => {
    expect(options.map((o) => o.direction)).toEqual([
      [0, 1],
      [1, 0],
    ]);
    expect(options.map((o) => o.current)).toEqual([true, false]);
    expect(options[0].edges).toEqual([]);
    expect(options[1].edges).toEqual([3]);
  });

  it("gives each direction's high level and fall lines as worked", () => {
    close(options[0].highLevel, 0.1);
    close(options[0].longestFallRatio, diagonal / 0.1, 1e-9);
    close(options[0].worstFallRatio, diagonal / 0.1, 1e-9);
    expect(options[0].meetsMinimumFall).toBe(false);
    close(options[1].highLevel, 0.75);
    close(options[1].longestFallRatio, diagonal / 0.75, 1e-9);
    close(options[1].worstFallRatio, diagonal / 0.75, 1e-9);
    expect(options[1].meetsMinimumFall).toBe(true);
  });

  it("flags along x as the best, and the current entry repeats the analysis's own figures", () => {
    expect(options.map((o) => o.best)).toEqual([false, true]);
    expect(options[0].highLevel).toBe(a.shaped.highLevel);
    expect(options[0].worstFallRatio).toBe(a.shaped.worstFallRatio);
    expect(options[0].flatterThanMinimumArea).toBe(a.shaped.fallMap.flatterThanMinimumArea);
    // Most of the roof is flatter than 1:100 along y, little of it along x.
    expect(options[0].flatterThanMinimumArea).toBeGreaterThan(options[1].flatterThanMinimumArea);
  });

  it("applying the best gives the figures it promised (same mesh on a roof this small)", () => {
    const b = analyseSpec({
      outline: [
        [0, 0],
        [30, 0],
        [30, 8],
        [0, 8],
      ],
      outlets: [{ at: [0, 4] }],
      baseFall: "1:40",
      joists: { direction: options[1].direction },
    });
    expect(b.shaped.highLevel).toBe(options[1].highLevel);
    expect(b.shaped.worstFallRatio).toBe(options[1].worstFallRatio);
    close(b.shaped.fallMap.flatterThanMinimumArea, options[1].flatterThanMinimumArea, 1e-9);
    expect(b.advice.joistDirections.find((o) => o.current)?.best).toBe(true);
  });
});

describe("candidates", () => {
  it("a direction and its opposite are one candidate: outlets on facing walls give one entry", () => {
    const a = analyseSpec({
      outline: [
        [0, 0],
        [20, 0],
        [20, 10],
        [0, 10],
      ],
      outlets: [{ at: [5, 0] }, { at: [15, 10] }],
      baseFall: "1:40",
    });
    expect(a.advice.joistDirections).toHaveLength(1);
    expect(a.advice.joistDirections[0]).toMatchObject({ direction: [0, 1], edges: [0, 2], current: true, best: true });
  });

  it("an eaves edge's inward normal is a candidate", () => {
    // Eaves on the right wall (request edge 1, (20, 0) → (20, 10)): inward normal (-1, 0).
    const a = analyseSpec({
      outline: [
        [0, 0],
        [20, 0],
        [20, 10],
        [0, 10],
      ],
      edges: ["parapet", "eaves", "parapet", "parapet"],
      outlets: [{ at: [5, 0] }],
      baseFall: "1:40",
    });
    expect(a.advice.joistDirections.map((o) => o.direction)).toEqual([
      [0, 1],
      [-1, 0],
    ]);
    expect(a.advice.joistDirections[1].edges).toEqual([1]);
  });
});
