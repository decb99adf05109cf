/** True when p is strictly inside or on the boundary by the crossing-number rule (no tolerance; W. R. Franklin, PNPOLY). */
export function insidePolygon(xs: ArrayLike<number>, ys: ArrayLike<number>, px: number, py: number): boolean {
  const n = xs.length;
  let inside = false;
  for (let i = 0, j = n - 1; i < n; j = i++) {
    const yi = ys[i],
      yj = ys[j];
    if (yi > py !== yj > py && px < ((xs[j] - xs[i]) * (py - yi)) / (yj - yi) + xs[i]) inside = !inside;
  }
  return inside;
}

/**
 * Where p lies against the polygon's first `n` corners: 1 inside and farther than `tol` from every
 * edge, 0 within `tol` of an edge, -1 outside. The crossing-number rule, with a distance test to
 * each edge in the same pass.
 */
export function pointAgainstPolygon(
  xs: ArrayLike<number>,
  ys: ArrayLike<number>,
  px: number,
  py: number,
  tol: number,
  n = xs.length,
): 1 | 0 | -1 {
  let inside = false;
  for (let i = 0, j = n - 1; i < n; j = i++) {
    const xi = xs[i],
      yi = ys[i],
      xj = xs[j],
      yj = ys[j];
    const dx = xi - xj,
      dy = yi - yj;
    const len2 = dx * dx + dy * dy;
    let s = len2 > 0 ? ((px - xj) * dx + (py - yj) * dy) / len2 : 0;
    s = s < 0 ? 0 : s > 1 ? 1 : s;
    const cx = xj + s * dx - px,
      cy = yj + s * dy - py;
    if (cx * cx + cy * cy <= tol * tol) return 0;
    if (yi > py !== yj > py && px < ((xj - xi) * (py - yi)) / (yj - yi) + xi) inside = !inside;
  }
  return inside ? 1 : -1;
}

/** Inside and clear of every edge by more than `tol` (an opening's edge is deck, not opening). */
export function strictlyInside(
  xs: ArrayLike<number>,
  ys: ArrayLike<number>,
  px: number,
  py: number,
  tol: number,
): boolean {
  return pointAgainstPolygon(xs, ys, px, py, tol) === 1;
}
