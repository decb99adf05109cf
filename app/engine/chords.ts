import type { Roof } from "./roof";

/** One connected piece of a joist line inside the outline, from A (low v) to B (high v). */
export interface Chord {
  vA: number;
  vB: number;
  edgeA: number;
  edgeB: number;
  /** Distance of each end along its edge. */
  tA: number;
  tB: number;
}

/**
 * The pieces of the line u = u0 inside the outline, sorted along v. Crossings use the half-open
 * rule, so `side` +1 gives the limit from larger u and -1 from smaller u: a line through a vertex
 * or along an edge is read as its neighbour on that side (the usual crossing-number convention).
 */
export function chordsAt(roof: Roof, u0: number, side: 1 | -1): Chord[] {
  const { n, us, vs, len } = roof;
  if (cv.length < n) grow(n);
  let m = 0;
  for (let i = 0; i < n; i++) {
    const q = i + 1 === n ? 0 : i + 1;
    const ua = us[i];
    const ub = us[q];
    const crosses = side > 0 ? ua <= u0 !== ub <= u0 : ua < u0 !== ub < u0;
    if (!crosses) continue;
    let s = (u0 - ua) / (ub - ua);
    s = s < 0 ? 0 : s > 1 ? 1 : s;
    cv[m] = s === 0 ? vs[i] : s === 1 ? vs[q] : vs[i] + s * (vs[q] - vs[i]);
    ce[m] = i;
    ct[m] = s * len[i];
    cs[m] = ((vs[q] - vs[i]) / (ub - ua)) * side;
    m++;
  }
  // Insertion sort by v, then by the edge's slope on that side: a line crosses few edges.
  for (let k = 0; k < m; k++) {
    let i = k;
    while (i > 0 && (cv[order[i - 1]] > cv[k] || (cv[order[i - 1]] === cv[k] && cs[order[i - 1]] > cs[k]))) {
      order[i] = order[i - 1];
      i--;
    }
    order[i] = k;
  }
  const chords: Chord[] = [];
  for (let k = 0; k + 1 < m; k += 2) {
    const a = order[k];
    const b = order[k + 1];
    chords.push({ vA: cv[a], vB: cv[b], edgeA: ce[a], edgeB: ce[b], tA: ct[a], tB: ct[b] });
  }
  return chords;
}

// Crossings of the current line, reused by every call (chordsAt runs to completion, never nested).
let cv = new Float64Array(0);
let ct = new Float64Array(0);
let cs = new Float64Array(0);
let ce = new Int32Array(0);
let order = new Int32Array(0);
function grow(n: number): void {
  cv = new Float64Array(n);
  ct = new Float64Array(n);
  cs = new Float64Array(n);
  ce = new Int32Array(n);
  order = new Int32Array(n);
}

/** The chord holding v (within tol) on the line u0, trying the limit from larger u first. */
export function chordThrough(roof: Roof, u0: number, v: number): Chord | null {
  for (const side of [1, -1] as const) {
    for (const c of chordsAt(roof, u0, side)) if (v >= c.vA - roof.tol && v <= c.vB + roof.tol) return c;
  }
  return null;
}
