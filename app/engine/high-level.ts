import { chordThrough, chordsAt } from "./chords";
import { nearestOnSegment } from "./geometry/segments";
import type { Roof } from "./roof";

/** A drain with the span of its joist: H ≥ level + span / N (docs/roof-method.md §3). */
export interface DrainSpan {
  kind: "outlet" | "eaves";
  /** Outlet index (request order) or internal eaves edge. */
  index: number;
  level: number;
  span: number;
}

/** Longest distance along a chord from the stretch [p, q] of the line to the chord's ends. */
function spanFrom(vA: number, vB: number, p: number, q: number): number {
  return Math.max(vB - p, q - vA, 0);
}

/**
 * The span through every drain: for an outlet, the chord of the outline along the joist direction
 * that starts at it; for an eaves edge, the longest such chord that starts on it.
 */
export function drainSpans(roof: Roof): DrainSpan[] {
  const spans: DrainSpan[] = [];
  for (const o of roof.outlets) {
    const c = chordThrough(roof, o.u, o.v);
    let span = c ? spanFrom(c.vA, c.vB, o.v, o.v) : 0;
    if (span <= roof.tol) {
      // A corner at the very end of the roof across the joists: the line through it only touches
      // the outline. Read the span from the joists half a spacing either side instead.
      for (const du of [-roof.spacing / 2, roof.spacing / 2]) {
        const u = Math.min(roof.umax, Math.max(roof.umin, o.u + du));
        for (const side of [1, -1] as const)
          for (const k of chordsAt(roof, u, side)) span = Math.max(span, k.vB - k.vA);
      }
    }
    spans.push({ kind: "outlet", index: o.index, level: o.level, span });
  }
  const { n, us, vs } = roof;
  for (let j = 0; j < n; j++) {
    if (!roof.eaves[j]) continue;
    const q = (j + 1) % n;
    const lo = Math.min(us[j], us[q]);
    const hi = Math.max(us[j], us[q]);
    // Chord length is linear in u between vertex positions, so its maximum sits at one of them.
    const samples = new Set<number>([lo, hi]);
    for (let i = 0; i < n; i++) if (us[i] > lo && us[i] < hi) samples.add(us[i]);
    let best = 0;
    for (const u of samples) {
      for (const side of [1, -1] as const) {
        for (const c of chordsAt(roof, u, side)) {
          if (hi - lo <= roof.tol) {
            // An eaves edge along the joist direction: the chord runs through it.
            const p = Math.min(vs[j], vs[q]);
            const r = Math.max(vs[j], vs[q]);
            if (c.vB >= p - roof.tol && c.vA <= r + roof.tol) best = Math.max(best, spanFrom(c.vA, c.vB, p, r));
            continue;
          }
          for (const v of [c.vA, c.vB]) {
            if (nearestOnSegment(us[j], vs[j], us[q], vs[q], u, v).distance <= roof.tol * 10)
              best = Math.max(best, c.vB - c.vA);
          }
        }
      }
    }
    spans.push({ kind: "eaves", index: j, level: 0, span: best });
  }
  return spans;
}

/** H for a base fall given as a slope (1/N): max over drains of level + slope × span. */
export function highLevelFor(spans: DrainSpan[], slope: number): number {
  let H = -Infinity;
  for (const d of spans) H = Math.max(H, d.level + slope * d.span);
  return H;
}
