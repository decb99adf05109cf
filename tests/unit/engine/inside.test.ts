import { describe, expect, it } from "vitest";
import { insidePolygon, pointAgainstPolygon, strictlyInside } from "~/engine/geometry/inside";

// A 4 × 2 rectangle and an L (a 4 × 4 square less its top-right 2 × 2), counter-clockwise.
const rect = { xs: [0, 4, 4, 0], ys: [0, 0, 2, 2] };
const ell = { xs: [0, 4, 4, 2, 2, 0], ys: [0, 0, 2, 2, 4, 4] };

describe("strictlyInside: inside and clear of every edge by more than the tolerance", () => {
  it("agrees with the crossing-number rule away from the boundary", () => {
    for (const poly of [rect, ell])
      for (let x = -0.75; x <= 4.75; x += 0.5)
        for (let y = -0.75; y <= 4.75; y += 0.5)
          expect(strictlyInside(poly.xs, poly.ys, x, y, 1e-6), `(${x}, ${y})`).toBe(
            insidePolygon(poly.xs, poly.ys, x, y),
          );
  });

  it("puts a point on an edge or a corner outside, and one within the tolerance of an edge", () => {
    expect(strictlyInside(rect.xs, rect.ys, 2, 0, 1e-6)).toBe(false);
    expect(strictlyInside(rect.xs, rect.ys, 4, 2, 1e-6)).toBe(false);
    expect(strictlyInside(rect.xs, rect.ys, 2, 0.005, 0.01)).toBe(false);
    expect(strictlyInside(rect.xs, rect.ys, 2, 0.02, 0.01)).toBe(true);
    // The L's inner corner at (2, 2): near it counts as its edge, however the ray crosses.
    expect(strictlyInside(ell.xs, ell.ys, 1.995, 1.995, 0.01)).toBe(false);
    expect(strictlyInside(ell.xs, ell.ys, 1.9, 1.9, 0.01)).toBe(true);
    expect(strictlyInside(ell.xs, ell.ys, 3, 3, 0.01)).toBe(false);
  });
});

describe("pointAgainstPolygon: inside, on the boundary within the tolerance, or outside", () => {
  it("names each case, and reads only the first n corners", () => {
    expect(pointAgainstPolygon(rect.xs, rect.ys, 1, 1, 0.01)).toBe(1);
    expect(pointAgainstPolygon(rect.xs, rect.ys, 4.005, 1, 0.01)).toBe(0);
    expect(pointAgainstPolygon(rect.xs, rect.ys, 5, 1, 0.01)).toBe(-1);
    // A longer buffer whose first four corners are the rectangle (as the engine's arena arrays are).
    const xs = [...rect.xs, 99, 99],
      ys = [...rect.ys, -99, 99];
    expect(pointAgainstPolygon(xs, ys, 50, 0, 0.01, 4)).toBe(-1);
    expect(pointAgainstPolygon(xs, ys, 1, 1, 0.01, 4)).toBe(1);
  });
});
