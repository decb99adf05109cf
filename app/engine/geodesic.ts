import { locatePoint } from "./geometry/contains";
import { nearestOnSegment, segmentsCrossProperly } from "./geometry/segments";
import type { Roof } from "./roof";

export interface GeodesicPath {
  length: number;
  /** Local plan points from start to end. */
  path: [number, number][];
}

/**
 * Shortest paths inside the outline. A shortest path in a simple polygon bends only at reflex
 * vertices, so Dijkstra over the visibility graph of {start, reflex vertices, end} finds it
 * (Lozano-Pérez & Wesley 1979). Convex outlines need no search: the straight line is inside.
 */
export class Geodesic {
  private readonly xs: Float64Array;
  private readonly ys: Float64Array;
  private readonly n: number;
  private readonly tol: number;
  private readonly reflex: number[];
  private reflexVisible: Uint8Array | null = null;

  constructor(private readonly roof: Roof) {
    this.xs = roof.xs;
    this.ys = roof.ys;
    this.n = roof.n;
    this.tol = roof.tol * 1000;
    this.reflex = [];
    for (let i = 0; i < roof.n; i++) if (roof.reflex[i]) this.reflex.push(i);
  }

  /** True when the segment a→b stays inside the closed outline. */
  visible(ax: number, ay: number, bx: number, by: number): boolean {
    if (this.roof.convex) return true;
    const { xs, ys, n, tol } = this;
    const L = Math.hypot(bx - ax, by - ay);
    if (L <= tol) return true;
    const params = [0, 1];
    for (let i = 0; i < n; i++) {
      const q = i + 1 === n ? 0 : i + 1;
      if (segmentsCrossProperly(ax, ay, bx, by, xs[i], ys[i], xs[q], ys[q], tol * L)) return false;
      const near = nearestOnSegment(ax, ay, bx, by, xs[i], ys[i]);
      if (near.distance <= tol) params.push(near.s);
    }
    params.sort((a, b) => a - b);
    for (let k = 1; k < params.length; k++) {
      if (params[k] - params[k - 1] <= 1e-9) continue;
      const s = (params[k] + params[k - 1]) / 2;
      if (locatePoint(xs, ys, ax + s * (bx - ax), ay + s * (by - ay), tol) < 0) return false;
    }
    return true;
  }

  private matrix(): Uint8Array {
    if (this.reflexVisible) return this.reflexVisible;
    const r = this.reflex.length;
    const m = new Uint8Array(r * r);
    for (let a = 0; a < r; a++) {
      for (let b = a + 1; b < r; b++) {
        const i = this.reflex[a], j = this.reflex[b];
        const ok = this.visible(this.xs[i], this.ys[i], this.xs[j], this.ys[j]) ? 1 : 0;
        m[a * r + b] = m[b * r + a] = ok;
      }
    }
    this.reflexVisible = m;
    return m;
  }

  /**
   * Distances from a start to every reflex vertex (Dijkstra), reused for many targets.
   * Returns [distance, previous] per reflex vertex; previous -1 means straight from the start.
   */
  fromStart(sx: number, sy: number): { dist: Float64Array; prev: Int32Array } {
    const r = this.reflex.length;
    const dist = new Float64Array(r).fill(Infinity);
    const prev = new Int32Array(r).fill(-1);
    if (r === 0) return { dist, prev };
    const m = this.matrix();
    const done = new Uint8Array(r);
    for (let a = 0; a < r; a++) {
      const i = this.reflex[a];
      if (this.visible(sx, sy, this.xs[i], this.ys[i])) dist[a] = Math.hypot(this.xs[i] - sx, this.ys[i] - sy);
    }
    for (let step = 0; step < r; step++) {
      let a = -1;
      for (let k = 0; k < r; k++) if (!done[k] && dist[k] < Infinity && (a < 0 || dist[k] < dist[a])) a = k;
      if (a < 0) break;
      done[a] = 1;
      const i = this.reflex[a];
      for (let b = 0; b < r; b++) {
        if (done[b] || !m[a * r + b]) continue;
        const j = this.reflex[b];
        const d = dist[a] + Math.hypot(this.xs[j] - this.xs[i], this.ys[j] - this.ys[i]);
        if (d < dist[b]) {
          dist[b] = d;
          prev[b] = a;
        }
      }
    }
    return { dist, prev };
  }

  /** Shortest path from s to t, using a start's precomputed reflex distances when given. */
  path(sx: number, sy: number, tx: number, ty: number, from = this.fromStart(sx, sy)): GeodesicPath {
    if (this.visible(sx, sy, tx, ty)) return { length: Math.hypot(tx - sx, ty - sy), path: [[sx, sy], [tx, ty]] };
    let bestLen = Infinity;
    let bestVia = -1;
    for (let a = 0; a < this.reflex.length; a++) {
      if (from.dist[a] === Infinity) continue;
      const i = this.reflex[a];
      const d = from.dist[a] + Math.hypot(tx - this.xs[i], ty - this.ys[i]);
      if (d < bestLen && this.visible(this.xs[i], this.ys[i], tx, ty)) {
        bestLen = d;
        bestVia = a;
      }
    }
    if (bestVia < 0) return { length: Infinity, path: [] };
    const chain: [number, number][] = [[tx, ty]];
    for (let a = bestVia; a >= 0; a = from.prev[a]) chain.push([this.xs[this.reflex[a]], this.ys[this.reflex[a]]]);
    chain.push([sx, sy]);
    return { length: bestLen, path: chain.reverse() };
  }

  /** Shortest path from s to the nearest reachable point of internal edge e. */
  pathToEdge(sx: number, sy: number, e: number, from = this.fromStart(sx, sy)): GeodesicPath {
    const q = (e + 1) % this.n;
    const ax = this.xs[e], ay = this.ys[e], bx = this.xs[q], by = this.ys[q];
    const direct = nearestOnSegment(ax, ay, bx, by, sx, sy);
    if (this.visible(sx, sy, direct.x, direct.y)) return { length: direct.distance, path: [[sx, sy], [direct.x, direct.y]] };
    let best: GeodesicPath = { length: Infinity, path: [] };
    for (let a = 0; a < this.reflex.length; a++) {
      if (from.dist[a] === Infinity) continue;
      const i = this.reflex[a];
      const near = nearestOnSegment(ax, ay, bx, by, this.xs[i], this.ys[i]);
      const d = from.dist[a] + near.distance;
      if (d < best.length && this.visible(this.xs[i], this.ys[i], near.x, near.y)) {
        const chain: [number, number][] = [[near.x, near.y]];
        for (let k = a; k >= 0; k = from.prev[k]) chain.push([this.xs[this.reflex[k]], this.ys[this.reflex[k]]]);
        chain.push([sx, sy]);
        best = { length: d, path: chain.reverse() };
      }
    }
    // The edge's ends, in case the nearest point hides behind a corner.
    for (const [px, py] of [[ax, ay], [bx, by]] as const) {
      const p = this.path(sx, sy, px, py, from);
      if (p.length < best.length) best = p;
    }
    return best;
  }
}
