import { describe, expect, it } from "vitest";
import type { RoofSpec } from "~/engine";
import {
  addOutlet,
  attachOutlet,
  deleteVertex,
  edgeKindsOf,
  insertVertex,
  moveVertex,
  nudgeOutlet,
  setEdgeKind,
} from "~/components/sandbox/state/spec-edit";
import { snapAlong, snapVertex } from "~/components/sandbox/plan/snap";

const rect = (): RoofSpec => ({
  outline: [
    [0, 0],
    [12, 0],
    [12, 8],
    [0, 8],
  ],
  outlets: [{ at: [6, 0], size: 0.1 }],
  baseFall: "1:40",
});

describe("spec edits", () => {
  it("moving a corner carries the outlets on its edges along, at the same fraction of the edge", () => {
    const moved = moveVertex(rect(), 1, [16, 0]);
    expect(moved.outline[1]).toEqual([16, 0]);
    expect(moved.outlets[0].at).toEqual([8, 0]);
    expect(moved.outlets[0].size).toBe(0.1);
  });

  it("does not mutate the spec it is given", () => {
    const spec = rect();
    const copy = structuredClone(spec);
    moveVertex(spec, 2, [13, 9]);
    insertVertex(spec, 0);
    deleteVertex(spec, 3);
    setEdgeKind(spec, 0, "eaves");
    expect(spec).toEqual(copy);
  });

  it("inserts a vertex half-way along an edge, keeping the edge's kind on both halves", () => {
    const spec = { ...rect(), edges: ["parapet", "eaves", "parapet", "parapet"] as RoofSpec["edges"] };
    const next = insertVertex(spec, 1);
    expect(next.outline).toHaveLength(5);
    expect(next.outline[2]).toEqual([12, 4]);
    expect(edgeKindsOf(next)).toEqual(["parapet", "eaves", "eaves", "parapet", "parapet"]);
  });

  it("deleting a vertex merges its edges and projects their outlets onto the new edge", () => {
    const spec: RoofSpec = {
      ...rect(),
      outline: [
        [0, 0],
        [6, 1],
        [12, 0],
        [12, 8],
        [0, 8],
      ],
      outlets: [{ at: [3, 0.5] }],
    };
    const next = deleteVertex(spec, 1);
    expect(next.outline).toEqual([
      [0, 0],
      [12, 0],
      [12, 8],
      [0, 8],
    ]);
    expect(next.outlets[0].at[0]).toBeCloseTo(3, 9);
    expect(next.outlets[0].at[1]).toBeCloseTo(0, 9);
    expect(deleteVertex(rect(), 0).outline).toHaveLength(3);
    // A triangle stays a triangle.
    const tri: RoofSpec = {
      ...rect(),
      outline: [
        [0, 0],
        [4, 0],
        [0, 3],
      ],
      outlets: [],
    };
    expect(deleteVertex(tri, 1)).toBe(tri);
  });

  it("turning an edge to eaves removes the outlets on it (water leaves along the whole edge)", () => {
    const spec = addOutlet(rect(), 2, 0.5);
    const next = setEdgeKind(spec, 0, "eaves");
    expect(edgeKindsOf(next)[0]).toBe("eaves");
    expect(next.outlets).toEqual([{ at: [6, 8] }]);
  });

  it("an outlet slides along its edge and stops at its ends", () => {
    expect(nudgeOutlet(rect(), 0, 1.5).outlets[0].at).toEqual([7.5, 0]);
    expect(nudgeOutlet(rect(), 0, -100).outlets[0].at).toEqual([0, 0]);
    expect(attachOutlet(rect(), [12, 3.3])).toMatchObject({ edge: 1 });
  });
});

describe("snapping", () => {
  const options = { grid: true, step: 0.25, rightAngles: false, tolerance: 0.2 };

  it("snaps to the grid step", () => {
    expect(snapVertex([3.13, 4.88], rect().outline, 2, options)).toEqual([3.25, 5]);
    expect(snapAlong(3.13, 12, options)).toBe(3.25);
    expect(snapAlong(12.4, 12, options)).toBe(12);
  });

  it("catches a right angle with both neighbours when close, whatever the grid", () => {
    const outline = rect().outline;
    // Corner 3 dragged near (12, 8): square to edge 1 through (12, 0) and to edge 3 through (0, 8).
    const p = snapVertex([12.13, 7.9], outline, 2, { grid: false, step: 0.25, rightAngles: true, tolerance: 0.2 });
    expect(p[0]).toBeCloseTo(12, 9);
    expect(p[1]).toBeCloseTo(8, 9);
    // Far from any right-angle line: left where it is.
    expect(snapVertex([14, 10], outline, 2, { grid: false, step: 0.25, rightAngles: true, tolerance: 0.2 })).toEqual([
      14, 10,
    ]);
  });

  it("squares a corner to a slanted neighbour edge", () => {
    const outline: RoofSpec["outline"] = [
      [0, 0],
      [10, 5],
      [8, 9],
      [-2, 4],
    ];
    // Square at vertex 1 means vertex 2 lies on the line through (10, 5) perpendicular to (10, 5) - (0, 0).
    const p = snapVertex([8.05, 9.05], outline, 2, { grid: false, step: 0.25, rightAngles: true, tolerance: 0.2 });
    const dot = (p[0] - 10) * 10 + (p[1] - 5) * 5;
    expect(Math.abs(dot)).toBeLessThan(1e-9);
  });
});
