/**
 * Contour lines of a triangle mesh (marching triangles): for each level at a multiple of the
 * interval, the segment where it crosses each face. Returns segment end points x, y, z in plan
 * metres, two points per segment, in one flat array for a single line draw.
 */
export function contourSegments(
  positions: ArrayLike<number>,
  indices: ArrayLike<number>,
  interval: number,
  maxSegments = 200_000,
): Float32Array {
  if (!(interval > 0)) return new Float32Array(0);
  const out: number[] = [];
  const faces = indices.length / 3;
  for (let f = 0; f < faces && out.length < maxSegments * 6; f++) {
    const ia = indices[3 * f] * 3;
    const ib = indices[3 * f + 1] * 3;
    const ic = indices[3 * f + 2] * 3;
    const za = positions[ia + 2];
    const zb = positions[ib + 2];
    const zc = positions[ic + 2];
    const lo = Math.min(za, zb, zc);
    const hi = Math.max(za, zb, zc);
    // Levels strictly inside the face's range; a level through a vertex is taken just above it.
    for (let k = Math.floor(lo / interval) + 1; k * interval < hi; k++) {
      const level = k * interval;
      let found = 0;
      const pts: number[] = [];
      const cross = (i: number, j: number, zi: number, zj: number) => {
        if (zi < level === zj < level) return;
        const t = (level - zi) / (zj - zi);
        pts.push(
          positions[i] + t * (positions[j] - positions[i]),
          positions[i + 1] + t * (positions[j + 1] - positions[i + 1]),
          level,
        );
        found++;
      };
      cross(ia, ib, za, zb);
      cross(ib, ic, zb, zc);
      cross(ic, ia, zc, za);
      if (found === 2) out.push(...pts);
    }
  }
  return Float32Array.from(out);
}
