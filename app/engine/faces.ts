import { FRESH, type Memory } from "./arena";
import type { SurfaceMesh } from "./mesh";

/**
 * Per face: plan area, squared steepest fall |grad z|² of its plane (from its three vertex
 * levels), and the drain its water goes to; and the area draining to each drain.
 */
export interface FaceData {
  area: Float64Array;
  /** Squared, so the fall map compares without a square root per face; the 3D mesh takes the root. */
  slope2: Float64Array;
  /** The drain of the face's lowest vertex (docs/roof-method.md §7), -1 for none. */
  drain: Int32Array;
  /** Plan area draining to each drain, by drain id. */
  drainArea: Float64Array;
}

/** Every face's area, fall and drain in one pass over the faces: the fall map and catchments read these. */
export function faceData(
  mesh: SurfaceMesh,
  vertexDrain: Int32Array,
  drainCount: number,
  memory: Memory = FRESH,
): FaceData {
  const F = mesh.faceCount;
  const { u, v, z, tri } = mesh;
  const area = memory.take(Float64Array, F);
  const slope2 = memory.take(Float64Array, F);
  const drain = memory.take(Int32Array, F);
  const drainArea = new Float64Array(drainCount);
  for (let f = 0; f < F; f++) {
    const a = tri[3 * f],
      b = tri[3 * f + 1],
      c = tri[3 * f + 2];
    const za = z[a],
      zb = z[b],
      zc = z[c];
    const du1 = u[b] - u[a],
      dv1 = v[b] - v[a],
      dz1 = zb - za;
    const du2 = u[c] - u[a],
      dv2 = v[c] - v[a],
      dz2 = zc - za;
    const det = du1 * dv2 - du2 * dv1;
    const A = det / 2;
    area[f] = A;
    if (det !== 0) {
      const x = (dz1 * dv2 - dz2 * dv1) / det;
      const y = (du1 * dz2 - du2 * dz1) / det;
      slope2[f] = x * x + y * y;
    }
    let low = a;
    if (zb < z[low]) low = b;
    if (zc < z[low]) low = c;
    const d = vertexDrain[low];
    drain[f] = d;
    if (d >= 0) drainArea[d] += A;
  }
  return { area, slope2, drain, drainArea };
}

/** Index of the mesh vertex nearest frame point (u, v): binary search on lines, then stations. */
export function nearestVertex(mesh: SurfaceMesh, u: number, v: number): number {
  const { lineU, lineStart } = mesh;
  const L = lineU.length;
  let lo = 0,
    hi = L - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >>> 1;
    if (lineU[mid] <= u) lo = mid;
    else hi = mid;
  }
  let best = -1;
  let bestD = Infinity;
  for (let j = Math.max(0, lo - 1); j <= Math.min(L - 1, hi + 1); j++) {
    const s0 = lineStart[j],
      s1 = lineStart[j + 1];
    if (s1 <= s0) continue;
    let a = s0,
      b = s1 - 1;
    while (b - a > 1) {
      const mid = (a + b) >>> 1;
      if (mesh.v[mid] <= v) a = mid;
      else b = mid;
    }
    const da = (mesh.u[a] - u) ** 2 + (mesh.v[a] - v) ** 2;
    const db = (mesh.u[b] - u) ** 2 + (mesh.v[b] - v) ** 2;
    if (da < bestD) {
      bestD = da;
      best = a;
    }
    if (db < bestD) {
      bestD = db;
      best = b;
    }
  }
  return best;
}
