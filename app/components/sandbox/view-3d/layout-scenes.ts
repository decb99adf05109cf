import { ShapeUtils, Vector2 } from "three";
import type { Analysis, Point, RoofSpec } from "~/engine";
import { pointsSignedArea } from "~/engine/geometry/area";
import { attachOutlet, edgeEnds, edgeKindsOf, edgeLength } from "../state/spec-edit";

/**
 * Surfaces for the two layouts the side-by-side compares with the shaped roof. The engine gives
 * their figures, not their geometry, so the geometry is rebuilt here from the same rules
 * (docs/roof-method.md §8) and the engine's figures (lip level, high level, widths, falls):
 * - gutter layout: an internal gutter strip of the gutter width along each outlet edge, its sole
 *   rising from each outlet at the gutter fall; a level lip; the field a plane falling at the base
 *   fall to the lip (ridging half-way between two facing gutters);
 * - open edge: the whole roof as one plane falling at the base fall to one edge.
 * Drawing only: every figure shown beside these views comes from the engine.
 */

export interface LayoutSurface {
  /** x, y, level per vertex. */
  positions: number[];
  indices: number[];
  /** Fall ratio N per face; null for a level face; WALL_FACE for the gutter's vertical sides. */
  faceRatio: (number | null)[];
  /** Level at plan points (for labels), null outside. */
  levelAt: (x: number, y: number) => number | null;
  /** Edges worth drawing as lines (the gutter's lip), x, y, level at each end. */
  lines: [[number, number, number], [number, number, number]][];
  high: number;
  low: number;
}

type Line = { nx: number; ny: number; c: number };

/** Marks a vertical face (a gutter side): it has no fall and is drawn in a neutral colour. */
export const WALL_FACE = -1;
type Poly = Point[];

/** Sutherland–Hodgman: the part of a polygon where f(p) >= 0, f linear in the plane. */
export function clipPolygon(poly: Poly, f: (p: Point) => number): Poly {
  const out: Poly = [];
  for (let i = 0; i < poly.length; i++) {
    const a = poly[i];
    const b = poly[(i + 1) % poly.length];
    const fa = f(a);
    const fb = f(b);
    if (fa >= 0) out.push(a);
    if (fa >= 0 !== fb >= 0) {
      const t = fa / (fa - fb);
      out.push([a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])]);
    }
  }
  return out.length >= 3 && Math.abs(pointsSignedArea(out)) > 1e-12 ? out : [];
}

function faceRatioOf(p: number[], a: number, b: number, c: number): number | null {
  const x1 = p[3 * b] - p[3 * a];
  const y1 = p[3 * b + 1] - p[3 * a + 1];
  const z1 = p[3 * b + 2] - p[3 * a + 2];
  const x2 = p[3 * c] - p[3 * a];
  const y2 = p[3 * c + 1] - p[3 * a + 1];
  const z2 = p[3 * c + 2] - p[3 * a + 2];
  const det = x1 * y2 - x2 * y1;
  if (Math.abs(det) < 1e-12) return 1;
  const gx = (z1 * y2 - z2 * y1) / det;
  const gy = (x1 * z2 - x2 * z1) / det;
  const g = Math.hypot(gx, gy);
  return g < 1e-12 ? null : 1 / g;
}

class Builder {
  positions: number[] = [];
  indices: number[] = [];
  faceRatio: (number | null)[] = [];
  lines: LayoutSurface["lines"] = [];

  /** A flat-in-plan polygon with levels from z(p), triangulated by ear clipping. */
  polygon(poly: Poly, z: (p: Point) => number) {
    if (poly.length < 3) return;
    const base = this.positions.length / 3;
    for (const p of poly) this.positions.push(p[0], p[1], z(p));
    const tris = ShapeUtils.triangulateShape(
      poly.map(([x, y]) => new Vector2(x, y)),
      [],
    );
    for (const [a, b, c] of tris) this.face(base + a, base + b, base + c);
  }

  /** A vertical quad from the segment p→q, between levels z0(p)..z1(p). */
  wall(p: Point, q: Point, bottom: (p: Point) => number, top: number) {
    const base = this.positions.length / 3;
    this.positions.push(p[0], p[1], bottom(p), q[0], q[1], bottom(q), q[0], q[1], top, p[0], p[1], top);
    this.indices.push(base, base + 1, base + 2, base, base + 2, base + 3);
    this.faceRatio.push(WALL_FACE, WALL_FACE);
    this.lines.push([
      [p[0], p[1], top],
      [q[0], q[1], top],
    ]);
  }

  private face(a: number, b: number, c: number) {
    this.indices.push(a, b, c);
    this.faceRatio.push(faceRatioOf(this.positions, a, b, c));
  }
}

function inwardLine(outline: Poly, edge: number, ccw: boolean): Line {
  const [a, b] = edgeEnds(outline, edge);
  const len = Math.hypot(b[0] - a[0], b[1] - a[1]);
  const s = ccw ? 1 : -1;
  const nx = (-s * (b[1] - a[1])) / len;
  const ny = (s * (b[0] - a[0])) / len;
  return { nx, ny, c: nx * a[0] + ny * a[1] };
}

const dist = (l: Line, p: Point) => l.nx * p[0] + l.ny * p[1] - l.c;

/** The gutter layout's surface; null when the engine says it is not comparable. */
export function gutterSurface(spec: RoofSpec, analysis: Analysis): LayoutSurface | null {
  const g = analysis.gutter;
  if (!g.comparable || g.lipLevel == null || g.highLevel == null) return null;
  const outline = spec.outline;
  const ccw = pointsSignedArea(outline) > 0;
  const width = g.width;
  const lip = g.lipLevel;
  const soleSlope = 1 / g.fall.ratio;
  const fieldSlope = 1 / analysis.baseFall.ratio;

  // Outlet edges, their outlets (distance along, level), and the distinct gutter lines.
  const byEdge = new Map<number, [number, number][]>();
  spec.outlets.forEach((o) => {
    const { edge, t } = attachOutlet(spec, o.at);
    const list = byEdge.get(edge) ?? [];
    list.push([t * edgeLength(outline, edge), o.level ?? 0]);
    byEdge.set(edge, list);
  });
  const gutters = [...byEdge.entries()].map(([edge, outlets]) => ({
    edge,
    outlets,
    line: inwardLine(outline, edge, ccw),
  }));
  const lines: Line[] = [];
  for (const { line } of gutters) {
    if (
      !lines.some(
        (l) => Math.abs(l.nx - line.nx) < 1e-9 && Math.abs(l.ny - line.ny) < 1e-9 && Math.abs(l.c - line.c) < 1e-3,
      )
    )
      lines.push(line);
  }
  const nearest = (p: Point) => Math.min(...lines.map((l) => dist(l, p)));
  const fieldLevel = (p: Point) => lip + Math.max(0, nearest(p) - width) * fieldSlope;

  const sole = (gutter: (typeof gutters)[number], along: number) =>
    Math.min(...gutter.outlets.map(([t, level]) => level + Math.abs(along - t) * soleSlope));

  const b = new Builder();
  // Field: outside every gutter strip, split where the nearest gutter line changes (a ridge).
  let field: Poly = outline.map((p) => [p[0], p[1]] as Point);
  for (const l of lines) field = clipPolygon(field, (p) => dist(l, p) - width);
  for (const l of lines) {
    let region = field;
    for (const m of lines) if (m !== l) region = clipPolygon(region, (p) => dist(m, p) - dist(l, p));
    b.polygon(region, (p) => lip + Math.max(0, dist(l, p) - width) * fieldSlope);
  }

  // Gutter strips, cut at the outlets and at the high points between them so each piece is planar.
  for (const gutter of gutters) {
    const [a, e] = edgeEnds(outline, gutter.edge);
    const len = edgeLength(outline, gutter.edge);
    const ux = (e[0] - a[0]) / len;
    const uy = (e[1] - a[1]) / len;
    const along = (p: Point) => (p[0] - a[0]) * ux + (p[1] - a[1]) * uy;
    const cuts = new Set<number>([0, len]);
    const sorted = [...gutter.outlets].sort((x, y) => x[0] - y[0]);
    sorted.forEach(([t], k) => {
      cuts.add(t);
      if (k > 0) {
        // Where the two rising pieces meet: equal sole levels.
        const [t0, z0] = sorted[k - 1];
        const meet = (t + t0) / 2 + (sorted[k][1] - z0) / (2 * soleSlope);
        if (meet > t0 && meet < t) cuts.add(meet);
      }
    });
    const stations = [...cuts].filter((t) => t >= 0 && t <= len).sort((x, y) => x - y);
    const levelAlong = (p: Point) => sole(gutter, Math.min(len, Math.max(0, along(p))));
    let strip: Poly = outline.map((p) => [p[0], p[1]] as Point);
    strip = clipPolygon(strip, (p) => width - dist(gutter.line, p));
    for (let k = 0; k + 1 < stations.length; k++) {
      const [t0, t1] = [stations[k], stations[k + 1]];
      if (t1 - t0 < 1e-9) continue;
      let piece = clipPolygon(strip, (p) => along(p) - t0);
      piece = clipPolygon(piece, (p) => t1 - along(p));
      b.polygon(piece, levelAlong);
      // The gutter side: the piece's boundary on the strip's inner line, from sole up to the lip.
      for (let i = 0; i < piece.length; i++) {
        const p = piece[i];
        const q = piece[(i + 1) % piece.length];
        if (Math.abs(dist(gutter.line, p) - width) < 1e-7 && Math.abs(dist(gutter.line, q) - width) < 1e-7)
          b.wall(p, q, levelAlong, lip);
      }
    }
  }

  const inGutter = (p: Point) =>
    gutters.find((gt) => {
      const d = dist(gt.line, p);
      const [a, e] = edgeEnds(outline, gt.edge);
      const len = edgeLength(outline, gt.edge);
      const t = ((p[0] - a[0]) * (e[0] - a[0]) + (p[1] - a[1]) * (e[1] - a[1])) / len;
      return d <= width + 1e-9 && t >= -1e-9 && t <= len + 1e-9;
    });
  const levelAt = (x: number, y: number) => {
    const p: Point = [x, y];
    const gt = inGutter(p);
    if (gt) {
      const [a, e] = edgeEnds(outline, gt.edge);
      const len = edgeLength(outline, gt.edge);
      return sole(gt, ((x - a[0]) * (e[0] - a[0]) + (y - a[1]) * (e[1] - a[1])) / len);
    }
    return fieldLevel(p);
  };
  let low = Infinity;
  let high = -Infinity;
  for (let i = 2; i < b.positions.length; i += 3) {
    low = Math.min(low, b.positions[i]);
    high = Math.max(high, b.positions[i]);
  }
  return { positions: b.positions, indices: b.indices, faceRatio: b.faceRatio, levelAt, high, low, lines: b.lines };
}

/** The open-edge option: one plane rising at the base fall from the engine's chosen edge. */
export function openEdgeSurface(spec: RoofSpec, analysis: Analysis): LayoutSurface {
  const outline = spec.outline;
  const line = inwardLine(outline, analysis.openEdge.edge, pointsSignedArea(outline) > 0);
  const slope = analysis.openEdge.span > 0 ? analysis.openEdge.highLevel / analysis.openEdge.span : 0;
  const levelAt = (x: number, y: number) => Math.max(0, dist(line, [x, y])) * slope;
  const b = new Builder();
  b.polygon(outline, (p) => levelAt(p[0], p[1]));
  return {
    positions: b.positions,
    indices: b.indices,
    faceRatio: b.faceRatio,
    levelAt,
    high: analysis.openEdge.highLevel,
    low: 0,
    lines: [],
  };
}

/** The edges of the outline, turned to eaves where the open-edge option lets water off. */
export function openEdgeKinds(spec: RoofSpec, analysis: Analysis) {
  const kinds = edgeKindsOf(spec);
  kinds[analysis.openEdge.edge] = "eaves";
  return kinds;
}
