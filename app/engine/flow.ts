import type { FaceData } from "./faces";
import type { SurfaceMesh } from "./mesh";
import type { Roof } from "./roof";

/** A place water can end: an outlet, an eaves edge, or a pit (ponding). */
export interface Drain {
  kind: "outlet" | "eaves" | "pit";
  /** Outlet: request index; eaves: internal edge; pit: pit number. */
  index: number;
  level: number;
  /** A representative mesh vertex (outlet centre, pit bottom). */
  vertex: number;
}

export interface Routing {
  drains: Drain[];
  /** Steepest downhill neighbour of each vertex, -1 at drains and pits. */
  receiver: Int32Array;
  vertexDrain: Int32Array;
  faceDrain: Int32Array;
  drainArea: Float64Array;
}

const FLAT = 1e-9;

/** Drain ids for vertices that are outlets (within the outlet radius) or on an eaves edge. */
function markDrains(roof: Roof, mesh: SurfaceMesh, drains: Drain[]): Int32Array {
  const V = mesh.vertexCount;
  const mark = new Int32Array(V).fill(-1);
  const { n, eaves, len } = roof;
  const eavesIds = new Int32Array(n).fill(-1);
  const eavesOrder = [...Array(n).keys()].filter((e) => eaves[e]).sort((a, b) => roof.userEdge[a] - roof.userEdge[b]);
  for (const e of eavesOrder) {
    eavesIds[e] = drains.length;
    drains.push({ kind: "eaves", index: e, level: 0, vertex: -1 });
  }
  const tolT = roof.tol * 1000;
  for (let i = 0; i < V; i++) {
    const e = mesh.edge[i];
    if (e < 0) continue;
    let id = eavesIds[e];
    if (id < 0 && mesh.t[i] <= tolT) id = eavesIds[(e + n - 1) % n];
    if (id < 0 && mesh.t[i] >= len[e] - tolT) id = eavesIds[(e + 1) % n];
    if (id >= 0) {
      mark[i] = id;
      if (drains[id].vertex < 0) drains[id].vertex = i;
    }
  }
  // Outlets win over eaves at a shared corner: the outlet is the named drain there.
  for (let k = 0; k < roof.outlets.length; k++) {
    const o = roof.outlets[k];
    const r = Math.max(o.radius, roof.tol * 1000);
    let nearest = -1;
    let nearestD = Infinity;
    const { lineU, lineStart } = mesh;
    for (let j = 0; j < lineU.length; j++) {
      if (Math.abs(lineU[j] - o.u) > Math.max(r, mesh.step)) continue;
      for (let s = lineStart[j]; s < lineStart[j + 1]; s++) {
        const d = Math.hypot(mesh.u[s] - o.u, mesh.v[s] - o.v);
        if (d <= r) mark[s] = k;
        if (d < nearestD) {
          nearestD = d;
          nearest = s;
        }
      }
    }
    if (nearest >= 0) mark[nearest] = k;
    drains[k].vertex = nearest;
  }
  return mark;
}

/**
 * Whether a fall `s` towards vertex `to` beats the best so far (`best` towards `current`). Falls
 * equal up to rounding are ties, settled by the frame position of the lower vertex (lower v, then
 * lower u): on a ridge, water must not go one way or the other by the rounding of a move.
 */
function steeper(s: number, best: number, to: number, current: number, u: Float64Array, v: Float64Array): boolean {
  if (current < 0 || s > best * (1 + 1e-9)) return true;
  if (s < best * (1 - 1e-9)) return false;
  const dv = v[to] - v[current];
  if (dv < -1e-9 || dv > 1e-9) return dv < 0;
  return u[to] < u[current];
}

/**
 * Where the water goes (ROOF-METHOD.md §7): each vertex drains to its steepest downhill neighbour
 * (lower by more than rounding); level patches drain through a neighbour at the same level
 * whose water already reaches a drain; what is left are pits. Each face goes to the drain of its
 * lowest vertex.
 */
export function routeWater(roof: Roof, mesh: SurfaceMesh, faces: FaceData): Routing {
  const V = mesh.vertexCount;
  const F = mesh.faceCount;
  const { u, v, z, tri } = mesh;
  const drains: Drain[] = roof.outlets.map((o) => ({ kind: "outlet", index: o.index, level: o.level, vertex: -1 }));
  const drainMark = markDrains(roof, mesh, drains);

  const receiver = new Int32Array(V).fill(-1);
  const best = new Float64Array(V);
  const edges = mesh.edges;
  for (let k = 0; k < edges.length; k += 2) {
    const a = edges[k];
    const b = edges[k + 1];
    const dz = z[a] - z[b];
    if (dz <= FLAT && dz >= -FLAT) continue;
    const du = u[b] - u[a];
    const dv = v[b] - v[a];
    const s = dz / Math.sqrt(du * du + dv * dv);
    if (s > 0) {
      if (steeper(s, best[a], b, receiver[a], u, v)) {
        best[a] = s;
        receiver[a] = b;
      }
    } else if (steeper(-s, best[b], a, receiver[b], u, v)) {
      best[b] = -s;
      receiver[b] = a;
    }
  }
  const vertexDrain = new Int32Array(V).fill(-1);
  let open = 0;
  for (let i = 0; i < V; i++) {
    if (drainMark[i] >= 0) {
      receiver[i] = -1;
      vertexDrain[i] = drainMark[i];
    } else if (receiver[i] < 0) open++;
  }

  const stack = new Int32Array(V);
  const end = new Int32Array(V);
  // Follow receivers to their ends (path-compressed, so linear in V), and give every vertex the
  // drain its chain ends in (-1 while that end is a level patch not yet settled).
  const settleChains = () => {
    end.fill(-1);
    for (let i = 0; i < V; i++) {
      if (end[i] >= 0) continue;
      let top = 0;
      let x = i;
      while (end[x] < 0 && receiver[x] >= 0 && top < V) {
        stack[top++] = x;
        x = receiver[x];
      }
      const e = end[x] >= 0 ? end[x] : x;
      end[x] = e;
      while (top > 0) end[stack[--top]] = e;
    }
    for (let i = 0; i < V; i++) vertexDrain[i] = vertexDrain[end[i]];
  };
  settleChains();
  if (open > 0) open = levelPatches(mesh, receiver, vertexDrain, open, settleChains);
  if (open > 0) markPits(mesh, receiver, vertexDrain, drains);
  settleChains();

  const faceDrain = new Int32Array(F);
  const drainArea = new Float64Array(drains.length);
  for (let f = 0; f < F; f++) {
    const a = tri[3 * f], b = tri[3 * f + 1], c = tri[3 * f + 2];
    let low = a;
    if (z[b] < z[low]) low = b;
    if (z[c] < z[low]) low = c;
    const d = vertexDrain[low];
    faceDrain[f] = d;
    if (d >= 0) drainArea[d] += faces.area[f];
  }
  return { drains, receiver, vertexDrain, faceDrain, drainArea };
}

/**
 * Level patches: a vertex with no lower neighbour drains through a neighbour at the same level
 * whose water already reaches a drain. Sweeps over the faces until nothing changes (a wide level
 * area takes one sweep per step across it, so the sweeps are bounded); returns how many such
 * vertices are left without a way out.
 */
function levelPatches(mesh: SurfaceMesh, receiver: Int32Array, vertexDrain: Int32Array, open: number, settleChains: () => void): number {
  const { z, edges } = mesh;
  const MAX_SWEEPS = 64;
  const settle = (x: number, y: number) => {
    if (receiver[x] >= 0 || vertexDrain[x] >= 0 || vertexDrain[y] < 0 || Math.abs(z[x] - z[y]) > FLAT) return 0;
    receiver[x] = y;
    vertexDrain[x] = vertexDrain[y];
    return 1;
  };
  for (let sweep = 0; sweep < MAX_SWEEPS && open > 0; sweep++) {
    let changed = 0;
    for (let k = 0; k < edges.length; k += 2) {
      const a = edges[k];
      const b = edges[k + 1];
      if (receiver[a] >= 0 && receiver[b] >= 0) continue;
      changed += settle(a, b) + settle(b, a);
    }
    open -= changed;
    if (changed === 0) break;
    if (open > 0) settleChains();
  }
  return open;
}

/** What is left: connected level patches with no way down, each a pit (ponding). */
function markPits(mesh: SurfaceMesh, receiver: Int32Array, vertexDrain: Int32Array, drains: Drain[]): void {
  const V = mesh.vertexCount;
  const { z, edges } = mesh;
  const degree = new Int32Array(V + 1);
  for (let k = 0; k < edges.length; k++) degree[edges[k] + 1]++;
  for (let i = 0; i < V; i++) degree[i + 1] += degree[i];
  const fill = degree.slice(0, V);
  const adj = new Int32Array(degree[V]);
  for (let k = 0; k < edges.length; k += 2) {
    const a = edges[k];
    const b = edges[k + 1];
    adj[fill[a]++] = b;
    adj[fill[b]++] = a;
  }
  const queue = new Int32Array(V);
  let pits = 0;
  for (let i = 0; i < V; i++) {
    if (receiver[i] >= 0 || vertexDrain[i] >= 0) continue;
    const id = drains.length;
    drains.push({ kind: "pit", index: pits++, level: z[i], vertex: i });
    let head = 0;
    let tail = 0;
    queue[tail++] = i;
    vertexDrain[i] = id;
    while (head < tail) {
      const x = queue[head++];
      for (let k = degree[x]; k < degree[x + 1]; k++) {
        const y = adj[k];
        if (receiver[y] >= 0 || vertexDrain[y] >= 0 || Math.abs(z[y] - z[x]) > FLAT) continue;
        vertexDrain[y] = id;
        receiver[y] = x;
        queue[tail++] = y;
      }
    }
    drains[id].vertex = i;
  }
}
