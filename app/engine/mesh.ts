import { FRESH, type Memory } from "./arena";
import { Growable } from "./growable";
import { levelOnEdge, type PerimeterLevels } from "./perimeter";
import type { Roof } from "./roof";

/** The structured surface mesh in the joist frame (u across joists, v along them). */
export interface SurfaceMesh {
  vertexCount: number;
  faceCount: number;
  u: Float64Array;
  v: Float64Array;
  z: Float64Array;
  /** Internal perimeter edge a vertex lies on, or -1 inside; and its distance along that edge. */
  edge: Int32Array;
  t: Float64Array;
  /** Three vertex indices per face, counter-clockwise. */
  tri: Uint32Array;
  /**
   * The mesh's edges, each once, in two parts: rungs across the slabs (pairs of vertex indices),
   * and links along the lines (`link[i]` is 1 when vertex i is joined to vertex i - 1).
   * `meshEdges` puts them in one list, in that order.
   */
  rungs: Uint32Array;
  link: Uint8Array;
  /** Mesh lines (u positions) and where each line's stations start in the vertex arrays. */
  lineU: Float64Array;
  lineStart: Int32Array;
  /** Station step along the lines and how many joist spacings apart the mesh lines are. */
  step: number;
  stride: number;
  coarsened: boolean;
}

export interface MeshOptions {
  /** Work bound: the mesh is coarsened (every k-th joist, longer station step) above this. */
  maxVertices: number;
  /** Where the mesh's arrays come from (default: fresh arrays the caller may keep). */
  memory?: Memory;
}

/** Sorted unique breakpoints: every vertex u exactly, outlet and half-way knots, then mesh joist lines. */
function meshLines(
  roof: Roof,
  levels: PerimeterLevels,
  joists: Float64Array,
  stride: number,
  gap: number,
): Float64Array {
  const hard = Float64Array.from(
    roof.holes.length ? [...roof.us, ...roof.holes.flatMap((h) => [...h.us])] : roof.us,
  ).sort();
  const snap = 1e-6 * Math.max(1, roof.umax - roof.umin);
  const knots: number[] = [];
  for (let j = 0; j < roof.n; j++) {
    const q = (j + 1) % roof.n;
    const kt = levels.t[j];
    for (let k = 0; k < kt.length; k++) {
      if (levels.kind[j][k] === 0) continue;
      knots.push(roof.us[j] + ((roof.us[q] - roof.us[j]) * kt[k]) / roof.len[j]);
    }
  }
  const soft: number[] = [];
  for (let k = 0; k < joists.length; k += stride) soft.push(joists[k]);
  if ((joists.length - 1) % stride !== 0) soft.push(joists[joists.length - 1]);
  const accepted = mergeAway(hard, knots, snap);
  return Float64Array.from(mergeAway(accepted, soft, gap));
}

/** Adds candidates to a sorted list unless one lies within `gap` of an accepted value. */
function mergeAway(accepted: ArrayLike<number>, candidates: ArrayLike<number>, gap: number): number[] {
  // Typed arrays sort numerically without a comparator; repeats are skipped below.
  const sorted = Float64Array.from(accepted).sort();
  const base: number[] = [];
  for (let k = 0; k < sorted.length; k++) if (k === 0 || sorted[k] !== sorted[k - 1]) base.push(sorted[k]);
  const cand = Float64Array.from(candidates).sort();
  const out: number[] = [];
  let i = 0;
  let lastKept = -Infinity;
  for (const c of cand) {
    while (i < base.length && base[i] <= c) out.push(base[i++]);
    const prev = out.length ? out[out.length - 1] : -Infinity;
    const next = i < base.length ? base[i] : Infinity;
    if (c - prev > gap && next - c > gap && c - lastKept > gap && c > base[0] && c < base[base.length - 1]) {
      out.push(c);
      lastKept = c;
    }
  }
  while (i < base.length) out.push(base[i++]);
  return out;
}

/**
 * Meshes the outline on the joist structure (docs/roof-method.md §6): vertical slabs between mesh
 * lines (joist lines, vertex and knot positions) hold trapezoids; stations every `step` along each
 * line; each trapezoid is zipped between its two sides, so triangle areas sum exactly to the
 * outline's area. Levels: perimeter level on the outline, the chord rule inside.
 */
export function buildMesh(
  roof: Roof,
  levels: PerimeterLevels,
  joists: Float64Array,
  options: MeshOptions,
): SurfaceMesh {
  const { n, len, spacing } = roof;
  // Every ring's edges: the outline's (0..n-1), then each opening's; edge e runs from vertex e to
  // vertex next[e]. The even-odd pairing of edges in a slab leaves the openings out.
  const rings = ringsOf(roof);
  const { us, vs, next } = rings;
  const N = us.length;
  const memory = options.memory ?? FRESH;
  // Work bound: estimate stations as lines × stations per line over the bounding box (a thin
  // diagonal roof has few lines, each very long), then thin out the joist lines and lengthen the
  // station step together until the estimate fits.
  const extentU = roof.umax - roof.umin;
  const extentV = roof.vmax - roof.vmin;
  const knots = levels.t.reduce((sum, kt) => sum + kt.length, 0);
  const estimate = (stride: number, step: number) =>
    (extentU / (spacing * stride) + 1 + n + knots) * (extentV / step + 2);
  let factor = Math.max(1, Math.sqrt(estimate(1, spacing) / options.maxVertices));
  while (estimate(Math.ceil(factor - 1e-9), spacing * factor) > options.maxVertices) factor *= 1.25;
  const stride = Math.ceil(factor - 1e-9);
  const step = spacing * factor;
  const U = meshLines(roof, levels, joists, stride, 0.25 * spacing * stride);
  const L = U.length;
  const extent = Math.max(roof.umax - roof.umin, roof.vmax - roof.vmin, 1);
  const tolV = 1e-9 * extent;
  const minGap = 0.25 * step;

  const edgeV = (e: number, u: number): number => vOnEdge(us, vs, next, e, u);

  // Trapezoids of each slab: pairs of edges spanning it, sorted along v at the slab's middle.
  const slabStart = new Int32Array(L);
  const trapBot = new Growable(Int32Array, 4 * L);
  const trapTop = new Growable(Int32Array, 4 * L);
  // Edges spanning the current slab, and each one's v at the slab's middle (indexed by edge).
  const crossing = new Int32Array(N);
  const crossingV = new Float64Array(N);
  // With openings, the outline's own trapezoids too: the chord rule reads levels from them.
  const holes = N > n;
  const outerBot = new Growable(Int32Array, holes ? 4 * L : 0);
  const outerTop = new Growable(Int32Array, holes ? 4 * L : 0);
  const outerStart = new Int32Array(holes ? L : 0);
  for (let j = 0; j + 1 < L; j++) {
    slabStart[j] = trapBot.length;
    const a = U[j];
    const b = U[j + 1];
    const mid = (a + b) / 2;
    let nc = 0;
    for (let e = 0; e < N; e++) {
      const q = next[e];
      const lo = us[e] < us[q] ? us[e] : us[q];
      const hi = us[e] < us[q] ? us[q] : us[e];
      if (lo <= a && hi >= b) {
        crossing[nc++] = e;
        crossingV[e] = edgeV(e, mid);
      }
    }
    // Insertion sort along v: a slab is crossed by few edges, and no comparator is called.
    for (let k = 1; k < nc; k++) {
      const e = crossing[k];
      let i = k;
      while (i > 0 && crossingV[crossing[i - 1]] > crossingV[e]) {
        crossing[i] = crossing[i - 1];
        i--;
      }
      crossing[i] = e;
    }
    for (let k = 0; k + 1 < nc; k += 2) {
      trapBot.push(crossing[k]);
      trapTop.push(crossing[k + 1]);
    }
    if (holes) {
      outerStart[j] = outerBot.length;
      let side = 0;
      for (let k = 0; k < nc; k++) {
        if (crossing[k] >= n) continue;
        if (side++ % 2 === 0) outerBot.push(crossing[k]);
        else outerTop.push(crossing[k]);
      }
    }
  }
  slabStart[L - 1] = trapBot.length;
  if (holes) outerStart[L - 1] = outerBot.length;
  const oBots = outerBot.view();
  const oTops = outerTop.view();
  /** Level at v on line u by the chord rule of the outline alone, read from slab `slab`. */
  const chordZ = (slab: number, u: number, v: number): number => {
    const k1 = slab + 1 < L ? outerStart[slab + 1] : oBots.length;
    let best = outerStart[slab];
    let bestGap = Infinity;
    for (let k = outerStart[slab]; k < k1; k++) {
      const vB = edgeV(oBots[k], u),
        vT = edgeV(oTops[k], u);
      const gap = v < vB ? vB - v : v > vT ? v - vT : 0;
      if (gap < bestGap) {
        bestGap = gap;
        best = k;
      }
    }
    const eB = oBots[best],
      eT = oTops[best];
    const vB = edgeV(eB, u),
      vT = edgeV(eT, u);
    const zB = levelOnEdge(levels, eB, tOnEdge(us, len, next, eB, u));
    const zT = levelOnEdge(levels, eT, tOnEdge(us, len, next, eT, u));
    return vT - vB > 0 ? zB + ((zT - zB) * (v - vB)) / (vT - vB) : zB;
  };
  const bots = trapBot.view();
  const tops = trapTop.view();

  const out = new Stations(memory, Math.ceil((roof.area / (spacing * stride * step)) * 1.1 + 4 * L + 64));
  const lineStart = memory.take(Int32Array, L + 1);
  // Per-line scratch, sized for the worst line.
  const maxSides = 2 * (bots.length > 0 ? N : 1) + 2;
  const sides = new Float64Array(4 * maxSides);
  const maxMarks = 2 * maxSides + levels.t.reduce((sum, kt) => sum + kt.length, 0) + 8;
  const marks = new Marks(maxMarks);
  const coveredLo = new Float64Array(maxSides),
    coveredHi = new Float64Array(maxSides);
  const along: number[] = [];

  const byStart = new Int32Array(maxSides);
  for (let j = 0; j < L; j++) {
    const u = U[j];
    lineStart[j] = out.count;
    let nSides = 0;
    marks.count = 0;
    // Sides of the trapezoids right of the line (slab j) first, then left of it (slab j - 1).
    const from = j > 0 ? slabStart[j - 1] : 0;
    const rightFrom = j + 1 < L ? slabStart[j] : 0;
    const rightTo = j + 1 < L ? slabStart[j + 1] : 0;
    const leftTo = j > 0 ? slabStart[j] : 0;
    for (let pass = 0; pass < 2; pass++) {
      const k0 = pass === 0 ? rightFrom : from;
      const k1 = pass === 0 ? rightTo : leftTo;
      for (let k = k0; k < k1; k++) {
        const eB = bots[k],
          eT = tops[k];
        const tB = tOnEdge(us, len, next, eB, u),
          tT = tOnEdge(us, len, next, eT, u);
        const vB = vOnEdge(us, vs, next, eB, u),
          vT = vOnEdge(us, vs, next, eT, u);
        const slab = pass === 0 ? j : j - 1;
        // An end on an opening's edge takes the deck's level there (docs/roof-method-plans.md
        // P2); its station is marked -2 - opening.
        const zB = eB < n ? levelOnEdge(levels, eB, tB) : chordZ(slab, u, vB);
        const zT = eT < n ? levelOnEdge(levels, eT, tT) : chordZ(slab, u, vT);
        sides[4 * nSides] = vB;
        sides[4 * nSides + 1] = vT;
        sides[4 * nSides + 2] = zB;
        sides[4 * nSides + 3] = zT;
        nSides++;
        marks.add(vB, eB < n ? eB : -2 - rings.hole[eB - n], eB < n ? tB : 0, zB);
        marks.add(vT, eT < n ? eT : -2 - rings.hole[eT - n], eT < n ? tT : 0, zT);
      }
    }
    const rightSides = rightTo - rightFrom;
    along.length = 0;
    for (let e = 0; e < n; e++) {
      const q = next[e];
      if (us[e] !== u || us[q] !== u) continue;
      along.push(e);
      const kt = levels.t[e];
      const dir = vs[q] >= vs[e] ? 1 : -1;
      for (let k = 0; k < kt.length; k++) marks.add(vs[e] + dir * kt[k], e, kt[k], levelOnEdge(levels, e, kt[k]));
    }
    // Union of the sides along v.
    for (let k = 0; k < nSides; k++) {
      let i = k;
      while (i > 0 && sides[4 * byStart[i - 1]] > sides[4 * k]) {
        byStart[i] = byStart[i - 1];
        i--;
      }
      byStart[i] = k;
    }
    let nCovered = 0;
    let covered = 0;
    for (let i = 0; i < nSides; i++) {
      const vB = sides[4 * byStart[i]];
      const vT = sides[4 * byStart[i] + 1];
      if (nCovered > 0 && vB <= coveredHi[nCovered - 1] + tolV)
        coveredHi[nCovered - 1] = Math.max(coveredHi[nCovered - 1], vT);
      else {
        coveredLo[nCovered] = vB;
        coveredHi[nCovered++] = vT;
      }
    }
    for (let c = 0; c < nCovered; c++) covered += coveredHi[c] - coveredLo[c];
    out.ensure(out.count + Math.ceil(covered / step) + marks.count + 2 * nCovered + 4);
    emitLine(out, u, coveredLo, coveredHi, nCovered, marks, sides, rightSides, nSides, roof.vmin, step, minGap, tolV);
    if (along.length) fixAlong(out, lineStart[j], along, vs, n, levels, tolV);
  }
  lineStart[L] = out.count;
  const vc = out.count;
  const V = out.v;

  // Zip each trapezoid between its left side (line j) and right side (line j+1).
  const T = bots.length;
  const ends = memory.take(Float64Array, 4 * T);
  for (let j = 0; j + 1 < L; j++) {
    for (let k = slabStart[j]; k < slabStart[j + 1]; k++) {
      ends[4 * k] = edgeV(bots[k], U[j]);
      ends[4 * k + 1] = edgeV(tops[k], U[j]);
      ends[4 * k + 2] = edgeV(bots[k], U[j + 1]);
      ends[4 * k + 3] = edgeV(tops[k], U[j + 1]);
    }
  }
  const { tri, rungs } = zipSlabs(memory, V, lineStart, slabStart, ends, tolV, vc);
  const tc = tri.length;
  return {
    vertexCount: vc,
    faceCount: tc / 3,
    u: out.u.subarray(0, vc),
    v: out.v.subarray(0, vc),
    z: out.z.subarray(0, vc),
    edge: out.e.subarray(0, vc),
    t: out.t.subarray(0, vc),
    tri,
    rungs,
    link: out.link.subarray(0, vc),
    lineU: U,
    lineStart,
    step,
    stride,
    coarsened: factor > 1,
  };
}

/** Every edge of the mesh once, as pairs of vertex indices: the rungs, then the links. */
export function meshEdges(mesh: SurfaceMesh): Uint32Array {
  const { rungs, link } = mesh;
  let joined = 0;
  for (let i = 0; i < link.length; i++) joined += link[i];
  const edges = new Uint32Array(rungs.length + 2 * joined);
  edges.set(rungs);
  for (let i = 0, k = rungs.length; i < link.length; i++) {
    if (!link[i]) continue;
    edges[k++] = i - 1;
    edges[k++] = i;
  }
  return edges;
}

/** The outline's and the openings' rings as one list of vertices and edges (edge e: e → next[e]). */
export function ringsOf(roof: Roof): { us: Float64Array; vs: Float64Array; next: Int32Array; hole: Int32Array } {
  const { n } = roof;
  const total = n + roof.holes.reduce((sum, h) => sum + h.us.length, 0);
  const us = total === n ? roof.us : new Float64Array(total);
  const vs = total === n ? roof.vs : new Float64Array(total);
  const next = new Int32Array(total);
  const hole = new Int32Array(total - n);
  for (let e = 0; e < n; e++) next[e] = e + 1 === n ? 0 : e + 1;
  if (total > n) {
    us.set(roof.us);
    vs.set(roof.vs);
    let at = n;
    roof.holes.forEach((h, k) => {
      const m = h.us.length;
      us.set(h.us, at);
      vs.set(h.vs, at);
      for (let i = 0; i < m; i++) {
        next[at + i] = at + ((i + 1) % m);
        hole[at + i - n] = k;
      }
      at += m;
    });
  }
  return { us, vs, next, hole };
}

/** v where edge e (vertex e to next[e]) crosses the line at u, its end values exactly at its ends. */
function vOnEdge(us: Float64Array, vs: Float64Array, next: Int32Array, e: number, u: number): number {
  const q = next[e];
  const ua = us[e];
  const ub = us[q];
  if (u === ua) return vs[e];
  if (u === ub) return vs[q];
  let s = (u - ua) / (ub - ua);
  s = s < 0 ? 0 : s > 1 ? 1 : s;
  return vs[e] + s * (vs[q] - vs[e]);
}

/** Distance along outline edge e to where it crosses the line at u (0 for an opening's edge: unused). */
function tOnEdge(us: Float64Array, len: Float64Array, next: Int32Array, e: number, u: number): number {
  if (e >= len.length) return 0;
  const q = next[e];
  const ua = us[e];
  const ub = us[q];
  if (u === ua) return 0;
  if (u === ub) return len[e];
  let s = (u - ua) / (ub - ua);
  s = s < 0 ? 0 : s > 1 ? 1 : s;
  return s * len[e];
}

/** Per-line marks (side ends and knots), kept sorted along v by insertion: a line holds only a handful. */
class Marks {
  v: Float64Array;
  z: Float64Array;
  t: Float64Array;
  e: Int32Array;
  count = 0;
  constructor(size: number) {
    this.v = new Float64Array(size);
    this.z = new Float64Array(size);
    this.t = new Float64Array(size);
    this.e = new Int32Array(size);
  }
  add(v: number, e: number, t: number, z: number): void {
    const { v: V, z: Z, t: T, e: E } = this;
    let k = this.count++;
    while (k > 0 && V[k - 1] > v) {
      V[k] = V[k - 1];
      E[k] = E[k - 1];
      T[k] = T[k - 1];
      Z[k] = Z[k - 1];
      k--;
    }
    V[k] = v;
    E[k] = e;
    T[k] = t;
    Z[k] = z;
  }
}

/** Growable per-vertex arrays of the mesh. */
class Stations {
  u: Float64Array;
  v: Float64Array;
  z: Float64Array;
  e: Int32Array;
  t: Float64Array;
  /** 1 when a station and the one before it on the same line are joined inside the outline. */
  link: Uint8Array;
  count = 0;
  constructor(
    memory: Memory,
    private cap: number,
  ) {
    this.u = memory.take(Float64Array, cap);
    this.v = memory.take(Float64Array, cap);
    this.z = memory.take(Float64Array, cap);
    this.e = memory.take(Int32Array, cap);
    this.t = memory.take(Float64Array, cap);
    this.link = memory.take(Uint8Array, cap);
  }
  ensure(needed: number): void {
    if (needed <= this.cap) return;
    this.cap = Math.max(needed, 2 * this.cap);
    const c = this.count;
    const f = (a: Float64Array) => {
      const b = new Float64Array(this.cap);
      b.set(a.subarray(0, c));
      return b;
    };
    this.u = f(this.u);
    this.v = f(this.v);
    this.z = f(this.z);
    this.t = f(this.t);
    const e = new Int32Array(this.cap);
    e.set(this.e.subarray(0, c));
    this.e = e;
    const link = new Uint8Array(this.cap);
    link.set(this.link.subarray(0, c));
    this.link = link;
  }
}

/**
 * Stations along one mesh line: every mark (side ends, knots) and grid points every `step`,
 * aligned across lines and kept clear of marks. Interior levels by the chord rule, reading the
 * side from the larger-u slab first (sides [0, nRight)), as the probes do.
 */
function emitLine(
  out: Stations,
  u: number,
  coveredLo: Float64Array,
  coveredHi: Float64Array,
  nCovered: number,
  marks: Marks,
  sides: Float64Array,
  nRight: number,
  nSides: number,
  vGrid0: number,
  step: number,
  minGap: number,
  tolV: number,
): void {
  const U = out.u,
    V = out.v,
    Z = out.z,
    E = out.e,
    T = out.t,
    K = out.link;
  const markV = marks.v,
    markZ = marks.z,
    markE = marks.e,
    markT = marks.t,
    nMarks = marks.count;
  let vc = out.count;
  let m = 0;
  let lastV = -Infinity;
  for (let c = 0; c < nCovered; c++) {
    const lo = coveredLo[c];
    const hi = coveredHi[c];
    while (m < nMarks && markV[m] < lo - tolV) m++;
    const firstOfPiece = vc;
    let g = Math.ceil((lo - vGrid0) / step);
    for (;;) {
      const mv = m < nMarks && markV[m] <= hi + tolV ? markV[m] : Infinity;
      const gv = vGrid0 + g * step;
      const gridV = gv < hi - minGap ? gv : Infinity;
      if (mv === Infinity && gridV === Infinity) break;
      if (mv <= gridV) {
        if (mv - lastV > tolV) {
          U[vc] = u;
          V[vc] = mv;
          Z[vc] = markZ[m];
          E[vc] = markE[m];
          T[vc] = markT[m];
          K[vc] = vc > firstOfPiece ? 1 : 0;
          vc++;
          lastV = mv;
        }
        m++;
        continue;
      }
      g++;
      // Grid stations keep clear of marks so no sliver triangles appear.
      if (gridV - lastV < minGap || gridV - lo < minGap || mv - gridV < minGap) continue;
      let z = NaN;
      for (let pass = 0; pass < 2 && z !== z; pass++) {
        const from = pass === 0 ? 0 : nRight;
        const to = pass === 0 ? nRight : nSides;
        for (let k = from; k < to; k++) {
          const vB = sides[4 * k],
            vT = sides[4 * k + 1];
          if (gridV < vB - tolV || gridV > vT + tolV) continue;
          const span = vT - vB;
          z =
            span > 0
              ? sides[4 * k + 2] + ((sides[4 * k + 3] - sides[4 * k + 2]) * (gridV - vB)) / span
              : sides[4 * k + 2];
          break;
        }
      }
      U[vc] = u;
      V[vc] = gridV;
      Z[vc] = z;
      E[vc] = -1;
      T[vc] = 0;
      K[vc] = vc > firstOfPiece ? 1 : 0;
      vc++;
      lastV = gridV;
    }
  }
  out.count = vc;
}

/** Grid stations that fall on an outline edge lying along the line take that edge's level. */
function fixAlong(
  out: Stations,
  start: number,
  along: number[],
  vs: Float64Array,
  n: number,
  levels: PerimeterLevels,
  tol: number,
): void {
  for (let i = start; i < out.count; i++) {
    if (out.e[i] >= 0) continue;
    for (const e of along) {
      const q = e + 1 === n ? 0 : e + 1;
      const v = out.v[i];
      if (v < Math.min(vs[e], vs[q]) - tol || v > Math.max(vs[e], vs[q]) + tol) continue;
      out.e[i] = e;
      out.t[i] = Math.abs(v - vs[e]);
      out.z[i] = levelOnEdge(levels, e, out.t[i]);
      break;
    }
  }
}

/**
 * Triangulates each trapezoid between the stations of its two sides, advancing along whichever
 * side is behind (by fraction of its length). Triangles are counter-clockwise in (u, v).
 */
function zipSlabs(
  memory: Memory,
  V: Float64Array,
  lineStart: Int32Array,
  slabStart: Int32Array,
  ends: Float64Array,
  tolV: number,
  vertexCount: number,
): { tri: Uint32Array; rungs: Uint32Array } {
  let tri = memory.take(Uint32Array, Math.ceil(2.2 * vertexCount) * 3 + 48);
  let tc = 0;
  // Two indices per rung, and about one rung per triangle.
  let rungs = memory.take(Uint32Array, Math.ceil(4.6 * vertexCount) + 48);
  let rc = 0;
  const L = lineStart.length - 1;
  for (let j = 0; j + 1 < L; j++) {
    for (let k = slabStart[j]; k < slabStart[j + 1]; k++) {
      const vBl = ends[4 * k],
        vTl = ends[4 * k + 1],
        vBr = ends[4 * k + 2],
        vTr = ends[4 * k + 3];
      const l0 = lowerBound(V, lineStart[j], lineStart[j + 1], vBl - tolV);
      const l1 = upperBound(V, lineStart[j], lineStart[j + 1], vTl + tolV) - 1;
      const r0 = lowerBound(V, lineStart[j + 1], lineStart[j + 2], vBr - tolV);
      const r1 = upperBound(V, lineStart[j + 1], lineStart[j + 2], vTr + tolV) - 1;
      if (l1 < l0 || r1 < r0) continue;
      const need = tc + 3 * (l1 - l0 + r1 - r0);
      if (need > tri.length) {
        const bigger = new Uint32Array(Math.max(need, 2 * tri.length));
        bigger.set(tri.subarray(0, tc));
        tri = bigger;
      }
      const needRungs = rc + 2 * (l1 - l0 + r1 - r0 + 1);
      if (needRungs > rungs.length) {
        const bigger = new Uint32Array(Math.max(needRungs, 2 * rungs.length));
        bigger.set(rungs.subarray(0, rc));
        rungs = bigger;
      }
      const invL = vTl - vBl > tolV ? 1 / (vTl - vBl) : 1;
      const invR = vTr - vBr > tolV ? 1 / (vTr - vBr) : 1;
      let i = l0;
      let r = r0;
      rungs[rc++] = i;
      rungs[rc++] = r;
      while (i < l1 || r < r1) {
        // Near-ties (equal fractions up to rounding, common on regular outlines) advance the
        // right side, as exact ties do, so a moved or turned spec meshes the same way.
        const advanceLeft =
          i === l1 ? false : r === r1 ? true : (V[i + 1] - vBl) * invL < (V[r + 1] - vBr) * invR - 1e-9;
        tri[tc] = i;
        tri[tc + 1] = r;
        if (advanceLeft) tri[tc + 2] = ++i;
        else tri[tc + 2] = ++r;
        tc += 3;
        // Each triangle adds one new rung across the slab; chain edges come from the lines.
        rungs[rc++] = i;
        rungs[rc++] = r;
      }
    }
  }
  return { tri: tri.subarray(0, tc), rungs: rungs.subarray(0, rc) };
}

function lowerBound(a: Float64Array, lo: number, hi: number, x: number): number {
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (a[mid] < x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

function upperBound(a: Float64Array, lo: number, hi: number, x: number): number {
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (a[mid] <= x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}
