import { describe, expect, it } from "vitest";
import { pointsSignedArea, type Point } from "~/engine";
import { signedArea } from "~/engine/geometry/area";

describe("pointsSignedArea (the one shoelace area for [x, y] polygons)", () => {
  // A 4 m by 3 m rectangle: 12 m² by plain length × width.
  const ccw: Point[] = [
    [0, 0],
    [4, 0],
    [4, 3],
    [0, 3],
  ];

  it("is the area, positive counter-clockwise (plan y up) and negative clockwise", () => {
    expect(pointsSignedArea(ccw)).toBeCloseTo(12, 12);
    expect(pointsSignedArea([...ccw].reverse())).toBeCloseTo(-12, 12);
  });

  it("agrees with the engine's flat-array signedArea on an irregular polygon", () => {
    const l: Point[] = [
      [0, 0],
      [6, 0],
      [6, 2],
      [2.5, 2],
      [2.5, 5],
      [0, 5],
    ];
    // L shape: 6 × 2 plus 2.5 × 3 = 19.5 m².
    expect(pointsSignedArea(l)).toBeCloseTo(19.5, 12);
    expect(pointsSignedArea(l)).toBeCloseTo(
      signedArea(
        l.map((p) => p[0]),
        l.map((p) => p[1]),
      ),
      12,
    );
  });

  it("is zero for fewer than three points", () => {
    expect(pointsSignedArea([])).toBe(0);
    expect(pointsSignedArea([[1, 2]])).toBe(0);
  });
});
