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
  const cv: number[] = [];
  const ce: number[] = [];
  const ct: number[] = [];
  const cs: number[] = [];
  for (let i = 0; i < n; i++) {
    const q = i + 1 === n ? 0 : i + 1;
    const ua = us[i];
    const ub = us[q];
    const crosses = side > 0 ? ua <= u0 !== ub <= u0 : ua < u0 !== ub < u0;
    if (!crosses) continue;
    let s = (u0 - ua) / (ub - ua);
    s = s < 0 ? 0 : s > 1 ? 1 : s;
    cv.push(s === 0 ? vs[i] : s === 1 ? vs[q] : vs[i] + s * (vs[q] - vs[i]));
    ce.push(i);
    ct.push(s * len[i]);
    cs.push(((vs[q] - vs[i]) / (ub - ua)) * side);
  }
  // Insertion sort by v, then by the edge's slope on that side: a line crosses few edges.
  const order: number[] = [];
  for (let k = 0; k < cv.length; k++) {
    let i = k;
    while (i > 0 && (cv[order[i - 1]] > cv[k] || (cv[order[i - 1]] === cv[k] && cs[order[i - 1]] > cs[k]))) {
      order[i] = order[i - 1];
      i--;
    }
    order[i] = k;
  }
  const chords: Chord[] = [];
  for (let k = 0; k + 1 < order.length; k += 2) {
    const a = order[k];
    const b = order[k + 1];
    chords.push({ vA: cv[a], vB: cv[b], edgeA: ce[a], edgeB: ce[b], tA: ct[a], tB: ct[b] });
  }
  return chords;
}

/** The chord holding v (within tol) on the line u0, trying the limit from larger u first. */
export function chordThrough(roof: Roof, u0: number, v: number): Chord | null {
  for (const side of [1, -1] as const) {
    for (const c of chordsAt(roof, u0, side)) if (v >= c.vA - roof.tol && v <= c.vB + roof.tol) return c;
  }
  return null;
}
