import Delaunator from "delaunator";
import { fallMap } from "./fall-map";
import { formatRatio } from "./fall";
import { insidePolygon } from "./geometry/inside";
import { nearestOnSegment } from "./geometry/segments";
import { drainSpans, highLevelFor } from "./high-level";
import { dropSchedule, joistPositions } from "./joists";
import { perimeterLevels } from "./perimeter";
import { prepareRoof, type SpecIssue } from "./prepare";
import { priorityFlood, depressions, type Graph } from "./priority-flood";
import { toFrame, type Roof } from "./roof";
import { levelAt } from "./surface";
import type { Band, Point, RoofSpec } from "./types";

/** A level measured on site at a plan point (metres). */
export interface SurveyPoint {
  at: Point;
  level: number;
  label?: string;
}

/** How far the built deck may stray (metres; minFall as 1:N). */
export interface Tolerance {
  deviation: number;
  minFall: number;
  pondDepth: number;
}

/**
 * Defaults where the caller gives none (docs/as-built.md): deviation and pond depth are
 * common practice, no source; the minimum fall is the roof's own (its spec's minFall or its
 * rule set's fall-line value).
 */
export const AS_BUILT_DEFAULTS = {
  /** ±10 mm from the design level at any point: common practice, no source. */
  deviation: 0.01,
  /** Water standing deeper than 5 mm after filling to the spill level: common practice, no source. */
  pondDepth: 0.005,
} as const;

export const AS_BUILT_LIMITS = {
  // 2,000 labelled points fit in the 256 kB body cap of the analyses API.
  maxPoints: 2_000,
  /** A measured point this close to an outline corner or outlet replaces its design level (metres). */
  merge: 0.01,
} as const;

export interface Pond {
  /** The deepest point. */
  at: Point;
  /** Plan area under water at the spill level, m². */
  area: number;
  /** Spill level minus the lowest point, metres. */
  depth: number;
  /** m³. */
  volume: number;
  /** Water level (the spill level), metres. */
  level: number;
}

export interface Deviation {
  at: Point;
  label?: string;
  design: number;
  measured: number;
  /** measured − design, metres: negative is low. */
  delta: number;
}

export interface AsBuiltFailure {
  code: "deviation" | "pond" | "fall";
  message: string;
  at?: Point;
}

export interface JoistFix {
  /** Joist index in the drop schedule. */
  joist: number;
  /** Span index along the joist and which of its ends. */
  span: number;
  end: "start" | "end";
  at: Point;
  /** Metres: positive packs up, negative planes down. */
  change: number;
}

export interface AsBuiltResult {
  deviations: Deviation[];
  surface: {
    fallMap: { faces: number; areaByBand: Band[]; flatterThanMinimumArea: number; area: number };
    catchments: { drain: string; label: string; area: number }[];
    ponds: Pond[];
  };
  verdict: { passed: boolean; failures: AsBuiltFailure[] };
  fixes: JoistFix[];
  tolerance: Tolerance;
  /**
   * The as-built surface for drawing: node positions and levels (measured points first, in
   * request order), triangles as node index triples, and each triangle's fall 1:N (Infinity
   * when level). Not part of the API's answer.
   */
  mesh: { xs: number[]; ys: number[]; zs: number[]; triangles: number[]; ratio: number[] };
}

export type AsBuiltAnswer = { ok: true; result: AsBuiltResult } | { ok: false; status: 400 | 422; issues: SpecIssue[] };

/** The design surface of a prepared roof: its level at any plan point, and its drop schedule. */
function designOf(roof: Roof) {
  const H = roof.highLevelGiven ?? highLevelFor(drainSpans(roof), 1 / roof.baseFall.ratio);
  const levels = perimeterLevels(roof, H);
  const joists = dropSchedule(roof, levels, joistPositions(roof));
  const level = (p: Point) => {
    const [u, v] = toFrame(roof, p[0], p[1]);
    return levelAt(roof, levels, u, v);
  };
  return { H, levels, joists, level };
}

/**
 * The design level at plan points of a spec (docs/roof-method.md §4), the one the as-built check
 * compares with; null for a spec that cannot be shaped or a point outside the outline.
 */
export function designLevelAt(spec: RoofSpec): (p: Point) => number | null {
  const prepared = prepareRoof(spec);
  if (!prepared.ok) return () => null;
  const roof = prepared.roof;
  const design = designOf(roof);
  const ox = Array.from(roof.xs, (x) => x + roof.ox);
  const oy = Array.from(roof.ys, (y) => y + roof.oy);
  return (p) => {
    if (!insidePolygon(ox, oy, p[0], p[1])) {
      let on = false;
      for (let j = 0; j < roof.n && !on; j++) {
        const q = (j + 1) % roof.n;
        on = nearestOnSegment(ox[j], oy[j], ox[q], oy[q], p[0], p[1]).distance <= roof.tol * 1000;
      }
      if (!on) return null;
    }
    return design.level(p);
  };
}

/**
 * The as-built check (docs/as-built.md): a Delaunay triangulation through the measured points
 * and the outline's corners and outlets (design levels where nothing was measured), depressions
 * filled to their spill level by Priority-Flood seeded at the drains, ponds, deviations from the
 * design, a verdict against the tolerances, and the joist ends to pack up or plane down.
 */
export function asBuilt(spec: RoofSpec, points: SurveyPoint[], tolerance: Partial<Tolerance> = {}): AsBuiltAnswer {
  const prepared = prepareRoof(spec);
  if (!prepared.ok) return prepared;
  const roof = prepared.roof;
  if (points.length > AS_BUILT_LIMITS.maxPoints) {
    return {
      ok: false,
      status: 422,
      issues: [{ path: "points", message: `At most ${AS_BUILT_LIMITS.maxPoints} points.` }],
    };
  }
  const design = designOf(roof);
  const tol: Tolerance = {
    deviation: tolerance.deviation ?? AS_BUILT_DEFAULTS.deviation,
    minFall: tolerance.minFall ?? roof.minFall.ratio,
    pondDepth: tolerance.pondDepth ?? AS_BUILT_DEFAULTS.pondDepth,
  };

  // Outline in request coordinates (the roof keeps it about a local origin).
  const ox = Array.from(roof.xs, (x) => x + roof.ox);
  const oy = Array.from(roof.ys, (y) => y + roof.oy);
  const onOutline = (x: number, y: number, within: number) => {
    for (let j = 0; j < roof.n; j++) {
      const q = (j + 1) % roof.n;
      if (nearestOnSegment(ox[j], oy[j], ox[q], oy[q], x, y).distance <= within) return j;
    }
    return -1;
  };
  const inside = (x: number, y: number) => insidePolygon(ox, oy, x, y) || onOutline(x, y, roof.tol * 1000) >= 0;

  const deviations: Deviation[] = [];
  for (let i = 0; i < points.length; i++) {
    const p = points[i];
    const d = inside(p.at[0], p.at[1]) ? design.level(p.at) : null;
    if (d === null) {
      return {
        ok: false,
        status: 422,
        issues: [{ path: `points.${i}.at`, message: `Point (${p.at[0]}, ${p.at[1]}) is outside the roof outline.` }],
      };
    }
    deviations.push({
      at: [p.at[0], p.at[1]],
      ...(p.label ? { label: p.label } : {}),
      design: d,
      measured: p.level,
      delta: p.level - d,
    });
  }

  // Nodes: measured points, then the corners and outlets nothing was measured beside.
  const xs: number[] = [],
    ys: number[] = [],
    zs: number[] = [];
  const near = (x: number, y: number) => {
    for (let i = 0; i < points.length; i++)
      if (Math.hypot(points[i].at[0] - x, points[i].at[1] - y) <= AS_BUILT_LIMITS.merge) return i;
    return -1;
  };
  for (const p of points) {
    xs.push(p.at[0]);
    ys.push(p.at[1]);
    zs.push(p.level);
  }
  const extra = (x: number, y: number, z: number) => {
    const i = near(x, y);
    if (i >= 0) return i;
    xs.push(x);
    ys.push(y);
    zs.push(z);
    return xs.length - 1;
  };
  for (let j = 0; j < roof.n; j++) extra(ox[j], oy[j], design.levels.vertex[j]);
  const seeds: number[] = [];
  const drains: { drain: string; label: string }[] = [];
  for (const o of roof.outlets) {
    seeds.push(extra(o.x + roof.ox, o.y + roof.oy, o.level));
    drains.push({ drain: `outlet-${o.index}`, label: `Outlet ${o.index + 1}` });
  }
  for (let i = 0; i < xs.length; i++) {
    const j = onOutline(xs[i], ys[i], roof.tol * 1000);
    if (j >= 0 && roof.eaves[j]) {
      seeds.push(i);
      drains.push({ drain: `eaves-${roof.userEdge[j]}`, label: `Eaves edge ${roof.userEdge[j] + 1}` });
    }
  }

  // Triangles of the Delaunay triangulation that lie inside the outline (a concave outline's
  // hull has some outside).
  const coords = new Float64Array(xs.length * 2);
  for (let i = 0; i < xs.length; i++) {
    coords[2 * i] = xs[i];
    coords[2 * i + 1] = ys[i];
  }
  const tri: number[] = [];
  if (xs.length >= 3) {
    const del = new Delaunator(coords);
    for (let t = 0; t < del.triangles.length; t += 3) {
      const a = del.triangles[t],
        b = del.triangles[t + 1],
        c = del.triangles[t + 2];
      const cx = (xs[a] + xs[b] + xs[c]) / 3,
        cy = (ys[a] + ys[b] + ys[c]) / 3;
      if (insidePolygon(ox, oy, cx, cy)) tri.push(a, b, c);
    }
  }
  const graph = adjacency(xs.length, tri, zs);
  const flood = priorityFlood(graph, seeds);

  // Fall map on the triangles, by the engine's own banding.
  const F = tri.length / 3;
  const area = new Float64Array(F);
  const slope2 = new Float64Array(F);
  const catchArea = new Float64Array(drains.length);
  for (let f = 0; f < F; f++) {
    const a = tri[3 * f],
      b = tri[3 * f + 1],
      c = tri[3 * f + 2];
    const dx1 = xs[b] - xs[a],
      dy1 = ys[b] - ys[a],
      dz1 = zs[b] - zs[a];
    const dx2 = xs[c] - xs[a],
      dy2 = ys[c] - ys[a],
      dz2 = zs[c] - zs[a];
    const cross = dx1 * dy2 - dx2 * dy1;
    area[f] = Math.abs(cross) / 2;
    if (cross !== 0) {
      // Gradient of the plane through the three vertices.
      const gx = (dz1 * dy2 - dz2 * dy1) / cross;
      const gy = (dx1 * dz2 - dx2 * dz1) / cross;
      slope2[f] = gx * gx + gy * gy;
    }
    for (const v of [a, b, c]) if (flood.label[v] >= 0) catchArea[flood.label[v]] += area[f] / 3;
  }
  const map = fallMap(
    { area, slope2, drain: new Int32Array(F).fill(-1), drainArea: new Float64Array(0) },
    roof.minFall.ratio,
  );
  const catchments = new Map<string, { drain: string; label: string; area: number }>();
  drains.forEach((d, k) => {
    const c = catchments.get(d.drain) ?? { ...d, area: 0 };
    c.area += catchArea[k];
    catchments.set(d.drain, c);
  });

  // Ponds: the filled depressions, their wet area and volume from the triangles around them.
  const { group, depressions: pits } = depressions(graph, flood.filled, 1e-6);
  const ponds: Pond[] = pits.map((d) => ({
    at: [xs[d.deepest], ys[d.deepest]],
    area: 0,
    depth: d.depth,
    volume: 0,
    level: d.level,
  }));
  for (let f = 0; f < F; f++) {
    const vs = [tri[3 * f], tri[3 * f + 1], tri[3 * f + 2]];
    const g = vs.map((v) => group[v]).find((x) => x >= 0);
    if (g === undefined) continue;
    const wet = wetPart(
      vs.map((v) => [xs[v], ys[v], zs[v]] as [number, number, number]),
      ponds[g].level,
    );
    ponds[g].area += wet.area;
    ponds[g].volume += wet.volume;
  }

  // Verdict.
  const failures: AsBuiltFailure[] = [];
  const mm = (m: number) => `${Math.round(m * 1000)} mm`;
  const where = (p: Point) => `(${p[0].toFixed(2)}, ${p[1].toFixed(2)})`;
  for (const d of deviations) {
    if (Math.abs(d.delta) > tol.deviation + 1e-9) {
      failures.push({
        code: "deviation",
        message: `${d.label ? `${d.label} at ` : ""}${where(d.at)} is ${mm(Math.abs(d.delta))} ${d.delta < 0 ? "low" : "high"} (tolerance ±${mm(tol.deviation)}).`,
        at: d.at,
      });
    }
  }
  for (const p of ponds) {
    if (p.depth > tol.pondDepth + 1e-9) {
      failures.push({
        code: "pond",
        message: `Water stands ${mm(p.depth)} deep over ${p.area.toFixed(2)} m² at ${where(p.at)} (tolerance ${mm(tol.pondDepth)}).`,
        at: p.at,
      });
    }
  }
  // Finished fall: from each measured point along its way out (the flood's parent links) to
  // its drain; it fails when flatter than the minimum and flatter than the design gave there.
  const designZ = zs.map((z, i) => (i < deviations.length ? deviations[i].design : z));
  const designFlood = priorityFlood({ ...graph, z: designZ }, seeds);
  for (let i = 0; i < points.length; i++) {
    const built = pathRatio(i, flood.parent, flood.filled, xs, ys);
    const planned = pathRatio(i, designFlood.parent, designFlood.filled, xs, ys);
    if (built > tol.minFall * (1 + 1e-9) && built > planned * (1 + 1e-6)) {
      failures.push({
        code: "fall",
        message: `Water from ${where(deviations[i].at)} falls at ${Number.isFinite(built) ? formatRatio(built) : "level"} to its drain, flatter than ${formatRatio(tol.minFall)}.`,
        at: deviations[i].at,
      });
    }
  }

  // Fixes: the measured point nearest each joist end, when it is out of tolerance or in a pond.
  const fixes: JoistFix[] = [];
  const reach = roof.spacing / 2;
  for (const j of design.joists) {
    j.spans.forEach((s, si) => {
      for (const end of ["start", "end"] as const) {
        const at = s[end];
        let best = -1;
        let bestD = reach;
        for (let i = 0; i < deviations.length; i++) {
          const dd = Math.hypot(deviations[i].at[0] - at[0], deviations[i].at[1] - at[1]);
          if (dd <= bestD) {
            best = i;
            bestD = dd;
          }
        }
        if (best < 0) continue;
        const d = deviations[best];
        const inPond = group[best] >= 0 && ponds[group[best]].depth > tol.pondDepth + 1e-9;
        if (Math.abs(d.delta) > tol.deviation + 1e-9 || (inPond && d.delta < 0)) {
          fixes.push({
            joist: j.index,
            span: si,
            end,
            at: [at[0], at[1]],
            change: Math.round(-d.delta * 10000) / 10000,
          });
        }
      }
    });
  }

  return {
    ok: true,
    result: {
      deviations,
      surface: { fallMap: map, catchments: [...catchments.values()], ponds },
      verdict: { passed: failures.length === 0, failures },
      fixes,
      tolerance: tol,
      mesh: {
        xs,
        ys,
        zs,
        triangles: tri,
        ratio: Array.from(slope2, (q) => (q > 0 ? 1 / Math.sqrt(q) : Infinity)),
      },
    },
  };
}

/** Adjacency (both ways, no repeats) of the triangles' edges. */
function adjacency(n: number, tri: number[], z: number[]): Graph {
  const sets: Set<number>[] = Array.from({ length: n }, () => new Set());
  for (let t = 0; t < tri.length; t += 3) {
    for (let k = 0; k < 3; k++) {
      const a = tri[t + k],
        b = tri[t + ((k + 1) % 3)];
      sets[a].add(b);
      sets[b].add(a);
    }
  }
  const start = new Int32Array(n + 1);
  const adj: number[] = [];
  for (let i = 0; i < n; i++) {
    start[i] = adj.length;
    adj.push(...sets[i]);
  }
  start[n] = adj.length;
  // A node in no triangle (e.g. outside a concave outline's kept triangles) stays unreached.
  return { z: Float64Array.from(z), start, adj: Int32Array.from(adj) };
}

/** Fall 1:N from node i along its parent links to the drain; Infinity when level. */
function pathRatio(i: number, parent: Int32Array, filled: Float64Array, xs: number[], ys: number[]): number {
  let length = 0;
  let c = i;
  let guard = parent.length;
  while (parent[c] >= 0 && guard-- > 0) {
    const p = parent[c];
    length += Math.hypot(xs[c] - xs[p], ys[c] - ys[p]);
    c = p;
  }
  const drop = filled[i] - filled[c];
  if (length === 0) return 0;
  return drop > 1e-12 ? length / drop : Infinity;
}

/**
 * The part of a triangle below water level w (its terrain linear between the vertices): plan
 * area, and volume of water ∫(w − z) over it, which is area × (w − z at the centroid) since
 * w − z is linear there.
 */
export function wetPart(t: [number, number, number][], w: number): { area: number; volume: number } {
  const poly: [number, number, number][] = [];
  for (let k = 0; k < 3; k++) {
    const a = t[k],
      b = t[(k + 1) % 3];
    const aIn = a[2] < w,
      bIn = b[2] < w;
    if (aIn) poly.push(a);
    if (aIn !== bIn) {
      const s = (w - a[2]) / (b[2] - a[2]);
      poly.push([a[0] + s * (b[0] - a[0]), a[1] + s * (b[1] - a[1]), w]);
    }
  }
  if (poly.length < 3) return { area: 0, volume: 0 };
  let area2 = 0,
    cx = 0,
    cy = 0;
  for (let k = 0; k < poly.length; k++) {
    const a = poly[k],
      b = poly[(k + 1) % poly.length];
    const cr = a[0] * b[1] - b[0] * a[1];
    area2 += cr;
    cx += (a[0] + b[0]) * cr;
    cy += (a[1] + b[1]) * cr;
  }
  if (Math.abs(area2) < 1e-15) return { area: 0, volume: 0 };
  cx /= 3 * area2;
  cy /= 3 * area2;
  const area = Math.abs(area2) / 2;
  // Terrain level at the centroid from the triangle's plane.
  const [p, q, r] = t;
  const d1x = q[0] - p[0],
    d1y = q[1] - p[1],
    d1z = q[2] - p[2];
  const d2x = r[0] - p[0],
    d2y = r[1] - p[1],
    d2z = r[2] - p[2];
  const cross = d1x * d2y - d2x * d1y;
  const gx = (d1z * d2y - d2z * d1y) / cross;
  const gy = (d1x * d2z - d2x * d1z) / cross;
  const zc = p[2] + gx * (cx - p[0]) + gy * (cy - p[1]);
  return { area, volume: area * (w - zc) };
}
