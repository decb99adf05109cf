/** Signed area of a polygon given as flat coordinate arrays; positive when counter-clockwise (shoelace formula). */
export function signedArea(xs: ArrayLike<number>, ys: ArrayLike<number>): number {
  const n = xs.length;
  let sum = 0;
  for (let i = 0, j = n - 1; i < n; j = i++) sum += (xs[j] - xs[i]) * (ys[j] + ys[i]);
  return sum / 2;
}

/** The same shoelace area for a polygon given as [x, y] points (plan y up): positive when counter-clockwise. */
export function pointsSignedArea(points: readonly (readonly [number, number])[]): number {
  const n = points.length;
  let sum = 0;
  for (let i = 0, j = n - 1; i < n; j = i++) sum += (points[j][0] - points[i][0]) * (points[j][1] + points[i][1]);
  return sum / 2;
}
