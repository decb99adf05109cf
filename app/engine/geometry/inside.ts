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
