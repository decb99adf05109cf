import { signedArea } from "./geometry/area";
import { insidePolygon } from "./geometry/inside";
import { nearestOnSegment, orient } from "./geometry/segments";
import type { Point } from "./types";

/** What an edge of a drainage area is a piece of: an outline edge (request number) or a ridge. */
export type EdgeTag = { kind: "outline"; edge: number } | { kind: "ridge"; ridge: number };

/** A drainage area's polygon, counter-clockwise, with the origin of each edge (edge i: vertex i → i+1). */
export interface Face {
  pts: Point[];
  tags: EdgeTag[];
}

export type Division = { ok: true; faces: Face[] } | { ok: false; path: string; message: string };

const xsOf = (pts: Point[]) => pts.map((p) => p[0]);
const ysOf = (pts: Point[]) => pts.map((p) => p[1]);
const fmt = (p: Point) => `(${+p[0].toFixed(3)}, ${+p[1].toFixed(3)})`;

/** Plan area of a polygon (absolute). */
export function polygonArea(pts: Point[]): number {
  return Math.abs(signedArea(xsOf(pts), ysOf(pts)));
}

/** Distance from p to a polygon's boundary. */
export function boundaryDistance(pts: Point[], p: Point): number {
  let d = Infinity;
  for (let i = 0; i < pts.length; i++) {
    const a = pts[i],
      b = pts[(i + 1) % pts.length];
    d = Math.min(d, nearestOnSegment(a[0], a[1], b[0], b[1], p[0], p[1]).distance);
  }
  return d;
}

/** True when p is inside the polygon or on its boundary (within snap). */
export function insideOrOn(pts: Point[], p: Point, snap: number): boolean {
  return insidePolygon(xsOf(pts), ysOf(pts), p[0], p[1]) || boundaryDistance(pts, p) <= snap;
}

/**
 * A point strictly inside a simple polygon: the middle of the first inside stretch of a level
 * line across it, at a height that meets no vertex.
 */
export function pointInside(pts: Point[]): Point {
  const ys = [...new Set(pts.map((p) => p[1]))].sort((a, b) => a - b);
  // The widest gap between vertex heights gives a line well clear of every vertex.
  let y = (ys[0] + ys[ys.length - 1]) / 2;
  let gap = -1;
  for (let i = 1; i < ys.length; i++) {
    if (ys[i] - ys[i - 1] > gap) {
      gap = ys[i] - ys[i - 1];
      y = (ys[i] + ys[i - 1]) / 2;
    }
  }
  const xs: number[] = [];
  for (let i = 0; i < pts.length; i++) {
    const a = pts[i],
      b = pts[(i + 1) % pts.length];
    if (a[1] > y !== b[1] > y) xs.push(a[0] + ((y - a[1]) * (b[0] - a[0])) / (b[1] - a[1]));
  }
  xs.sort((a, b) => a - b);
  return [(xs[0] + xs[1]) / 2, y];
}

/** Boundary position of p on a face (edge index plus fraction), when within snap; vertices exactly. */
function positionOn(face: Face, p: Point, snap: number): { t: number; at: Point } | null {
  const n = face.pts.length;
  for (let k = 0; k < n; k++) {
    const v = face.pts[k];
    if (Math.hypot(v[0] - p[0], v[1] - p[1]) <= snap) return { t: k, at: v };
  }
  let best: { t: number; at: Point } | null = null;
  let bestD = snap;
  for (let k = 0; k < n; k++) {
    const a = face.pts[k],
      b = face.pts[(k + 1) % n];
    const near = nearestOnSegment(a[0], a[1], b[0], b[1], p[0], p[1]);
    if (near.distance <= bestD) {
      bestD = near.distance;
      best = { t: k + near.s, at: [near.x, near.y] };
    }
  }
  return best;
}

/** The boundary of a face from position tA forward (counter-clockwise) to tB, ends included. */
function walk(face: Face, tA: number, atA: Point, tB: number, atB: Point): Face {
  const n = face.pts.length;
  const span = (((tB - tA) % n) + n) % n;
  const pts: Point[] = [atA];
  const tags: EdgeTag[] = [];
  let m = Math.floor(tA) + 1;
  let last = Math.floor(tA);
  while (m - tA < span - 1e-12) {
    tags.push(face.tags[((last % n) + n) % n]);
    pts.push(face.pts[m % n]);
    last = m;
    m++;
  }
  tags.push(face.tags[((last % n) + n) % n]);
  pts.push(atB);
  return { pts, tags };
}

/** True when segments ab and cd cross at a point inside both (not at an end of either). */
function crossProperly(a: Point, b: Point, c: Point, d: Point): boolean {
  const o1 = orient(a[0], a[1], b[0], b[1], c[0], c[1]);
  const o2 = orient(a[0], a[1], b[0], b[1], d[0], d[1]);
  const o3 = orient(c[0], c[1], d[0], d[1], a[0], a[1]);
  const o4 = orient(c[0], c[1], d[0], d[1], b[0], b[1]);
  return o1 * o2 < 0 && o3 * o4 < 0;
}

/**
 * Cuts the outline into drainage areas along the dividing ridges (docs/roof-method-plans.md P4),
 * one ridge after another: each must run inside one area, from a point on its boundary (an
 * outline edge or an earlier ridge) to another, and leave a piece of real area on both sides.
 * `outline` is in request order; `ridges` holds [request index, line] pairs; `openings` are the
 * opening rings a ridge may not cross. Lengths within `snap` coincide.
 */
export function cutOutlineAlongRidges(
  outline: Point[],
  ridges: [number, Point[]][],
  openings: Point[][],
  snap: number,
): Division {
  const n = outline.length;
  let first: Face = {
    pts: outline.map((p) => [p[0], p[1]]),
    tags: outline.map((_, i) => ({ kind: "outline", edge: i })),
  };
  if (signedArea(xsOf(first.pts), ysOf(first.pts)) < 0) {
    // Clockwise: reverse. New edge j runs from old vertex n-1-j to n-2-j, which is old edge n-2-j.
    first = {
      pts: first.pts.slice().reverse(),
      tags: first.pts.map((_, j) => ({ kind: "outline", edge: (((n - 2 - j) % n) + n) % n })),
    };
  }
  const faces: Face[] = [first];
  for (const [r, raw] of ridges) {
    const path = `ridges.${r}.line`;
    const line: Point[] = [];
    for (const p of raw) {
      const q = line[line.length - 1];
      if (!q || Math.hypot(p[0] - q[0], p[1] - q[1]) > snap) line.push([p[0], p[1]]);
    }
    if (line.length < 2) return { ok: false, path, message: `ridge ${r + 1} has no length` };
    const a = line[0],
      b = line[line.length - 1];
    if (Math.hypot(a[0] - b[0], a[1] - b[1]) <= snap)
      return {
        ok: false,
        path,
        // The area a closed ridge encloses touches no wall (at most one point of one), and
        // outlets sit on walls: it has no outlet and no eaves to drain to (docs/roof-method-plans.md P4).
        message: `ridge ${r + 1} is closed: the area inside it touches no wall, so no outlet or eaves can drain it; run the ridge from wall to wall`,
      };
    // The area it runs in: the one holding the middle of its first piece.
    const mid: Point = [(line[0][0] + line[1][0]) / 2, (line[0][1] + line[1][1]) / 2];
    if (faces.some((face) => boundaryDistance(face.pts, mid) <= snap))
      return {
        ok: false,
        path,
        message: `ridge ${r + 1} does not divide the roof: it runs along the outline or another ridge`,
      };
    const f = faces.findIndex((face) => insidePolygon(xsOf(face.pts), ysOf(face.pts), mid[0], mid[1]));
    if (f < 0) return { ok: false, path, message: `ridge ${r + 1} runs outside the roof outline` };
    const face = faces[f];
    const start = positionOn(face, a, snap);
    const end = positionOn(face, b, snap);
    if (!start || !end) {
      const off = start ? b : a;
      return {
        ok: false,
        path,
        message: `ridge ${r + 1} ends at ${fmt(off)}, off the roof's outline and every other ridge: a ridge runs from wall to wall (within 1 mm)`,
      };
    }
    for (let k = 1; k < line.length - 1; k++) {
      const p = line[k];
      if (!insidePolygon(xsOf(face.pts), ysOf(face.pts), p[0], p[1]) || boundaryDistance(face.pts, p) <= snap)
        return {
          ok: false,
          path,
          message: `ridge ${r + 1} leaves its area at ${fmt(p)}: it must run inside the roof, crossing no other ridge`,
        };
    }
    for (let k = 0; k + 1 < line.length; k++) {
      for (let j = 0; j < face.pts.length; j++) {
        const c = face.pts[j],
          d = face.pts[(j + 1) % face.pts.length];
        // A ridge end lies on the boundary to within snap: rounding may put it just across.
        const endOn = (p: Point) => nearestOnSegment(c[0], c[1], d[0], d[1], p[0], p[1]).distance <= snap;
        if ((k === 0 && endOn(line[0])) || (k + 2 === line.length && endOn(line[k + 1]))) continue;
        if (crossProperly(line[k], line[k + 1], c, d))
          return {
            ok: false,
            path,
            message: `ridge ${r + 1} crosses the outline or another ridge: it must run inside one area`,
          };
      }
      for (let o = 0; o < openings.length; o++) {
        const ring = openings[o];
        const into = insidePolygon(xsOf(ring), ysOf(ring), line[k][0], line[k][1]);
        const crosses = ring.some((c, j) => crossProperly(line[k], line[k + 1], c, ring[(j + 1) % ring.length]));
        if (into || crosses)
          return { ok: false, path, message: `ridge ${r + 1} crosses opening ${o + 1}: a ridge runs round openings` };
      }
    }
    const ridgeTag: EdgeTag = { kind: "ridge", ridge: r };
    const there = walk(face, start.t, start.at, end.t, end.at);
    const back = walk(face, end.t, end.at, start.t, start.at);
    const inner = line.slice(1, -1);
    const one: Face = {
      pts: [...there.pts, ...inner.slice().reverse()],
      tags: [...there.tags, ...line.slice(1).map(() => ridgeTag)],
    };
    const two: Face = {
      pts: [...back.pts, ...inner],
      tags: [...back.tags, ...line.slice(1).map(() => ridgeTag)],
    };
    const areaOne = polygonArea(one.pts);
    const areaTwo = polygonArea(two.pts);
    if (Math.min(areaOne, areaTwo) < snap * snap * 1e3 || Math.abs(start.t - end.t) < 1e-12)
      return {
        ok: false,
        path,
        message: `ridge ${r + 1} does not divide the roof: the area is the same on both its sides`,
      };
    faces.splice(f, 1, one, two);
  }
  return { ok: true, faces };
}
