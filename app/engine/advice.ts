import { chordThrough } from "./chords";
import { fallFromRatio } from "./fall";
import type { Geodesic } from "./geodesic";
import { highLevelFor, type DrainSpan } from "./high-level";
import { outletsOnEdge, type PerimeterLevels } from "./perimeter";
import { toPlan, type Roof } from "./roof";
import type { FallLine, Point } from "./types";

/**
 * The flattest base fall that keeps every fall line at the minimum fall (ROOF-METHOD.md §7),
 * by bisection on the slope. The fall lines keep their paths as H changes (the surface scales
 * with H above the drains), so each step costs one pass over the drains, not a re-analysis.
 */
export function minimumBaseFall(spans: DrainSpan[], lines: FallLine[], minFallRatio: number) {
  if (spans.length === 0) return null;
  const needed = (slope: number) => {
    const H = highLevelFor(spans, slope);
    for (const l of lines) if ((H - l.drainLevel) * minFallRatio < l.length) return false;
    return true;
  };
  let lo = 1e-4;
  let hi = 1;
  if (needed(lo)) return fallFromRatio(1 / lo);
  if (!needed(hi)) return null;
  for (let k = 0; k < 60; k++) {
    const mid = (lo + hi) / 2;
    if (needed(mid)) hi = mid;
    else lo = mid;
  }
  return fallFromRatio(1 / hi);
}

interface Target {
  kind: "outlet" | "eaves";
  x: number;
  y: number;
  edge: number;
  level: number;
}

/** Worst fall ratio when water from each start goes to its nearest drain along the shortest path. */
function worstRatio(
  starts: [number, number][],
  targets: Target[],
  H: number,
  geodesic: Geodesic,
  cache: Map<number, ReturnType<Geodesic["fromStart"]>>,
): number {
  let worst = 0;
  for (let s = 0; s < starts.length; s++) {
    const [sx, sy] = starts[s];
    let from = cache.get(s);
    if (!from) cache.set(s, (from = geodesic.fromStart(sx, sy)));
    let best = Infinity;
    for (const t of targets) {
      const drop = H - t.level;
      if (drop <= 0) continue;
      const length = t.kind === "outlet" ? geodesic.path(sx, sy, t.x, t.y, from).length : geodesic.pathToEdge(sx, sy, t.edge, from).length;
      best = Math.min(best, length / drop);
    }
    if (best < Infinity) worst = Math.max(worst, best);
  }
  return worst;
}

/** Starts for a trial layout: perimeter vertices at H and half-way points between outlets on each edge. */
function trialStarts(roof: Roof, levels: PerimeterLevels, extra: { edge: number; t: number } | null): [number, number][] {
  const starts: [number, number][] = [];
  for (let i = 0; i < roof.n; i++) if (Math.abs(levels.vertex[i] - levels.H) <= 1e-12) starts.push([roof.xs[i], roof.ys[i]]);
  for (let j = 0; j < roof.n; j++) {
    if (roof.eaves[j]) continue;
    const ts = outletsOnEdge(roof, j).map((p) => p[0]);
    if (extra && extra.edge === j) ts.push(extra.t);
    ts.sort((a, b) => a - b);
    const q = (j + 1) % roof.n;
    for (let k = 1; k < ts.length; k++) {
      if (ts[k] - ts[k - 1] <= roof.tol) continue;
      const s = (ts[k] + ts[k - 1]) / 2 / roof.len[j];
      starts.push([roof.xs[j] + s * (roof.xs[q] - roof.xs[j]), roof.ys[j] + s * (roof.ys[q] - roof.ys[j])]);
    }
  }
  return starts;
}

const CANDIDATES_PER_EDGE = 12;

/**
 * Where one more outlet on an outlet edge helps most: try evenly spaced positions and keep the
 * one with the least-flat worst fall line. Each start is sent to its nearest drain, a stand-in
 * for where its water goes that needs no new surface.
 */
export function bestExtraOutlet(
  roof: Roof,
  levels: PerimeterLevels,
  spans: DrainSpan[],
  geodesic: Geodesic,
): { at: Point; edge: number; longestFallRatio: number; currentLongestFallRatio: number } | undefined {
  const edges = [...new Set(roof.outlets.map((o) => o.edge))].filter((e) => !roof.eaves[e]);
  if (edges.length === 0) return undefined;
  const targets: Target[] = roof.outlets.map((o) => ({ kind: "outlet", x: o.x, y: o.y, edge: o.edge, level: o.level }));
  for (let e = 0; e < roof.n; e++) if (roof.eaves[e]) targets.push({ kind: "eaves", x: 0, y: 0, edge: e, level: 0 });
  const slope = 1 / roof.baseFall.ratio;
  const derived = roof.highLevelGiven === null;
  const cache = new Map<number, ReturnType<Geodesic["fromStart"]>>();
  const current = worstRatio(trialStarts(roof, levels, null), targets, levels.H, geodesic, cache);
  let best: { at: Point; edge: number; longestFallRatio: number; currentLongestFallRatio: number } | undefined;
  for (const e of edges.slice(0, 8)) {
    const q = (e + 1) % roof.n;
    const existing = outletsOnEdge(roof, e).map((p) => p[0]);
    for (let k = 0; k < CANDIDATES_PER_EDGE; k++) {
      const t = (roof.len[e] * (k + 0.5)) / CANDIDATES_PER_EDGE;
      if (existing.some((x) => Math.abs(x - t) < 0.5)) continue;
      const s = t / roof.len[e];
      const x = roof.xs[e] + s * (roof.xs[q] - roof.xs[e]);
      const y = roof.ys[e] + s * (roof.ys[q] - roof.ys[e]);
      const u = x * roof.dy - y * roof.dx;
      const v = x * roof.dx + y * roof.dy;
      let H = levels.H;
      if (derived) {
        const c = chordThrough(roof, u, v);
        const span = c ? Math.max(c.vB - v, v - c.vA) : 0;
        H = Math.max(highLevelFor(spans, slope), span * slope);
      }
      const starts = trialStarts(roof, levels, { edge: e, t });
      const ratio = worstRatio(starts, [...targets, { kind: "outlet", x, y, edge: e, level: 0 }], H, geodesic, new Map());
      if (ratio > 0 && ratio < current - 1e-9 && (!best || ratio < best.longestFallRatio)) {
        best = { at: toPlan(roof, u, v), edge: roof.userEdge[e], longestFallRatio: ratio, currentLongestFallRatio: current };
      }
    }
  }
  return best;
}
