import { describe, expect, it } from "vitest";
import { analyseSpec } from "./helpers";

/*
 * Joists set out from the outlets, worked by hand: a 10 m × 6 m rectangle, outlets on the bottom
 * edge (y = 0), joists 0.4 m apart running along y (square to the outlet edge), so joist k
 * (from 1) lies at x = offset + (k − 1) × 0.4.
 */
const RECT: [number, number][] = [
  [0, 0],
  [10, 0],
  [10, 6],
  [0, 6],
];
const spec = (xs: number[], joists: Record<string, unknown>) => ({
  outline: RECT,
  outlets: xs.map((x) => ({ at: [x, 0] })),
  baseFall: "1:40",
  rainfall: { intensity: 75 },
  joists: { spacing: 0.4, ...joists },
});
const joistXs = (a: ReturnType<typeof analyseSpec>) => a.shaped.joists.map((j) => j.spans[0].start[0]);
const hasJoistAt = (a: ReturnType<typeof analyseSpec>, x: number) => joistXs(a).some((jx) => Math.abs(jx - x) < 1e-6);

describe("joists set out from the outlets", () => {
  it("two outlets 3.6 m apart (9 × 0.4 m) each get a joist: offset 3.1 mod 0.4 = 0.3 m", () => {
    const a = analyseSpec(spec([3.1, 6.7], { fromOutlets: true }));
    expect(a.shaped.setOut.offset).toBeCloseTo(0.3, 9);
    expect(a.shaped.setOut.fromOutlets).toBe(true);
    expect(hasJoistAt(a, 3.1)).toBe(true);
    expect(hasJoistAt(a, 6.7)).toBe(true);
    // Joist 1 at 0.3 m, so 3.1 m is joist 8 and 6.7 m is joist 17.
    expect(a.shaped.setOut.outlets.map((o) => o.joist)).toEqual([8, 17]);
    expect(a.warnings.filter((w) => w.code === "outlet-off-joist")).toEqual([]);
  });

  it("without the option the same roof keeps offset 0, and both outlets fall between joists", () => {
    const a = analyseSpec(spec([3.1, 6.7], {}));
    expect(a.shaped.setOut.offset).toBe(0);
    expect(hasJoistAt(a, 3.1)).toBe(false);
    const trims = a.warnings.filter((w) => w.code === "outlet-off-joist");
    expect(trims.map((w) => w.message.slice(0, 9))).toEqual(["Outlet 1 ", "Outlet 2 "]);
    // 3.1 m lies between joists at 2.8 m (joist 8) and 3.2 m (joist 9), 100 mm from the nearer.
    expect(trims[0].message).toContain("between joists 8 and 9, 100 mm");
    expect(trims[0].message).toMatch(
      /set the joists out from the outlets, or trim round it \(trimmer or noggin between joists 8 and 9\)/,
    );
  });

  it("when the spacing cannot serve both (3.4 m = 8.5 × 0.4 m apart), outlet 1 gets its joist and the warning names outlet 2's place and outlet 1", () => {
    const a = analyseSpec(spec([3.1, 6.5], { fromOutlets: true }));
    expect(hasJoistAt(a, 3.1)).toBe(true);
    expect(hasJoistAt(a, 6.5)).toBe(false);
    const trims = a.warnings.filter((w) => w.code === "outlet-off-joist");
    expect(trims).toHaveLength(1);
    // Joists at 6.3 m (joist 16) and 6.7 m (joist 17); 6.5 m is 200 mm from each.
    expect(trims[0].message).toMatch(
      /^Outlet 2 at \(6\.50, 0\.00\) lies between joists 16 and 17, 200 mm from the nearest/,
    );
    expect(trims[0].message).toContain("cannot also put a joist on outlet 1");
    expect(trims[0].at).toEqual([6.5, 0]);
    expect(a.shaped.setOut.outlets[1]).toMatchObject({ joist: null, between: [16, 17] });
    expect(a.shaped.setOut.outlets[1].gap).toBeCloseTo(0.2, 9);
  });

  it("serves the most outlets, not simply the first: outlets 2 and 3 are 0.8 m apart, outlet 1 is off their row", () => {
    const a = analyseSpec(spec([1.05, 5.0, 5.8], { fromOutlets: true }));
    expect(hasJoistAt(a, 5.0)).toBe(true);
    expect(hasJoistAt(a, 5.8)).toBe(true);
    const trims = a.warnings.filter((w) => w.code === "outlet-off-joist");
    expect(trims).toHaveLength(1);
    expect(trims[0].message).toMatch(/^Outlet 1 /);
    expect(trims[0].message).toContain("outlet 2, 3");
  });

  it("ignores a given offset when set out from the outlets, and is refused when not a boolean", () => {
    const a = analyseSpec(spec([3.1, 6.7], { fromOutlets: true, offset: 0.1 }));
    expect(a.shaped.setOut.offset).toBeCloseTo(0.3, 9);
    expect(() => analyseSpec(spec([3.1], { fromOutlets: "yes" }))).toThrow(/fromOutlets/);
  });
});
