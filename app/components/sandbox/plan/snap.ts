import type { Point } from "~/engine";
import { projectOnSegment } from "../state/spec-edit";

export interface SnapOptions {
  grid: boolean;
  step: number;
  rightAngles: boolean;
  /** Distance within which a right-angle line catches the point, metres. */
  tolerance: number;
}

interface Line {
  through: Point;
  dir: Point;
}

const snapValue = (v: number, step: number) => Math.round(v / step) * step;

function closestOnLine(p: Point, l: Line): { point: Point; distance: number } {
  const len = Math.hypot(l.dir[0], l.dir[1]);
  const ux = l.dir[0] / len;
  const uy = l.dir[1] / len;
  const s = (p[0] - l.through[0]) * ux + (p[1] - l.through[1]) * uy;
  const point: Point = [l.through[0] + s * ux, l.through[1] + s * uy];
  return { point, distance: Math.hypot(p[0] - point[0], p[1] - point[1]) };
}

function intersect(a: Line, b: Line): Point | null {
  const det = a.dir[0] * b.dir[1] - a.dir[1] * b.dir[0];
  if (Math.abs(det) < 1e-9) return null;
  const t = ((b.through[0] - a.through[0]) * b.dir[1] - (b.through[1] - a.through[1]) * b.dir[0]) / det;
  return [a.through[0] + t * a.dir[0], a.through[1] + t * a.dir[1]];
}

/**
 * Lines on which a moved vertex makes a right angle with its neighbours: square to the neighbour's
 * other edge, or parallel to the plan axes through a neighbour.
 */
function rightAngleLines(outline: Point[], index: number): Line[][] {
  const n = outline.length;
  const at = (k: number) => outline[((k % n) + n) % n];
  const around = (neighbour: Point, beyond: Point): Line[] => {
    const lines: Line[] = [
      { through: neighbour, dir: [1, 0] },
      { through: neighbour, dir: [0, 1] },
    ];
    const dx = neighbour[0] - beyond[0];
    const dy = neighbour[1] - beyond[1];
    if (Math.hypot(dx, dy) > 1e-9 && Math.abs(dx) > 1e-9 && Math.abs(dy) > 1e-9)
      lines.push({ through: neighbour, dir: [-dy, dx] });
    return lines;
  };
  return [around(at(index - 1), at(index - 2)), around(at(index + 1), at(index + 2))];
}

/** Where a vertex dragged to `p` lands: on a right-angle line (or two) when close, else on the grid. */
export function snapVertex(p: Point, outline: Point[], index: number, options: SnapOptions): Point {
  let result: Point = options.grid ? [snapValue(p[0], options.step), snapValue(p[1], options.step)] : p;
  if (!options.rightAngles || outline.length < 3) return result;
  const [fromPrev, fromNext] = rightAngleLines(outline, index);
  const nearest = (lines: Line[]) =>
    lines
      .map((l) => ({ l, ...closestOnLine(p, l) }))
      .filter((c) => c.distance <= options.tolerance)
      .sort((a, b) => a.distance - b.distance)[0];
  const a = nearest(fromPrev);
  const b = nearest(fromNext);
  if (a && b) {
    const x = intersect(a.l, b.l);
    if (x) return x;
  }
  const one = a && b ? (a.distance <= b.distance ? a : b) : (a ?? b);
  if (!one) return result;
  // Keep the grid along the line when the line is axis-parallel, so the point stays on both.
  result = one.point;
  if (options.grid) {
    if (one.l.dir[1] === 0) result = [snapValue(result[0], options.step), result[1]];
    else if (one.l.dir[0] === 0) result = [result[0], snapValue(result[1], options.step)];
  }
  return result;
}

/** Snap a distance along an edge to the grid step. */
export function snapAlong(distance: number, length: number, options: Pick<SnapOptions, "grid" | "step">): number {
  if (!options.grid) return distance;
  const snapped = snapValue(distance, options.step);
  return Math.min(length, Math.max(0, snapped));
}

/**
 * The point of segment ab nearest to `p`, its distance along ab snapped to the grid step: the one
 * rule for everything that rides on a wall (outlets dragged or placed, corners added on an edge,
 * ridge ends set on a wall). `t` is its fraction along ab (0..1).
 */
export function snapOnSegment(
  p: Point,
  a: Point,
  b: Point,
  options: Pick<SnapOptions, "grid" | "step">,
): { t: number; point: Point } {
  const len = Math.hypot(b[0] - a[0], b[1] - a[1]);
  const along = snapAlong(projectOnSegment(p, a, b).t * len, len, options);
  const t = len > 0 ? along / len : 0.5;
  return { t, point: [a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])] };
}

/**
 * Where a point dropped near walls lands: on the nearest of `segments` when it is within `reach`
 * metres (on a corner, a segment's end, when that is within half the reach), else null.
 */
export function snapOnWalls(
  p: Point,
  segments: [Point, Point][],
  reach: number,
  options: Pick<SnapOptions, "grid" | "step">,
): { point: Point; segment: number } | null {
  let best = -1;
  let bestDistance = Infinity;
  segments.forEach(([a, b], k) => {
    const { distance } = projectOnSegment(p, a, b);
    if (distance < bestDistance) {
      bestDistance = distance;
      best = k;
    }
  });
  if (best < 0 || bestDistance > reach) return null;
  let corner: Point | null = null;
  let cornerDistance = reach / 2;
  for (const [a, b] of segments)
    for (const q of [a, b]) {
      const d = Math.hypot(q[0] - p[0], q[1] - p[1]);
      if (d <= cornerDistance) {
        cornerDistance = d;
        corner = q;
      }
    }
  if (corner) return { point: [corner[0], corner[1]], segment: best };
  const [a, b] = segments[best];
  return { point: snapOnSegment(p, a, b, options).point, segment: best };
}

/** A free point (a ridge's bend, an opening's corner) on the grid when the grid snaps. */
export function snapFree(p: Point, options: Pick<SnapOptions, "grid" | "step">): Point {
  return options.grid ? [snapValue(p[0], options.step), snapValue(p[1], options.step)] : p;
}
