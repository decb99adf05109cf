import { describe, expect, it } from "vitest";
import { surfaceAttributes } from "~/components/sandbox/view-3d/surface-attributes";
import { fallColour } from "~/lib/fall-colour";

describe("the 3D surface's vertex attributes", () => {
  // Two faces of a 2 m square, one falling at 1:40, one level (Infinity), and a gutter side (-1).
  const mesh = {
    positions: [10, 20, 0.05, 12, 20, 0, 12, 22, 0, 10, 22, 0.05],
    indices: [0, 1, 2, 0, 2, 3, 1, 2, 3],
    faceRatio: [40, Infinity, -1],
  };
  const frame = { cx: 11, cy: 21 };
  const { pos, col, flat } = surfaceAttributes(mesh, frame, 100);

  it("puts every face's corners in scene axes: x east, y up (the level), z south, about the frame's centre", () => {
    expect(pos).toHaveLength(3 * 9);
    // Face 0, corner 0 is plan (10, 20) at level 0.05 → (-1, 0.05, 1).
    expect(Array.from(pos.slice(0, 3))).toEqual([-1, Math.fround(0.05), 1]);
    // Face 1, corner 2 is plan (10, 22) → (-1, 0.05, -1).
    expect(Array.from(pos.slice(15, 18))).toEqual([-1, Math.fround(0.05), -1]);
  });

  it("colours each face from the fall scale and hatches only faces flatter than the minimum", () => {
    const [r, g, b] = fallColour(40);
    expect(Array.from(col.slice(0, 3))).toEqual([r / 255, g / 255, b / 255].map(Math.fround));
    expect(Array.from(flat)).toEqual([0, 0, 0, 1, 1, 1, 0, 0, 0]);
    // The gutter side is neither the 1:40 colour nor hatched.
    expect(Array.from(col.slice(18, 21))).not.toEqual(Array.from(col.slice(0, 3)));
  });
});
