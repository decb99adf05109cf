import { describe, expect, it } from "vitest";
import { analyse, parseSpec, type RoofSpec } from "~/engine";
import {
  addOpening,
  centreOf,
  deleteOpening,
  moveOpening,
  setJoistDirection,
  setOpening,
} from "~/components/sandbox/state/spec-edit";

const rect = (): RoofSpec => ({
  outline: [
    [0, 0],
    [12, 0],
    [12, 8],
    [0, 8],
  ],
  outlets: [{ at: [6, 0] }],
  baseFall: "1:40",
});

describe("opening edits", () => {
  it("adds a 1 m rooflight in the middle, which the engine accepts and leaves out of the drained area", () => {
    const spec = addOpening(rect(), centreOf(rect().outline));
    expect(spec.openings).toEqual([
      {
        outline: [
          [5.5, 3.5],
          [6.5, 3.5],
          [6.5, 4.5],
          [5.5, 4.5],
        ],
        kind: "rooflight",
      },
    ]);
    const parsed = parseSpec(structuredClone(spec));
    expect(parsed.ok).toBe(true);
    if (!parsed.ok) return;
    const a = analyse(parsed.spec, { mesh: false, traces: false });
    const drained =
      a.shaped.catchments.reduce((s, c) => s + c.area, 0) + a.shaped.ponding.reduce((s, p) => s + p.area, 0);
    expect(Math.abs(drained - (96 - 1))).toBeLessThan(1e-6);
  });

  it("moves, changes and deletes it without touching the spec it was given", () => {
    const one = addOpening(rect(), [3, 3], 2, "plant");
    const copy = structuredClone(one);
    const moved = moveOpening(one, 0, 0.1, -0.1);
    expect(moved.openings![0].outline[0]).toEqual([2.1, 1.9]);
    expect(setOpening(one, 0, { upstand: 0.3 }).openings![0]).toMatchObject({ kind: "plant", upstand: 0.3 });
    const none = deleteOpening(one, 0);
    expect("openings" in none).toBe(false);
    expect(one).toEqual(copy);
  });

  it("turning the joists to the advised direction makes it the current one", () => {
    const spec: RoofSpec = {
      outline: [
        [0, 0],
        [30, 0],
        [30, 8],
        [0, 8],
      ],
      outlets: [{ at: [0, 4] }],
      baseFall: "1:40",
      joists: { direction: [0, 1] },
    };
    const before = analyse(structuredClone(spec), { mesh: false, traces: false });
    const best = before.advice.joistDirections.find((o) => o.best)!;
    expect(best.current).toBe(false);
    const after = analyse(setJoistDirection(spec, best.direction), { mesh: false, traces: false });
    expect(after.shaped.joistDirection).toEqual(best.direction);
    expect(after.advice.joistDirections.find((o) => o.current)!.best).toBe(true);
  });
});
