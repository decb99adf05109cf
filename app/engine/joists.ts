import { chordsAt, type Chord } from "./chords";
import { levelOnEdge, type PerimeterLevels } from "./perimeter";
import { toPlan, type Roof } from "./roof";
import type { Joist, JoistSpan } from "./types";

/**
 * Joist positions across the roof (frame u): first offset + k × spacing from the extreme edge,
 * the last one against the far wall (docs/roof-method.md §5).
 */
export function joistPositions(roof: Roof): Float64Array {
  const { umin, umax, spacing, offset } = roof;
  const first = umin + Math.min(offset, umax - umin);
  const slack = roof.tol * 10;
  const count = Math.floor((umax - first + slack) / spacing) + 1;
  const last = first + (count - 1) * spacing;
  const total = umax - last > slack ? count + 1 : count;
  const out = new Float64Array(total);
  for (let k = 0; k < count; k++) out[k] = first + k * spacing;
  if (total > count) out[count] = umax;
  else out[count - 1] = Math.min(out[count - 1], umax);
  // A joist within rounding of a vertex's line is put on it exactly: the surface there is read
  // from the wall (the rim tolerance of `levelAt`), so the schedule must read the same wall.
  const snap = roof.tol * 1000;
  const vertexU = Float64Array.from(roof.us).sort();
  for (let k = 0, i = 0; k < total; k++) {
    while (i < vertexU.length && vertexU[i] < out[k] - snap) i++;
    if (i < vertexU.length && Math.abs(vertexU[i] - out[k]) <= snap) out[k] = vertexU[i];
  }
  return out;
}

/**
 * The drop schedule: each joist's spans with end levels, drops below H and fall ratio.
 *
 * A span is a chord (docs/roof-method.md §5), except where the joist line meets the outline
 * inside it (docs/roof-method-plans.md P6): along a wall lying on the joist line the surface is
 * that wall's own level, which rises and falls through its knots (outlets, half-way points), so
 * the joist is split at every knot of the wall, and at a corner the chord passes it is split at
 * the corner's level. Every span end is then the surface's level at that point. Spans are
 * trimmed round openings (P2).
 */
export function dropSchedule(roof: Roof, levels: PerimeterLevels, positions: Float64Array): Joist[] {
  const joists: Joist[] = [];
  const H = levels.H;
  const onVertexLine = new Set<number>(roof.us);
  for (let k = 0; k < positions.length; k++) {
    const u = positions[k];
    const side = u >= roof.umax - roof.tol ? -1 : 1;
    const spans: JoistSpan[] = [];
    const chords = chordsAt(roof, u, side);
    const pieces: Break[][] = [];
    for (const c of chords) {
      const breaks: Break[] = [
        { v: c.vA, z: levelOnEdge(levels, c.edgeA, c.tA) },
        { v: c.vB, z: levelOnEdge(levels, c.edgeB, c.tB) },
      ];
      if (onVertexLine.has(u)) wallBreaks(roof, levels, u, c.vA, c.vB, breaks);
      pieces.push(breaks);
    }
    // A wall on the line that no chord from this side covers still has a joist against it.
    if (onVertexLine.has(u)) pieces.push(...uncoveredWalls(roof, levels, u, chords));
    pieces.sort((a, b) => a[0].v - b[0].v);
    const cuts = roof.holes.length ? holeIntervals(roof, u, side) : NO_CUTS;
    const push = (v0: number, z0: number, v1: number, z1: number) => {
      const length = v1 - v0;
      if (length <= roof.tol) return;
      const rise = Math.abs(z1 - z0);
      // Not `ratio: rise > 1e-12 ? length / rise : null` in the literal below: V8 (Node 20) kept
      // deoptimising that form and compiling it again, for ever, which made the schedule about
      // fifteen times slower than this (README, Performance: API).
      let ratio: number | null = null;
      if (rise > 1e-12) ratio = length / rise;
      spans.push({
        start: toPlan(roof, u, v0),
        end: toPlan(roof, u, v1),
        length,
        startLevel: z0,
        endLevel: z1,
        startDrop: H - z0,
        endDrop: H - z1,
        ratio,
      });
    };
    for (const breaks of pieces) {
      if (breaks.length > 2) breaks.sort((a, b) => a.v - b.v);
      for (let b = 1; b < breaks.length; b++) {
        const from = breaks[b - 1];
        const to = breaks[b];
        // Trimmed round the openings (docs/roof-method-plans.md P2): the pieces left keep the
        // uncut span's levels at their ends.
        let v0 = from.v;
        const at = (v: number) =>
          to.v > from.v ? from.z + ((to.z - from.z) * (v - from.v)) / (to.v - from.v) : from.z;
        for (let c = 0; c < cuts.length; c += 2) {
          const lo = cuts[c],
            hi = cuts[c + 1];
          if (hi <= v0 || lo >= to.v) continue;
          if (lo > v0) push(v0, at(v0), lo, at(lo));
          v0 = Math.max(v0, hi);
        }
        if (v0 < to.v) push(v0, at(v0), to.v, to.z);
      }
    }
    joists.push({ index: k, area: 0, offset: u - roof.umin, spans });
  }
  return joists;
}

const NO_CUTS: number[] = [];

/**
 * Stretches of the line u inside openings, as sorted pairs [lo, hi, lo, hi, ...]. Crossings use
 * the half-open rule of `chordsAt` with the same side, so a line through an opening's corner or
 * along its edge reads as its neighbour on that side.
 */
function holeIntervals(roof: Roof, u: number, side: 1 | -1): number[] {
  const out: number[] = [];
  for (const h of roof.holes) {
    const { us, vs } = h;
    const m = us.length;
    const vsAt: number[] = [];
    for (let i = 0; i < m; i++) {
      const q = i + 1 === m ? 0 : i + 1;
      const ua = us[i],
        ub = us[q];
      const crosses = side > 0 ? ua <= u !== ub <= u : ua < u !== ub < u;
      if (!crosses) continue;
      const s = Math.min(1, Math.max(0, (u - ua) / (ub - ua)));
      vsAt.push(vs[i] + s * (vs[q] - vs[i]));
    }
    vsAt.sort((a, b) => a - b);
    for (let k = 0; k + 1 < vsAt.length; k += 2) out.push(vsAt[k], vsAt[k + 1]);
  }
  // Openings stand apart, so their stretches never overlap: sort the pairs by their start.
  const pairs: [number, number][] = [];
  for (let k = 0; k < out.length; k += 2) pairs.push([out[k], out[k + 1]]);
  pairs.sort((a, b) => a[0] - b[0]);
  return pairs.flat();
}

interface Break {
  v: number;
  z: number;
}

/**
 * The stretches of walls lying on the line u outside every chord of the side read: the wall a
 * bay's last joist stands against when the roof on the other side of the line is shorter (an
 * inner wall of an L). Each stretch comes with the wall's knots and levels.
 */
function uncoveredWalls(roof: Roof, levels: PerimeterLevels, u: number, chords: Chord[]): Break[][] {
  const { n, us, vs } = roof;
  const out: Break[][] = [];
  for (let e = 0; e < n; e++) {
    const q = e + 1 === n ? 0 : e + 1;
    if (us[e] !== u || us[q] !== u) continue;
    const dir = vs[q] >= vs[e] ? 1 : -1;
    const lo = Math.min(vs[e], vs[q]);
    const hi = Math.max(vs[e], vs[q]);
    // The wall less the chords' ranges, as pieces [a, b].
    let pieces: [number, number][] = [[lo, hi]];
    for (const c of chords) {
      const next: [number, number][] = [];
      for (const [a, b] of pieces) {
        if (c.vB <= a + roof.tol || c.vA >= b - roof.tol) next.push([a, b]);
        else {
          if (c.vA - a > roof.tol) next.push([a, c.vA]);
          if (b - c.vB > roof.tol) next.push([c.vB, b]);
        }
      }
      pieces = next;
    }
    const kt = levels.t[e];
    for (const [a, b] of pieces) {
      const at = (v: number) => levelOnEdge(levels, e, Math.abs(v - vs[e]));
      const breaks: Break[] = [
        { v: a, z: at(a) },
        { v: b, z: at(b) },
      ];
      for (let k = 1; k + 1 < kt.length; k++) {
        const v = vs[e] + dir * kt[k];
        if (v > a + roof.tol && v < b - roof.tol) breaks.push({ v, z: levels.z[e][k] });
      }
      out.push(breaks);
    }
  }
  return out;
}

/**
 * Points strictly inside the chord (vA, vB) on the line u where the outline lies on the line:
 * the knots and ends of every wall along it, and every corner on it.
 */
function wallBreaks(roof: Roof, levels: PerimeterLevels, u: number, vA: number, vB: number, out: Break[]): void {
  const { n, us, vs } = roof;
  const inside = (v: number) => v > vA + roof.tol && v < vB - roof.tol;
  for (let e = 0; e < n; e++) {
    const q = e + 1 === n ? 0 : e + 1;
    if (us[e] === u && inside(vs[e])) out.push({ v: vs[e], z: levels.vertex[e] });
    if (us[e] !== u || us[q] !== u) continue;
    const kt = levels.t[e];
    const kz = levels.z[e];
    const dir = vs[q] >= vs[e] ? 1 : -1;
    for (let k = 1; k + 1 < kt.length; k++) {
      const v = vs[e] + dir * kt[k];
      if (inside(v)) out.push({ v, z: kz[k] });
    }
  }
}
