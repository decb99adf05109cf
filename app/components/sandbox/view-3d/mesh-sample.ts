import type { Point } from "~/engine";

/**
 * Levels read off a triangle mesh at plan points (for labels and lines drawn on the surface).
 * A uniform grid of buckets over the faces keeps each lookup near-constant time.
 */
export class MeshSampler {
  private readonly cell: number;
  private readonly nx: number;
  private readonly ny: number;
  private readonly minX: number;
  private readonly minY: number;
  private readonly buckets: Int32Array[];

  constructor(private readonly mesh: { positions: ArrayLike<number>; indices: ArrayLike<number> }) {
    const p = mesh.positions;
    let minX = Infinity;
    let minY = Infinity;
    let maxX = -Infinity;
    let maxY = -Infinity;
    for (let i = 0; i < p.length; i += 3) {
      minX = Math.min(minX, p[i]);
      maxX = Math.max(maxX, p[i]);
      minY = Math.min(minY, p[i + 1]);
      maxY = Math.max(maxY, p[i + 1]);
    }
    const faces = mesh.indices.length / 3;
    const side = Math.max(1, Math.ceil(Math.sqrt(faces / 2)));
    this.minX = minX;
    this.minY = minY;
    this.cell = Math.max((maxX - minX) / side, (maxY - minY) / side, 1e-9);
    this.nx = Math.max(1, Math.ceil((maxX - minX) / this.cell) + 1);
    this.ny = Math.max(1, Math.ceil((maxY - minY) / this.cell) + 1);
    const lists: number[][] = Array.from({ length: this.nx * this.ny }, () => []);
    const idx = mesh.indices;
    for (let f = 0; f < faces; f++) {
      let x0 = Infinity;
      let y0 = Infinity;
      let x1 = -Infinity;
      let y1 = -Infinity;
      for (let k = 0; k < 3; k++) {
        const v = idx[3 * f + k] * 3;
        x0 = Math.min(x0, p[v]);
        x1 = Math.max(x1, p[v]);
        y0 = Math.min(y0, p[v + 1]);
        y1 = Math.max(y1, p[v + 1]);
      }
      const [i0, j0] = this.cellOf(x0, y0);
      const [i1, j1] = this.cellOf(x1, y1);
      for (let j = j0; j <= j1; j++) for (let i = i0; i <= i1; i++) lists[j * this.nx + i].push(f);
    }
    this.buckets = lists.map((l) => Int32Array.from(l));
  }

  private cellOf(x: number, y: number): [number, number] {
    const i = Math.min(this.nx - 1, Math.max(0, Math.floor((x - this.minX) / this.cell)));
    const j = Math.min(this.ny - 1, Math.max(0, Math.floor((y - this.minY) / this.cell)));
    return [i, j];
  }

  /** Level at (x, y), or null outside the mesh. Points on an edge (within a hair) count as inside. */
  levelAt(x: number, y: number): number | null {
    const [i, j] = this.cellOf(x, y);
    const p = this.mesh.positions;
    const idx = this.mesh.indices;
    let best: number | null = null;
    let bestMiss = Infinity;
    for (const f of this.buckets[j * this.nx + i]) {
      const a = idx[3 * f] * 3;
      const b = idx[3 * f + 1] * 3;
      const c = idx[3 * f + 2] * 3;
      const det = (p[b + 1] - p[c + 1]) * (p[a] - p[c]) + (p[c] - p[b]) * (p[a + 1] - p[c + 1]);
      if (Math.abs(det) < 1e-18) continue;
      const l1 = ((p[b + 1] - p[c + 1]) * (x - p[c]) + (p[c] - p[b]) * (y - p[c + 1])) / det;
      const l2 = ((p[c + 1] - p[a + 1]) * (x - p[c]) + (p[a] - p[c]) * (y - p[c + 1])) / det;
      const l3 = 1 - l1 - l2;
      const miss = Math.max(0, -l1, -l2, -l3);
      if (miss < bestMiss) {
        bestMiss = miss;
        best = l1 * p[a + 2] + l2 * p[b + 2] + l3 * p[c + 2];
        if (miss === 0) break;
      }
    }
    return bestMiss <= 1e-6 ? best : null;
  }

  /** A plan polyline sampled every `step` metres and lifted onto the surface (points outside are dropped). */
  drape(path: Point[], step: number): [number, number, number][] {
    const out: [number, number, number][] = [];
    for (let s = 0; s < path.length - 1; s++) {
      const [ax, ay] = path[s];
      const [bx, by] = path[s + 1];
      const n = Math.max(1, Math.ceil(Math.hypot(bx - ax, by - ay) / step));
      for (let k = 0; k <= n; k++) {
        if (s > 0 && k === 0) continue;
        const x = ax + ((bx - ax) * k) / n;
        const y = ay + ((by - ay) * k) / n;
        const z = this.levelAt(x, y);
        if (z !== null) out.push([x, y, z]);
      }
    }
    return out;
  }
}
