import Constrainautor from "@kninnug/constrainautor";
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
import { levelAt, perimeterLevelAt } from "./surface";
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
    /**
     * Points taken from the design where the survey was too sparse to follow it (docs/as-built.md):
     * their level is the design's plus the deviation interpolated from the survey around them.
     */
    designPoints: number;
  };
  verdict: { passed: boolean; failures: AsBuiltFailure[] };
  fixes: JoistFix[];
  tolerance: Tolerance;
  /**
   * The as-built surface for drawing: node positions and levels (measured points first, in
   * request order), triangles as node index triples, and each triangle's fall 1:N (Infinity
   * when level). Not part of the API's answer.
   */
  mesh: {
    xs: number[];
    ys: number[];
    zs: number[];
    triangles: number[];
    ratio: number[];
    /** Each node's design level (the design surface on the same triangles). */
    design: number[];
    /** Nodes from this index on are design points added where the survey was sparse. */
    firstDesignPoint: number;
  };
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
  // The deck as built from real joists: each joist's spans as the drop schedule gives them, and
  // straight across between two neighbouring joists (docs/roof-method.md §4, §5). Where the chords
  // change at a re-entrant corner's line the formula of §4 steps; the joists do not.
  const at = joistPositions(roof);
  const spans = joists.map((j) =>
    j.spans.map((s) => {
      const v0 = toFrame(roof, s.start[0], s.start[1])[1],
        v1 = toFrame(roof, s.end[0], s.end[1])[1];
      return { v0, v1, z0: s.startLevel, z1: s.endLevel };
    }),
  );
  const onJoist = (k: number, v: number): number | null => {
    for (const s of spans[k] ?? []) {
      const lo = Math.min(s.v0, s.v1),
        hi = Math.max(s.v0, s.v1);
      if (v < lo - roof.tol || v > hi + roof.tol) continue;
      return hi - lo > 0 ? s.z0 + ((v - s.v0) / (s.v1 - s.v0)) * (s.z1 - s.z0) : s.z0;
    }
    return null;
  };
  const deck = (p: Point): number | null => {
    const [u, v] = toFrame(roof, p[0], p[1]);
    const own = levelAt(roof, levels, u, v);
    if (own === null || perimeterLevelAt(roof, levels, u, v, roof.tol * 1000) !== null) return own;
    if (joists.length !== at.length) return own;
    let k = 0;
    while (k < at.length - 2 && at[k + 1] < u) k++;
    const gap = at[k + 1] - at[k];
    if (!(gap > 0) || u < at[k] - roof.tol || u > at[k + 1] + roof.tol) return own;
    const a = onJoist(k, v),
      b = onJoist(k + 1, v);
    if (a === null || b === null) return own;
    return a + ((u - at[k]) / gap) * (b - a);
  };
  return { H, levels, joists, level, deck };
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

  // The design level at every node (a measured point's own, a corner's or an outlet's): where the
  // design is not flat between survey points (a twist at a re-entrant corner, docs/roof-method.md
  // §4), design points are added with the deviation interpolated from the survey around them.
  const designZ: number[] = zs.map((z, i) => (i < deviations.length ? deviations[i].design : z));
  const measuredNodes = xs.length;
  const outletSeeds = [...seeds];
  const drainNodes = () => {
    const out = [...outletSeeds];
    for (let i = 0; i < xs.length; i++) {
      const j = onOutline(xs[i], ys[i], roof.tol * 1000);
      if (j >= 0 && roof.eaves[j]) out.push(i);
    }
    return out;
  };
  const tri = refineWithDesign(xs, ys, zs, designZ, ox, oy, design.level, inside, AS_BUILT_LIMITS.merge, drainNodes);
  const designPoints = xs.length - measuredNodes;
  for (let i = 0; i < xs.length; i++) {
    const j = onOutline(xs[i], ys[i], roof.tol * 1000);
    if (j >= 0 && roof.eaves[j]) {
      seeds.push(i);
      drains.push({ drain: `eaves-${roof.userEdge[j]}`, label: `Eaves edge ${roof.userEdge[j] + 1}` });
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

  // Ponds: the filled depressions, their wet area and volume from the triangles around them. A
  // depression the design's own levels hold on the same triangles at least as deep at every one
  // of its points is the triangulation's (a twist finer than the points, docs/as-built.md), not
  // the deck's: it is not reported.
  const designFlood = priorityFlood({ ...graph, z: Float64Array.from(designZ) }, seeds);
  const found = depressions(graph, flood.filled, 1e-6);
  const group = found.group;
  const pits: typeof found.depressions = [];
  for (const d of found.depressions) {
    const own = d.nodes.every((c) => flood.filled[c] - zs[c] <= designFlood.filled[c] - designZ[c] + 1e-6);
    for (const c of d.nodes) group[c] = own ? -1 : pits.length;
    if (!own) pits.push(d);
  }
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
      surface: { fallMap: map, catchments: [...catchments.values()], ponds, designPoints },
      verdict: { passed: failures.length === 0, failures },
      fixes,
      tolerance: tol,
      mesh: {
        xs,
        ys,
        zs,
        triangles: tri,
        ratio: Array.from(slope2, (q) => (q > 0 ? 1 / Math.sqrt(q) : Infinity)),
        design: designZ,
        firstDesignPoint: measuredNodes,
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

/**
 * Where design points are added between survey points (docs/as-built.md, "Sparse surveys"): a
 * pit of the design's own levels on the survey's triangles deeper than `pit` (the design has
 * none there: the triangles miss its way out), the shortest triangle edge still split, and caps
 * on the rounds and points added.
 */
export const DESIGN_FILL = { pit: 1e-4, minEdge: 0.1, rounds: 12, maxPoints: 4_000 } as const;

// Barycentric places added in a triangle: the three edge midpoints and the centroid.
const SAMPLES: [number, number, number][] = [
  [0.5, 0.5, 0],
  [0, 0.5, 0.5],
  [0.5, 0, 0.5],
  [1 / 3, 1 / 3, 1 / 3],
];

/**
 * Triangulates the nodes and, where the design's own levels on those triangles hold water that
 * the design sheds (a sparse survey misses the way out, e.g. the valley beside a re-entrant
 * corner's twist, docs/roof-method.md §4), adds design points in the triangles round the pit until
 * it drains or the triangles are small. Each added point takes the design level plus the
 * deviation interpolated linearly from its triangle's corners, so a survey equal to the design
 * gives the design back and a measured fault keeps its size. Appends the added nodes to xs, ys,
 * zs and designZ; returns the triangles.
 */
function refineWithDesign(
  xs: number[],
  ys: number[],
  zs: number[],
  designZ: number[],
  ox: number[],
  oy: number[],
  levelOf: (p: Point) => number | null,
  inside: (x: number, y: number) => boolean,
  onEdge: number,
  seedsOf: () => number[],
): number[] {
  const start = xs.length;
  let tri = triangulateInside(xs, ys, ox, oy, onEdge);
  const seen = new Set<string>();
  for (let round = 0; round < DESIGN_FILL.rounds; round++) {
    const graph = adjacency(xs.length, tri, designZ);
    const flood = priorityFlood(graph, seedsOf());
    const pit = (v: number) => flood.filled[v] - designZ[v] > DESIGN_FILL.pit;
    const before = xs.length;
    for (let t = 0; t < tri.length && xs.length - start < DESIGN_FILL.maxPoints; t += 3) {
      const v = [tri[t], tri[t + 1], tri[t + 2]];
      if (!pit(v[0]) && !pit(v[1]) && !pit(v[2])) continue;
      const edge = (a: number, b: number) => Math.hypot(xs[v[a]] - xs[v[b]], ys[v[a]] - ys[v[b]]);
      const lengths = [edge(0, 1), edge(1, 2), edge(0, 2)];
      for (let s = 0; s < SAMPLES.length; s++) {
        if ((s < 3 ? lengths[s] : Math.max(...lengths)) < DESIGN_FILL.minEdge) continue;
        const b = SAMPLES[s];
        const px = b[0] * xs[v[0]] + b[1] * xs[v[1]] + b[2] * xs[v[2]];
        const py = b[0] * ys[v[0]] + b[1] * ys[v[1]] + b[2] * ys[v[2]];
        const key = `${Math.round(px * 1e4)},${Math.round(py * 1e4)}`;
        if (seen.has(key) || !inside(px, py)) continue;
        seen.add(key);
        const d = levelOf([px, py]);
        if (d === null) continue;
        const delta =
          b[0] * (zs[v[0]] - designZ[v[0]]) + b[1] * (zs[v[1]] - designZ[v[1]]) + b[2] * (zs[v[2]] - designZ[v[2]]);
        xs.push(px);
        ys.push(py);
        designZ.push(d);
        zs.push(d + delta);
      }
    }
    if (xs.length === before) break;
    tri = triangulateInside(xs, ys, ox, oy, onEdge);
  }
  return tri;
}

/**
 * The Delaunay triangulation (delaunator) of the nodes, constrained to the outline's edges
 * (Constrainautor), keeping the triangles inside the outline: an unconstrained one may join the
 * two arms of a U across its notch with an edge whose triangle's centroid is still inside. Each
 * outline edge is constrained piece by piece between the nodes lying on it.
 */
function triangulateInside(xs: number[], ys: number[], ox: number[], oy: number[], onEdge: number): number[] {
  const tri: number[] = [];
  if (xs.length < 3) return tri;
  const coords = new Float64Array(xs.length * 2);
  for (let i = 0; i < xs.length; i++) {
    coords[2 * i] = xs[i];
    coords[2 * i + 1] = ys[i];
  }
  const del = new Delaunator(coords);
  try {
    const con = new Constrainautor(del);
    for (let j = 0; j < ox.length; j++) {
      const q = (j + 1) % ox.length;
      const on: { i: number; s: number }[] = [];
      for (let i = 0; i < xs.length; i++) {
        const near = nearestOnSegment(ox[j], oy[j], ox[q], oy[q], xs[i], ys[i]);
        if (near.distance <= onEdge) on.push({ i, s: near.s });
      }
      on.sort((a, b) => a.s - b.s);
      for (let k = 1; k < on.length; k++) if (on[k].i !== on[k - 1].i) con.constrainOne(on[k - 1].i, on[k].i);
    }
  } catch {
    // Nodes too close to an edge to constrain it cleanly: keep the plain triangulation; the
    // centroid test below still drops the triangles outside.
  }
  for (let t = 0; t < del.triangles.length; t += 3) {
    const a = del.triangles[t],
      b = del.triangles[t + 1],
      c = del.triangles[t + 2];
    const cx = (xs[a] + xs[b] + xs[c]) / 3,
      cy = (ys[a] + ys[b] + ys[c]) / 3;
    if (insidePolygon(ox, oy, cx, cy)) tri.push(a, b, c);
  }
  return tri;
}
