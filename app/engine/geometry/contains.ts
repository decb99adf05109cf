import { nearestOnSegment } from "./segments";

/**
 * Where p lies against a simple polygon: 1 inside, 0 on the boundary (within tol), -1 outside.
 * Crossing-number test (W. R. Franklin, "PNPOLY").
 */
export function locatePoint(xs: ArrayLike<number>, ys: ArrayLike<number>, px: number, py: number, tol: number): -1 | 0 | 1 {
  const n = xs.length;
  let inside = false;
  for (let i = 0, j = n - 1; i < n; j = i++) {
    const xi = xs[i], yi = ys[i], xj = xs[j], yj = ys[j];
    if (nearestOnSegment(xj, yj, xi, yi, px, py).distance <= tol) return 0;
    if (yi > py !== yj > py && px < ((xj - xi) * (py - yi)) / (yj - yi) + xi) inside = !inside;
  }
  return inside ? 1 : -1;
}
