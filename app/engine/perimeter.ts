import type { Roof } from "./roof";

/** Knots of the piecewise-linear perimeter levels, per internal edge: distance along it and level. */
export interface PerimeterLevels {
  H: number;
  t: Float64Array[];
  z: Float64Array[];
  /** Level of each internal vertex. */
  vertex: Float64Array;
  /** Kind of each knot: 0 vertex, 1 outlet, 2 half-way between outlets. */
  kind: Uint8Array[];
}

/** Outlets on internal edge j, corner outlets included, sorted along the edge: [t, level][]. */
export function outletsOnEdge(roof: Roof, j: number): [number, number][] {
  const q = (j + 1) % roof.n;
  const list: [number, number][] = [];
  for (const o of roof.outlets) {
    if (o.vertex === j) list.push([0, o.level]);
    else if (o.vertex === q) list.push([roof.len[j], o.level]);
    else if (o.vertex < 0 && o.edge === j) list.push([o.t, o.level]);
  }
  list.sort((a, b) => a[0] - b[0] || a[1] - b[1]);
  return list;
}

/**
 * The "level rim" rule (docs/roof-method.md §2): eaves vertices at 0, outlet vertices at the outlet
 * level, other vertices at H; eaves edges level; an outlet edge rises from each outlet to H at
 * its ends and half-way to the next outlet on the same edge.
 */
export function perimeterLevels(roof: Roof, H: number): PerimeterLevels {
  const { n, eaves } = roof;
  const vertex = new Float64Array(n).fill(H);
  const corner = new Float64Array(n).fill(Infinity);
  for (const o of roof.outlets) if (o.vertex >= 0) corner[o.vertex] = Math.min(corner[o.vertex], o.level);
  for (let i = 0; i < n; i++) {
    const before = (i + n - 1) % n;
    if (eaves[i] || eaves[before]) vertex[i] = 0;
    else if (corner[i] < Infinity) vertex[i] = corner[i];
  }
  const t: Float64Array[] = [];
  const z: Float64Array[] = [];
  const kind: Uint8Array[] = [];
  for (let j = 0; j < n; j++) {
    const q = (j + 1) % n;
    const L = roof.len[j];
    const kt: number[] = [0];
    const kz: number[] = [vertex[j]];
    const kk: number[] = [0];
    const push = (tt: number, zz: number, k: number) => {
      if (tt - kt[kt.length - 1] <= roof.tol) return;
      kt.push(tt);
      kz.push(zz);
      kk.push(k);
    };
    if (!eaves[j]) {
      const on = outletsOnEdge(roof, j);
      for (let k = 0; k < on.length; k++) {
        if (k > 0 && on[k][0] - on[k - 1][0] > roof.tol) push((on[k - 1][0] + on[k][0]) / 2, H, 2);
        push(on[k][0], on[k][1], 1);
      }
    }
    if (L - kt[kt.length - 1] > roof.tol) {
      kt.push(L);
      kz.push(vertex[q]);
      kk.push(0);
    } else {
      // An outlet at the far corner: the vertex level stands for both.
      kt[kt.length - 1] = L;
      kz[kz.length - 1] = vertex[q];
      kk[kk.length - 1] = 0;
    }
    t.push(Float64Array.from(kt));
    z.push(Float64Array.from(kz));
    kind.push(Uint8Array.from(kk));
  }
  return { H, t, z, vertex, kind };
}

/** Level at distance t along internal edge j. */
export function levelOnEdge(p: PerimeterLevels, j: number, t: number): number {
  const kt = p.t[j];
  const kz = p.z[j];
  const m = kt.length;
  if (t <= kt[0]) return kz[0];
  for (let k = 1; k < m; k++) {
    if (t <= kt[k]) {
      const span = kt[k] - kt[k - 1];
      return span > 0 ? kz[k - 1] + ((kz[k] - kz[k - 1]) * (t - kt[k - 1])) / span : kz[k];
    }
  }
  return kz[m - 1];
}
