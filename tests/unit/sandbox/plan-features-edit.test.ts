import { describe, expect, it } from "vitest";
import type { Point, RoofSpec } from "~/engine";
import { snapFree, snapOnSegment, snapOnWalls } from "~/components/sandbox/plan/snap";
import {
  addOpeningRect,
  insertRidgePoint,
  moveOpeningCorner,
  placeOpening,
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
const grid = { grid: true, step: 0.25 };
const walls = (pts: Point[]) => pts.map((a, k) => [a, pts[(k + 1) % pts.length]] as [Point, Point]);

describe("snapping on the plan", () => {
  it("puts a point on a segment at the grid step along it", () => {
    // 3.1 m along a 12 m wall, 0.3 m off it: 3.0 m along on a 0.25 m grid, t = 3 / 12.
    expect(snapOnSegment([3.1, 0.3], [0, 0], [12, 0], grid)).toEqual({ t: 0.25, point: [3, 0] });
    // Without the grid the foot of the perpendicular.
    expect(snapOnSegment([3.1, 0.3], [0, 0], [12, 0], { grid: false, step: 0.25 }).point[0]).toBeCloseTo(3.1, 12);
  });

  it("lands a ridge end on the nearest wall within reach, on a corner within half the reach, else nowhere", () => {
    const w = walls(rect().outline);
    expect(snapOnWalls([3.1, 0.3], w, 0.5, grid)).toEqual({ point: [3, 0], segment: 0 });
    expect(snapOnWalls([11.9, 7.6], w, 0.5, grid)).toEqual({ point: [12, 7.5], segment: 1 });
    expect(snapOnWalls([11.9, 7.9], w, 0.5, grid)?.point).toEqual([12, 8]);
    expect(snapOnWalls([6, 4], w, 0.5, grid)).toBeNull();
  });

  it("puts a free point on the grid only when the grid snaps", () => {
    expect(snapFree([1.13, 2.9], grid)).toEqual([1.25, 3]);
    expect(snapFree([1.13, 2.9], { grid: false, step: 0.25 })).toEqual([1.13, 2.9]);
  });
});

describe("openings and ridges edited on the plan", () => {
  it("draws an opening from two opposite corners in either order, refusing one with no width", () => {
    const a = addOpeningRect(rect(), [7, 5], [5, 3]);
    expect(a.openings?.[0].outline).toEqual([
      [5, 3],
      [7, 3],
      [7, 5],
      [5, 5],
    ]);
    expect(addOpeningRect(rect(), [5, 3], [5.01, 6])).toEqual(rect());
  });

  it("moves an opening by the drag's travel from where it started, not by the sum of every step", () => {
    const start = addOpeningRect(rect(), [5, 3], [7, 5]);
    const outline = start.openings![0].outline;
    let s = start;
    for (const dx of [0.25, 0.5, 1]) s = placeOpening(s, 0, outline, dx, -1);
    expect(s.openings![0].outline).toEqual([
      [6, 2],
      [8, 2],
      [8, 4],
      [6, 4],
    ]);
  });

  it("resizes a rectangle from a corner: the neighbours follow, the opposite corner stays, it keeps 50 mm", () => {
    const s = addOpeningRect(rect(), [5, 3], [7, 5]);
    // Corner 2 is (7, 5); the opposite corner 0 (5, 3) stays.
    expect(moveOpeningCorner(s, 0, 2, [8, 6]).openings![0].outline).toEqual([
      [5, 3],
      [8, 3],
      [8, 6],
      [5, 6],
    ]);
    expect(moveOpeningCorner(s, 0, 2, [5.01, 6])).toBe(s);
  });

  it("moves one corner alone of an opening that is not a rectangle along the axes", () => {
    const s: RoofSpec = {
      ...rect(),
      openings: [
        {
          outline: [
            [5, 3],
            [7, 3],
            [6, 5],
          ],
        },
      ],
    };
    expect(moveOpeningCorner(s, 0, 2, [6, 6]).openings![0].outline).toEqual([
      [5, 3],
      [7, 3],
      [6, 6],
    ]);
  });

  it("inserts a bend in the chosen piece of a ridge", () => {
    const s: RoofSpec = {
      ...rect(),
      ridges: [
        {
          line: [
            [3, 0],
            [3, 4],
            [4, 8],
          ],
        },
      ],
    };
    expect(insertRidgePoint(s, 0, 1, [3.5, 6]).ridges![0].line).toEqual([
      [3, 0],
      [3, 4],
      [3.5, 6],
      [4, 8],
    ]);
    expect(insertRidgePoint(s, 0, 2, [3.5, 6])).toBe(s);
  });
});
