/** Signed area of a polygon given as flat coordinate arrays; positive when counter-clockwise (shoelace formula). */
export function signedArea(xs: ArrayLike<number>, ys: ArrayLike<number>): number {
  const n = xs.length;
  let sum = 0;
  for (let i = 0, j = n - 1; i < n; j = i++) sum += (xs[j] - xs[i]) * (ys[j] + ys[i]);
  return sum / 2;
}
