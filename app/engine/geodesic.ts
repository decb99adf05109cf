import { signedArea } from "./geometry/area";
import { pointAgainstPolygon, strictlyInside } from "./geometry/inside";
import { orient } from "./geometry/segments";
import type { Roof } from "./roof";

/** True when local plan point (x, y) lies strictly inside an opening (its boundary is deck). */
function inOpening(roof: Roof, x: number, y: number): boolean {
  const tol = roof.tol * 1000;
  for (const h of roof.holes) if (strictlyInside(h.xs, h.ys, x, y, tol)) return true;
  return false;
}

export interface GeodesicPath {
  length: number;
  /** Local plan points from start to end. */
  path: [number, number][];
}

/** A drain as a destination: shortest distances to it from every reflex vertex, found once. */
export interface Destination {
  /** Distance from each reflex vertex to the destination inside the outline (Infinity: none). */
  dist: Float64Array;
  /** Next reflex vertex on the way (-1: straight to the destination's point `endX/endY`). */
  next: Int32Array;
  endX: Float64Array;
  endY: Float64Array;
  /** Where a start that sees the destination goes: the point itself, or the nearest point of the edge. */
  reach(sx: number, sy: number): [number, number][];
  /** The straight distance there when the start sees the destination, else -1 (no arrays made). */
  reachLength(sx: number, sy: number): number;
}

const NONE_F64 = new Float64Array(0);
const NONE_I32 = new Int32Array(0);

/**
 * Shortest paths inside the outline. A shortest path in a simple polygon bends only at reflex
 * vertices (Lozano-Pérez & Wesley 1979), so each destination runs Dijkstra once over the
 * visibility graph of the reflex vertices; a start then takes the reflex vertex it can see that
 * minimises |start − vertex| + distance onwards, trying them in that order. Convex outlines need
 * no search: the straight line is inside.
 */
export class Geodesic {
  private readonly xs: Float64Array;
  private readonly ys: Float64Array;
  private readonly n: number;
  private readonly tol: number;
  /** Where a path may bend: the outline's reflex vertices, then the openings' convex corners. */
  readonly reflex: number[];
  private readonly nx: Float64Array;
  private readonly ny: Float64Array;
  /** Every wall as segments (outline, then openings): x0, y0, x1, y1 each. */
  private readonly walls: Float64Array;
  private readonly open: boolean;
  private reflexVisible: Uint8Array | null = null;

  constructor(private readonly roof: Roof) {
    this.xs = roof.xs;
    this.ys = roof.ys;
    this.n = roof.n;
    this.tol = roof.tol * 1000;
    this.reflex = [];
    const px: number[] = [];
    const py: number[] = [];
    for (let i = 0; i < roof.n; i++) {
      if (!roof.reflex[i]) continue;
      this.reflex.push(i);
      px.push(roof.xs[i]);
      py.push(roof.ys[i]);
    }
    // Openings (docs/roof-method-plans.md P2): water and fall lines go round them, bending at
    // their corners that point out into the deck.
    const walls: number[] = [];
    for (let i = 0; i < roof.n; i++) {
      const q = i + 1 === roof.n ? 0 : i + 1;
      walls.push(roof.xs[i], roof.ys[i], roof.xs[q], roof.ys[q]);
    }
    for (const h of roof.holes) {
      const m = h.xs.length;
      const sign = signedArea(h.xs, h.ys) > 0 ? 1 : -1;
      for (let i = 0; i < m; i++) {
        const a = (i + m - 1) % m,
          q = (i + 1) % m;
        walls.push(h.xs[i], h.ys[i], h.xs[q], h.ys[q]);
        if (sign * orient(h.xs[a], h.ys[a], h.xs[i], h.ys[i], h.xs[q], h.ys[q]) > 0) {
          this.reflex.push(-1);
          px.push(h.xs[i]);
          py.push(h.ys[i]);
        }
      }
    }
    this.nx = Float64Array.from(px);
    this.ny = Float64Array.from(py);
    this.walls = Float64Array.from(walls);
    this.open = roof.convex && roof.holes.length === 0;
  }

  /** True when the segment a→b stays inside the closed outline (touching the boundary is inside). */
  visible(ax: number, ay: number, bx: number, by: number): boolean {
    if (this.open) return true;
    const { walls, tol } = this;
    const ex = bx - ax;
    const ey = by - ay;
    const L = Math.sqrt(ex * ex + ey * ey);
    if (L <= tol) return true;
    const eps = tol * L;
    const loX = Math.min(ax, bx) - tol,
      hiX = Math.max(ax, bx) + tol;
    const loY = Math.min(ay, by) - tol,
      hiY = Math.max(ay, by) + tol;
    let touches: number[] | null = null;
    for (let w = 0; w < walls.length; w += 4) {
      const px = walls[w],
        py = walls[w + 1],
        qx = walls[w + 2],
        qy = walls[w + 3];
      if ((px < loX && qx < loX) || (px > hiX && qx > hiX) || (py < loY && qy < loY) || (py > hiY && qy > hiY))
        continue;
      const o1 = ex * (py - ay) - ey * (px - ax);
      const o2 = ex * (qy - ay) - ey * (qx - ax);
      const fx = qx - px,
        fy = qy - py;
      const o3 = fx * (ay - py) - fy * (ax - px);
      const o4 = fx * (by - py) - fy * (bx - px);
      const eps2 = tol * Math.sqrt(fx * fx + fy * fy);
      if (
        ((o1 > eps && o2 < -eps) || (o1 < -eps && o2 > eps)) &&
        ((o3 > eps2 && o4 < -eps2) || (o3 < -eps2 && o4 > eps2))
      )
        return false;
      // A vertex on the segment splits it: each piece is then checked on its own.
      if (o1 <= eps && o1 >= -eps) {
        const s = ((px - ax) * ex + (py - ay) * ey) / (L * L);
        if (s > 0 && s < 1) (touches ??= []).push(s);
      }
    }
    const cuts = touches ? [0, ...touches.sort((p, q) => p - q), 1] : [0, 1];
    for (let k = 1; k < cuts.length; k++) {
      if (cuts[k] - cuts[k - 1] <= 1e-9) continue;
      const s = (cuts[k] + cuts[k - 1]) / 2;
      if (!this.insideOrOn(ax + s * ex, ay + s * ey)) return false;
      if (this.roof.holes.length && inOpening(this.roof, ax + s * ex, ay + s * ey)) return false;
    }
    return true;
  }

  /** Inside the outline, its boundary (within tol) counted inside. */
  private insideOrOn(x: number, y: number): boolean {
    return pointAgainstPolygon(this.xs, this.ys, x, y, this.tol, this.n) >= 0;
  }

  private matrix(): Uint8Array {
    if (this.reflexVisible) return this.reflexVisible;
    const r = this.reflex.length;
    const m = new Uint8Array(r * r);
    for (let a = 0; a < r; a++) {
      for (let b = a + 1; b < r; b++) {
        const ok = this.visible(this.nx[a], this.ny[a], this.nx[b], this.ny[b]) ? 1 : 0;
        m[a * r + b] = m[b * r + a] = ok;
      }
    }
    this.reflexVisible = m;
    return m;
  }

  /** Dijkstra from a destination over the reflex vertices, given each vertex's direct leg. */
  private destination(
    direct: (x: number, y: number) => [number, number] | null,
    reach: Destination["reach"],
    reachLength: Destination["reachLength"],
  ): Destination {
    const r = this.reflex.length;
    // A convex outline has no reflex vertex: its (empty, never written) tables are shared.
    if (r === 0) return { dist: NONE_F64, next: NONE_I32, endX: NONE_F64, endY: NONE_F64, reach, reachLength };
    const dist = new Float64Array(r).fill(Infinity);
    const next = new Int32Array(r).fill(-1);
    const endX = new Float64Array(r);
    const endY = new Float64Array(r);
    for (let a = 0; a < r; a++) {
      const end = direct(this.nx[a], this.ny[a]);
      if (!end) continue;
      dist[a] = Math.hypot(end[0] - this.nx[a], end[1] - this.ny[a]);
      endX[a] = end[0];
      endY[a] = end[1];
    }
    if (r > 0) {
      const m = this.matrix();
      const done = new Uint8Array(r);
      for (let step = 0; step < r; step++) {
        let a = -1;
        for (let k = 0; k < r; k++) if (!done[k] && dist[k] < Infinity && (a < 0 || dist[k] < dist[a])) a = k;
        if (a < 0) break;
        done[a] = 1;
        for (let b = 0; b < r; b++) {
          if (done[b] || !m[a * r + b]) continue;
          const d = dist[a] + Math.hypot(this.nx[b] - this.nx[a], this.ny[b] - this.ny[a]);
          if (d < dist[b]) {
            dist[b] = d;
            next[b] = a;
          }
        }
      }
    }
    return { dist, next, endX, endY, reach, reachLength };
  }

  /** A point destination (an outlet). */
  toPoint(tx: number, ty: number): Destination {
    return this.destination(
      (x, y) => (this.visible(x, y, tx, ty) ? [tx, ty] : null),
      (sx, sy) =>
        this.visible(sx, sy, tx, ty)
          ? [
              [sx, sy],
              [tx, ty],
            ]
          : [],
      (sx, sy) => (this.visible(sx, sy, tx, ty) ? Math.hypot(tx - sx, ty - sy) : -1),
    );
  }

  /** An edge destination (an eaves edge): its nearest visible point, or else an end of it. */
  toEdge(e: number): Destination {
    const q = (e + 1) % this.n;
    const ax = this.xs[e],
      ay = this.ys[e],
      bx = this.xs[q],
      by = this.ys[q];
    const leg = (x: number, y: number): [number, number] | null => {
      const dx = bx - ax,
        dy = by - ay;
      let s = ((x - ax) * dx + (y - ay) * dy) / (dx * dx + dy * dy);
      s = s < 0 ? 0 : s > 1 ? 1 : s;
      const cx = ax + s * dx,
        cy = ay + s * dy;
      if (this.visible(x, y, cx, cy)) return [cx, cy];
      const da = Math.hypot(ax - x, ay - y),
        db = Math.hypot(bx - x, by - y);
      const ends: [number, number][] =
        da <= db
          ? [
              [ax, ay],
              [bx, by],
            ]
          : [
              [bx, by],
              [ax, ay],
            ];
      for (const [px, py] of ends) if (this.visible(x, y, px, py)) return [px, py];
      return null;
    };
    return this.destination(
      leg,
      (sx, sy) => {
        const end = leg(sx, sy);
        return end ? [[sx, sy], end] : [];
      },
      (sx, sy) => {
        const end = leg(sx, sy);
        return end ? Math.hypot(end[0] - sx, end[1] - sy) : -1;
      },
    );
  }

  /** The length of `path` without building the path (Infinity when there is none). */
  distance(sx: number, sy: number, to: Destination): number {
    const direct = to.reachLength(sx, sy);
    return direct >= 0 ? direct : this.path(sx, sy, to).length;
  }

  /** Shortest path from s to a destination inside the outline; length Infinity when there is none. */
  path(sx: number, sy: number, to: Destination): GeodesicPath {
    const direct = to.reach(sx, sy);
    if (direct.length) {
      const [[x0, y0], [x1, y1]] = direct;
      return { length: Math.hypot(x1 - x0, y1 - y0), path: direct };
    }
    const r = this.reflex.length;
    const order: number[] = [];
    const key = new Float64Array(r);
    for (let a = 0; a < r; a++) {
      if (to.dist[a] === Infinity) continue;
      key[a] = Math.hypot(this.nx[a] - sx, this.ny[a] - sy) + to.dist[a];
      order.push(a);
    }
    order.sort((p, q) => key[p] - key[q]);
    for (const a of order) {
      if (!this.visible(sx, sy, this.nx[a], this.ny[a])) continue;
      const path: [number, number][] = [[sx, sy]];
      let b = a;
      for (let guard = 0; guard <= r && b >= 0; guard++) {
        path.push([this.nx[b], this.ny[b]]);
        if (to.next[b] < 0) path.push([to.endX[b], to.endY[b]]);
        b = to.next[b];
      }
      return { length: key[a], path };
    }
    return { length: Infinity, path: [] };
  }
}
