import { chordThrough } from "./chords";
import { fallFromRatio } from "./fall";
import type { Destination, Geodesic } from "./geodesic";
import { highLevelFor, type DrainSpan } from "./high-level";
import { outletsOnEdge, type PerimeterLevels } from "./perimeter";
import { toPlan, type Roof } from "./roof";
import type { FallLine, Point } from "./types";

/**
 * The flattest base fall that keeps every fall line at the minimum fall (docs/roof-method.md §7),
 * by bisection on the slope. The fall lines keep their paths as H changes (the surface scales
 * with H above the drains), so each step costs one pass over the drains, not a re-analysis.
 */
export function minimumBaseFall(spans: DrainSpan[], lines: FallLine[], minFallRatio: number) {
  // No fall lines, no constraint to meet: there is nothing to advise.
  if (spans.length === 0 || lines.length === 0) return null;
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
  x: number;
  y: number;
  /** Internal eaves edge, or -1 for a point (an outlet). */
  edge: number;
  level: number;
  to?: Destination;
}

/** Where a start's water goes in a trial layout, as the nearest drain: path length and drain level. */
interface Reach {
  length: number;
  level: number;
}

const CANDIDATES_PER_EDGE = 12;
const MAX_CANDIDATE_EDGES = 8;

/**
 * Where one more outlet on an outlet edge helps most: try evenly spaced positions and keep the
 * one with the least-flat worst fall line. Each start is sent to its nearest drain by the
 * shortest path inside the outline (a stand-in for where its water goes that needs no new
 * surface); straight-line distance bounds the search, so few paths are traced.
 */
export function bestExtraOutlet(
  roof: Roof,
  levels: PerimeterLevels,
  spans: DrainSpan[],
  geodesic: Geodesic,
): { at: Point; edge: number; longestFallRatio: number; currentLongestFallRatio: number } | undefined {
  const edges = [...new Set(roof.outlets.map((o) => o.edge))]
    .filter((e) => !roof.eaves[e])
    .slice(0, MAX_CANDIDATE_EDGES);
  if (edges.length === 0) return undefined;
  const H = levels.H;
  const targets: Target[] = roof.outlets.map((o) => ({ x: o.x, y: o.y, edge: -1, level: o.level }));
  for (let e = 0; e < roof.n; e++) if (roof.eaves[e]) targets.push({ x: 0, y: 0, edge: e, level: 0 });

  const straight = (sx: number, sy: number, t: Target) => {
    if (t.edge < 0) return Math.hypot(t.x - sx, t.y - sy);
    const q = (t.edge + 1) % roof.n;
    const ax = roof.xs[t.edge],
      ay = roof.ys[t.edge],
      dx = roof.xs[q] - ax,
      dy = roof.ys[q] - ay;
    const s = Math.min(1, Math.max(0, ((sx - ax) * dx + (sy - ay) * dy) / (dx * dx + dy * dy)));
    return Math.hypot(ax + s * dx - sx, ay + s * dy - sy);
  };
  const along = (sx: number, sy: number, t: Target) => {
    t.to ??= t.edge < 0 ? geodesic.toPoint(t.x, t.y) : geodesic.toEdge(t.edge);
    return geodesic.distance(sx, sy, t.to);
  };
  /** The drain a start reaches at the least ratio, trying drains in order of straight distance. */
  const nearest = (sx: number, sy: number, list: Target[], high: number): Reach | null => {
    const order = list
      .map((t) => ({ t, bound: straight(sx, sy, t) / (high - t.level) }))
      .filter((o) => o.bound >= 0 && high > o.t.level)
      .sort((a, b) => a.bound - b.bound);
    let best: Reach | null = null;
    let bestRatio = Infinity;
    for (const { t, bound } of order) {
      if (bound >= bestRatio) break;
      const length = along(sx, sy, t);
      const ratio = length / (high - t.level);
      if (ratio < bestRatio) {
        bestRatio = ratio;
        best = { length, level: t.level };
      }
    }
    return best;
  };
  const ratioOf = (r: Reach | null, high: number) => (r ? r.length / (high - r.level) : 0);

  const base: { x: number; y: number; edge: number; reach: Reach | null }[] = [];
  for (const [x, y] of vertexStarts(roof, levels)) base.push({ x, y, edge: -1, reach: nearest(x, y, targets, H) });
  for (let j = 0; j < roof.n; j++)
    for (const [x, y] of midpoints(roof, j, null)) base.push({ x, y, edge: j, reach: nearest(x, y, targets, H) });
  const current = Math.max(0, ...base.map((b) => ratioOf(b.reach, H)));

  const slope = 1 / roof.baseFall.ratio;
  const derived = roof.highLevelGiven === null;
  let best: { at: Point; edge: number; longestFallRatio: number; currentLongestFallRatio: number } | undefined;
  for (const e of edges) {
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
      let high = H;
      if (derived) {
        const c = chordThrough(roof, u, v);
        high = Math.max(highLevelFor(spans, slope), (c ? Math.max(c.vB - v, v - c.vA) : 0) * slope);
      }
      const extra: Target = { x, y, edge: -1, level: 0 };
      let worst = 0;
      for (const b of base) {
        if (b.edge === e) continue;
        let r = ratioOf(b.reach, high);
        if (high > 0 && Math.hypot(x - b.x, y - b.y) / high < r) r = Math.min(r, along(b.x, b.y, extra) / high);
        worst = Math.max(worst, r);
        if (worst >= current) break;
      }
      if (worst >= current) continue;
      for (const [mx, my] of midpoints(roof, e, t)) {
        worst = Math.max(worst, ratioOf(nearest(mx, my, [...targets, extra], high), high));
      }
      if (worst > 0 && worst < current - 1e-9 && (!best || worst < best.longestFallRatio)) {
        best = {
          at: toPlan(roof, u, v),
          edge: roof.userEdge[e],
          longestFallRatio: worst,
          currentLongestFallRatio: current,
        };
      }
    }
  }
  return best;
}

/** Perimeter vertices at H: starts of fall lines in every layout. */
function vertexStarts(roof: Roof, levels: PerimeterLevels): [number, number][] {
  const starts: [number, number][] = [];
  for (let i = 0; i < roof.n; i++)
    if (Math.abs(levels.vertex[i] - levels.H) <= 1e-12) starts.push([roof.xs[i], roof.ys[i]]);
  return starts;
}

/** Half-way points between the outlets on edge j, with one more outlet at distance `extra` when given. */
function midpoints(roof: Roof, j: number, extra: number | null): [number, number][] {
  if (roof.eaves[j]) return [];
  const ts = outletsOnEdge(roof, j).map((p) => p[0]);
  if (extra !== null) ts.push(extra);
  ts.sort((a, b) => a - b);
  const q = (j + 1) % roof.n;
  const out: [number, number][] = [];
  for (let k = 1; k < ts.length; k++) {
    if (ts[k] - ts[k - 1] <= roof.tol) continue;
    const s = (ts[k] + ts[k - 1]) / 2 / roof.len[j];
    out.push([roof.xs[j] + s * (roof.xs[q] - roof.xs[j]), roof.ys[j] + s * (roof.ys[q] - roof.ys[j])]);
  }
  return out;
}
