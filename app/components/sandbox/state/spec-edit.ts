import type { EdgeKind, Point, RoofSpec } from "~/engine";

/** Pure edits of a roof spec. Outlets ride on their edge: moving a vertex keeps each outlet's place along it. */

export function edgeKindsOf(spec: RoofSpec): EdgeKind[] {
  return spec.outline.map((_, i) => spec.edges?.[i] ?? "parapet");
}

export function edgeEnds(outline: Point[], edge: number): [Point, Point] {
  return [outline[edge], outline[(edge + 1) % outline.length]];
}

export function edgeLength(outline: Point[], edge: number): number {
  const [a, b] = edgeEnds(outline, edge);
  return Math.hypot(b[0] - a[0], b[1] - a[1]);
}

/** Closest point of segment ab to p: its fraction t along ab (0..1), the point, and the distance. */
export function projectOnSegment(p: Point, a: Point, b: Point) {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const len2 = dx * dx + dy * dy;
  const t = len2 === 0 ? 0 : Math.min(1, Math.max(0, ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / len2));
  const point: Point = [a[0] + t * dx, a[1] + t * dy];
  return { t, point, distance: Math.hypot(p[0] - point[0], p[1] - point[1]) };
}

export function pointOnEdge(outline: Point[], edge: number, t: number): Point {
  const [a, b] = edgeEnds(outline, edge);
  return [a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])];
}

/** The edge an outlet sits on (the nearest, preferring parapet edges) and its fraction along it. */
export function attachOutlet(spec: RoofSpec, at: Point): { edge: number; t: number; distance: number } {
  const kinds = edgeKindsOf(spec);
  let best = { edge: 0, t: 0, distance: Infinity };
  for (let e = 0; e < spec.outline.length; e++) {
    const [a, b] = edgeEnds(spec.outline, e);
    const { t, distance } = projectOnSegment(at, a, b);
    // An eaves edge only wins when no parapet edge is close: outlets belong on parapets.
    const score = distance + (kinds[e] === "eaves" ? 1e-6 : 0);
    if (score < best.distance - 1e-12) best = { edge: e, t, distance: score };
  }
  return best;
}

function withOutlets(
  spec: RoofSpec,
  outline: Point[],
  attachments: { edge: number; t: number }[],
  edgeMap: (e: number) => number,
) {
  return spec.outlets.map((o, k) => {
    const a = attachments[k];
    return { ...o, at: pointOnEdge(outline, edgeMap(a.edge), a.t) };
  });
}

const round = (v: number) => Math.round(v * 1e6) / 1e6;
const roundPoint = (p: Point): Point => [round(p[0]), round(p[1])];

export function moveVertex(spec: RoofSpec, index: number, to: Point): RoofSpec {
  const attachments = spec.outlets.map((o) => attachOutlet(spec, o.at));
  const outline = spec.outline.map((p, i) => (i === index ? roundPoint(to) : p));
  return { ...spec, outline, outlets: withOutlets(spec, outline, attachments, (e) => e) };
}

/** Insert a vertex on an edge, at a point on it (default: its midpoint). The new edge keeps the old kind. */
export function insertVertex(spec: RoofSpec, edge: number, at?: Point): RoofSpec {
  if (spec.outline.length >= 200) return spec;
  const [a, b] = edgeEnds(spec.outline, edge);
  const p = at ? projectOnSegment(at, a, b).point : ([(a[0] + b[0]) / 2, (a[1] + b[1]) / 2] as Point);
  const outline = [...spec.outline];
  outline.splice(edge + 1, 0, roundPoint(p));
  const edges = edgeKindsOf(spec);
  edges.splice(edge + 1, 0, edges[edge]);
  return { ...spec, outline, edges };
}

/** Remove a vertex; its two edges merge (taking the first one's kind). A roof keeps at least 3 vertices. */
export function deleteVertex(spec: RoofSpec, index: number): RoofSpec {
  const n = spec.outline.length;
  if (n <= 3) return spec;
  const kinds = edgeKindsOf(spec);
  const prevEdge = (index - 1 + n) % n;
  const outline = spec.outline.filter((_, i) => i !== index);
  const edges = kinds.filter((_, i) => i !== index);
  const mergedEdge = index === 0 ? n - 2 : index - 1;
  const outlets = spec.outlets.map((o) => {
    const { edge } = attachOutlet(spec, o.at);
    if (edge !== prevEdge && edge !== index) return o;
    const [a, b] = edgeEnds(outline, mergedEdge);
    return { ...o, at: roundPoint(projectOnSegment(o.at, a, b).point) };
  });
  edges[mergedEdge] = kinds[prevEdge];
  return { ...spec, outline, edges, outlets };
}

/** Set an edge's kind. Outlets on an edge turned to eaves are removed: water leaves an eaves edge all along it. */
export function setEdgeKind(spec: RoofSpec, edge: number, kind: EdgeKind): RoofSpec {
  const edges = edgeKindsOf(spec);
  edges[edge] = kind;
  const outlets = kind === "eaves" ? spec.outlets.filter((o) => attachOutlet(spec, o.at).edge !== edge) : spec.outlets;
  return { ...spec, edges, outlets };
}

export function outletsOnEdge(spec: RoofSpec, edge: number): number {
  return spec.outlets.filter((o) => attachOutlet(spec, o.at).edge === edge).length;
}

export function addOutlet(spec: RoofSpec, edge: number, t = 0.5): RoofSpec {
  if (spec.outlets.length >= 100) return spec;
  return { ...spec, outlets: [...spec.outlets, { at: roundPoint(pointOnEdge(spec.outline, edge, t)) }] };
}

export function addOutletAt(spec: RoofSpec, at: Point): RoofSpec {
  if (spec.outlets.length >= 100) return spec;
  return { ...spec, outlets: [...spec.outlets, { at: roundPoint(at) }] };
}

export function placeOutlet(spec: RoofSpec, index: number, edge: number, t: number): RoofSpec {
  const at = roundPoint(pointOnEdge(spec.outline, edge, t));
  return { ...spec, outlets: spec.outlets.map((o, k) => (k === index ? { ...o, at } : o)) };
}

/** Slide an outlet along its edge by a distance in metres, stopping at the edge's ends. */
export function nudgeOutlet(spec: RoofSpec, index: number, distance: number): RoofSpec {
  const { edge, t } = attachOutlet(spec, spec.outlets[index].at);
  const length = edgeLength(spec.outline, edge);
  if (length === 0) return spec;
  const next = Math.min(1, Math.max(0, t + distance / length));
  return placeOutlet(spec, index, edge, next);
}

export function deleteOutlet(spec: RoofSpec, index: number): RoofSpec {
  return { ...spec, outlets: spec.outlets.filter((_, k) => k !== index) };
}

export function setOutlet(spec: RoofSpec, index: number, patch: Partial<RoofSpec["outlets"][number]>): RoofSpec {
  return { ...spec, outlets: spec.outlets.map((o, k) => (k === index ? { ...o, ...patch } : o)) };
}

export function bounds(points: Point[]) {
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  for (const [x, y] of points) {
    if (x < minX) minX = x;
    if (y < minY) minY = y;
    if (x > maxX) maxX = x;
    if (y > maxY) maxY = y;
  }
  return { minX, minY, maxX, maxY };
}

/** Joists along a unit direction (the advice's one-click apply), rounded like the settings field. */
export function setJoistDirection(spec: RoofSpec, direction: Point): RoofSpec {
  const d: Point = [Number(direction[0].toFixed(9)) + 0, Number(direction[1].toFixed(9)) + 0];
  return { ...spec, joists: { ...spec.joists, direction: d } };
}

/**
 * Turns the joists of one drainage area (docs/roof-method-plans.md P4, P8): the `areas` entry whose
 * point lies inside the area's outline gets the direction, or a new entry at `at` (a point inside
 * the area, as the analysis gives it) is added. Other areas keep theirs.
 */
export function setAreaJoistDirection(
  spec: RoofSpec,
  area: { at: Point; outline: Point[] },
  direction: Point,
): RoofSpec {
  const d: Point = [Number(direction[0].toFixed(9)) + 0, Number(direction[1].toFixed(9)) + 0];
  const areas = spec.areas ?? [];
  const k = areas.findIndex((e) => insidePolygon(e.at, area.outline));
  if (k >= 0)
    return {
      ...spec,
      areas: areas.map((e, j) => (j === k ? { ...e, joists: { ...e.joists, direction: d } } : e)),
    };
  return { ...spec, areas: [...areas, { at: roundPoint(area.at), joists: { direction: d } }] };
}

/** Whether p lies inside the polygon (even-odd rule; a point on the boundary may go either way). */
function insidePolygon(p: Point, poly: Point[]): boolean {
  let inside = false;
  for (let i = 0, j = poly.length - 1; i < poly.length; j = i++) {
    const [xi, yi] = poly[i];
    const [xj, yj] = poly[j];
    if (yi > p[1] !== yj > p[1] && p[0] < ((xj - xi) * (p[1] - yi)) / (yj - yi) + xi) inside = !inside;
  }
  return inside;
}

type Opening = NonNullable<RoofSpec["openings"]>[number];

/** A square opening of side `size` centred at `centre` (docs/roof-method-plans.md P2); at most 50. */
export function addOpening(spec: RoofSpec, centre: Point, size = 1, kind: Opening["kind"] = "rooflight"): RoofSpec {
  const openings = spec.openings ?? [];
  if (openings.length >= 50) return spec;
  const h = size / 2;
  const [cx, cy] = centre;
  const outline: Point[] = [
    roundPoint([cx - h, cy - h]),
    roundPoint([cx + h, cy - h]),
    roundPoint([cx + h, cy + h]),
    roundPoint([cx - h, cy + h]),
  ];
  return { ...spec, openings: [...openings, { outline, kind }] };
}

/** An opening drawn by two opposite corners (docs/roof-method-plans.md P2); null when it has no width or depth. */
export function addOpeningRect(spec: RoofSpec, a: Point, b: Point, kind: Opening["kind"] = "rooflight"): RoofSpec {
  const openings = spec.openings ?? [];
  const [x0, x1] = [Math.min(a[0], b[0]), Math.max(a[0], b[0])];
  const [y0, y1] = [Math.min(a[1], b[1]), Math.max(a[1], b[1])];
  if (openings.length >= 50 || x1 - x0 < MIN_OPENING || y1 - y0 < MIN_OPENING) return spec;
  const outline: Point[] = [roundPoint([x0, y0]), roundPoint([x1, y0]), roundPoint([x1, y1]), roundPoint([x0, y1])];
  return { ...spec, openings: [...openings, { outline, kind }] };
}

/** The smallest side an opening drawn or resized on the plan keeps, metres. */
export const MIN_OPENING = 0.05;

/** Opening `index` put back at `outline` moved by (dx, dy): a drag moves the shape it started from. */
export function placeOpening(spec: RoofSpec, index: number, outline: Point[], dx: number, dy: number): RoofSpec {
  if (!spec.openings?.[index]) return spec;
  return setOpening(spec, index, { outline: outline.map((p) => roundPoint([p[0] + dx, p[1] + dy])) });
}

/**
 * Moves corner `corner` of opening `index` to `to`. A rectangle with sides along the plan axes
 * stays one (its two neighbouring corners follow, the opposite one stays), and is never made
 * narrower than MIN_OPENING; any other shape moves that corner alone.
 */
export function moveOpeningCorner(spec: RoofSpec, index: number, corner: number, to: Point): RoofSpec {
  const o = spec.openings?.[index];
  if (!o || !o.outline[corner]) return spec;
  const pts = o.outline.map((p) => [p[0], p[1]] as Point);
  const n = pts.length;
  if (n === 4 && isAxisRectangle(pts)) {
    const opposite = pts[(corner + 2) % 4];
    if (Math.abs(to[0] - opposite[0]) < MIN_OPENING || Math.abs(to[1] - opposite[1]) < MIN_OPENING) return spec;
    for (const k of [(corner + 1) % 4, (corner + 3) % 4]) {
      // The side from this corner to k is horizontal (same y) or vertical (same x): k keeps it so.
      if (pts[k][1] === pts[corner][1]) pts[k] = [pts[k][0], to[1]];
      else pts[k] = [to[0], pts[k][1]];
    }
  }
  pts[corner] = to;
  return setOpening(spec, index, { outline: pts.map(roundPoint) });
}

function isAxisRectangle(p: Point[]): boolean {
  const sides = [0, 1, 2, 3].map((k) => [p[k], p[(k + 1) % 4]] as const);
  const horizontal = sides.map(([a, b]) => a[1] === b[1] && a[0] !== b[0]);
  const vertical = sides.map(([a, b]) => a[0] === b[0] && a[1] !== b[1]);
  return (
    (horizontal[0] && vertical[1] && horizontal[2] && vertical[3]) ||
    (vertical[0] && horizontal[1] && vertical[2] && horizontal[3])
  );
}

/** Moves opening `index` by (dx, dy) metres. */
export function moveOpening(spec: RoofSpec, index: number, dx: number, dy: number): RoofSpec {
  const openings = (spec.openings ?? []).map((o, k) =>
    k === index ? { ...o, outline: o.outline.map((p) => roundPoint([p[0] + dx, p[1] + dy])) } : o,
  );
  return { ...spec, openings };
}

export function setOpening(spec: RoofSpec, index: number, patch: Partial<Opening>): RoofSpec {
  return { ...spec, openings: (spec.openings ?? []).map((o, k) => (k === index ? { ...o, ...patch } : o)) };
}

export function deleteOpening(spec: RoofSpec, index: number): RoofSpec {
  const openings = (spec.openings ?? []).filter((_, k) => k !== index);
  const { openings: _dropped, ...rest } = spec;
  void _dropped;
  return openings.length ? { ...spec, openings } : rest;
}

/** The mean of an outline's vertices: where a new opening is put first. */
export function centreOf(points: Point[]): Point {
  const { minX, minY, maxX, maxY } = bounds(points);
  return [(minX + maxX) / 2, (minY + maxY) / 2];
}

type Ridge = NonNullable<RoofSpec["ridges"]>[number];

/** Adds a ridge (docs/roof-method-plans.md P4, a cricket of P5 when its kind says so); at most 50. */
export function addRidge(spec: RoofSpec, ridge: Ridge): RoofSpec {
  const ridges = spec.ridges ?? [];
  if (ridges.length >= 50) return spec;
  return { ...spec, ridges: [...ridges, { ...ridge, line: ridge.line.map((p) => roundPoint(p)) }] };
}

/** A dividing ridge across the roof's middle, from its lowest to its highest wall along y. */
export function defaultRidge(spec: RoofSpec): Ridge {
  const xs = spec.outline.map((p) => p[0]);
  const ys = spec.outline.map((p) => p[1]);
  const x = (Math.min(...xs) + Math.max(...xs)) / 2;
  // Where the vertical line x meets the outline: its lowest and highest crossing.
  const hits: number[] = [];
  spec.outline.forEach((a, i) => {
    const b = spec.outline[(i + 1) % spec.outline.length];
    if (a[0] === b[0]) return;
    const t = (x - a[0]) / (b[0] - a[0]);
    if (t >= 0 && t <= 1) hits.push(a[1] + t * (b[1] - a[1]));
  });
  const low = hits.length ? Math.min(...hits) : Math.min(...ys);
  const high = hits.length ? Math.max(...hits) : Math.max(...ys);
  return {
    line: [
      [x, low],
      [x, high],
    ],
  };
}

export function setRidgePoint(spec: RoofSpec, index: number, point: number, at: Point): RoofSpec {
  return {
    ...spec,
    ridges: (spec.ridges ?? []).map((r, k) =>
      k === index ? { ...r, line: r.line.map((p, j) => (j === point ? roundPoint(at) : p)) } : r,
    ),
  };
}

/** Inserts a point half-way along the ridge's last piece (a bend to move). */
export function addRidgePoint(spec: RoofSpec, index: number): RoofSpec {
  return {
    ...spec,
    ridges: (spec.ridges ?? []).map((r, k) => {
      if (k !== index || r.line.length >= 50) return r;
      const a = r.line[r.line.length - 2];
      const b = r.line[r.line.length - 1];
      const mid = roundPoint([(a[0] + b[0]) / 2, (a[1] + b[1]) / 2]);
      return { ...r, line: [...r.line.slice(0, -1), mid, b] };
    }),
  };
}

/** Inserts a bend at `at` in piece `piece` of ridge `index` (between its points piece and piece + 1). */
export function insertRidgePoint(spec: RoofSpec, index: number, piece: number, at: Point): RoofSpec {
  const r = spec.ridges?.[index];
  if (!r || piece < 0 || piece >= r.line.length - 1 || r.line.length >= 50) return spec;
  const line = [...r.line.slice(0, piece + 1), roundPoint(at), ...r.line.slice(piece + 1)];
  return { ...spec, ridges: spec.ridges!.map((x, k) => (k === index ? { ...x, line } : x)) };
}

export function deleteRidgePoint(spec: RoofSpec, index: number, point: number): RoofSpec {
  return {
    ...spec,
    ridges: (spec.ridges ?? []).map((r, k) =>
      k === index && r.line.length > 2 ? { ...r, line: r.line.filter((_, j) => j !== point) } : r,
    ),
  };
}

export function deleteRidge(spec: RoofSpec, index: number): RoofSpec {
  const ridges = (spec.ridges ?? []).filter((_, k) => k !== index);
  const { ridges: _dropped, ...rest } = spec;
  void _dropped;
  return ridges.length ? { ...spec, ridges } : rest;
}
