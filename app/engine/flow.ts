import { FRESH, type Memory } from "./arena";
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
  /** The drain each vertex's water reaches (faces take their lowest vertex's: see faceData). */
  vertexDrain: Int32Array;
}

const FLAT = 1e-9;
// A relative tie band of 1e-9 on a fall is (1 ± 1e-9)² on its square.
const TIE_HIGH = (1 + 1e-9) ** 2;
const TIE_LOW = (1 - 1e-9) ** 2;

/** Drain ids for vertices that are outlets (within the outlet radius) or on an eaves edge. */
function markDrains(roof: Roof, mesh: SurfaceMesh, drains: Drain[], memory: Memory): Int32Array {
  const V = mesh.vertexCount;
  const mark = memory.take(Int32Array, V).fill(-1);
  const { n, eaves, len } = roof;
  const eavesIds = new Int32Array(n).fill(-1);
  const eavesOrder = [...Array(n).keys()].filter((e) => eaves[e]).sort((a, b) => roof.userEdge[a] - roof.userEdge[b]);
  for (const e of eavesOrder) {
    eavesIds[e] = drains.length;
    drains.push({ kind: "eaves", index: e, level: 0, vertex: -1 });
  }
  const tolT = roof.tol * 1000;
  for (let i = 0; i < (eavesOrder.length ? V : 0); i++) {
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
    const r2 = r * r;
    for (let j = 0; j < lineU.length; j++) {
      if (Math.abs(lineU[j] - o.u) > Math.max(r, mesh.step)) continue;
      for (let s = lineStart[j]; s < lineStart[j + 1]; s++) {
        const du = mesh.u[s] - o.u;
        const dv = mesh.v[s] - o.v;
        const d = du * du + dv * dv;
        if (d <= r2) mark[s] = k;
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
 * Whether a fall towards vertex `to` beats the best so far (towards `current`). Falls are compared
 * squared (`s2`, `best2`: no square root per edge). Falls equal up to rounding are ties, settled
 * by the frame position of the lower vertex (lower v, then lower u): on a ridge, water must not
 * go one way or the other by the rounding of a move.
 */
function steeper(s2: number, best2: number, to: number, current: number, u: Float64Array, v: Float64Array): boolean {
  if (current < 0 || s2 > best2 * TIE_HIGH) return true;
  if (s2 < best2 * TIE_LOW) return false;
  const dv = v[to] - v[current];
  if (dv < -1e-9 || dv > 1e-9) return dv < 0;
  return u[to] < u[current];
}

/**
 * One mesh edge a-b: the lower end becomes the upper end's receiver when it is the steepest way
 * down so far; a level edge is listed in `level` instead. Returns the new length of that list.
 */
function visit(
  a: number,
  b: number,
  u: Float64Array,
  v: Float64Array,
  z: Float64Array,
  best: Float64Array,
  receiver: Int32Array,
  level: Int32Array,
  nLevel: number,
): number {
  const dz = z[a] - z[b];
  if (dz <= FLAT && dz >= -FLAT) {
    level[nLevel] = a;
    level[nLevel + 1] = b;
    return nLevel + 2;
  }
  const du = u[b] - u[a];
  const dv = v[b] - v[a];
  const s2 = (dz * dz) / (du * du + dv * dv);
  if (dz > 0) {
    if (steeper(s2, best[a], b, receiver[a], u, v)) {
      best[a] = s2;
      receiver[a] = b;
    }
  } else if (steeper(s2, best[b], a, receiver[b], u, v)) {
    best[b] = s2;
    receiver[b] = a;
  }
  return nLevel;
}

/**
 * Where the water goes (docs/roof-method.md §7): each vertex drains to its steepest downhill neighbour
 * (lower by more than rounding); level patches drain through a neighbour at the same level
 * whose water already reaches a drain; what is left are pits. (Each face then takes the drain
 * of its lowest vertex: see faceData.)
 */
export function routeWater(roof: Roof, mesh: SurfaceMesh, memory: Memory = FRESH): Routing {
  const V = mesh.vertexCount;
  const { u, v, z } = mesh;
  const drains: Drain[] = roof.outlets.map((o) => ({ kind: "outlet", index: o.index, level: o.level, vertex: -1 }));
  const drainMark = markDrains(roof, mesh, drains, memory);

  const receiver = memory.take(Int32Array, V).fill(-1);
  const best = memory.take(Float64Array, V);
  const { rungs, link } = mesh;
  // Level edges (no fall either way), in mesh order: the only ones level patches and pits follow.
  const level = memory.take(Int32Array, rungs.length + 2 * V);
  let nLevel = 0;
  // Every mesh edge once, in `meshEdges` order: the rungs, then the links along the lines.
  for (let k = 0; k < rungs.length; k += 2)
    nLevel = visit(rungs[k], rungs[k + 1], u, v, z, best, receiver, level, nLevel);
  for (let i = 1; i < V; i++) if (link[i]) nLevel = visit(i - 1, i, u, v, z, best, receiver, level, nLevel);
  // rootDrain: the drain a chain's last vertex is (-1 for a level vertex not yet settled).
  const rootDrain = drainMark;
  let open = 0;
  for (let i = 0; i < V; i++) {
    if (rootDrain[i] >= 0) receiver[i] = -1;
    else if (receiver[i] < 0) open++;
  }
  const chains = new Chains(receiver, memory.take(Int32Array, V));
  const levelEdges = level.subarray(0, nLevel);
  if (open > 0) open = levelPatches(levelEdges, receiver, rootDrain, chains, open);
  if (open > 0) markPits(V, z, levelEdges, receiver, rootDrain, drains);

  const vertexDrain = memory.take(Int32Array, V);
  for (let i = 0; i < V; i++) vertexDrain[i] = rootDrain[chains.end(i)];
  return { drains, receiver, vertexDrain };
}

/**
 * The last vertex of each vertex's receiver chain, found on demand with path compression, so
 * every query is nearly constant time. A chain's last vertex may later gain a receiver (a level
 * patch settling); a remembered jump then just continues from there.
 */
class Chains {
  private readonly jump: Int32Array;
  /** `jump`: one slot per vertex, any contents (it is reset here). */
  constructor(
    private readonly receiver: Int32Array,
    jump: Int32Array,
  ) {
    this.jump = jump.fill(-1);
  }
  end(i: number): number {
    const { jump, receiver } = this;
    let x = i;
    for (;;) {
      const j = jump[x];
      if (j >= 0) x = j;
      else if (receiver[x] >= 0) x = receiver[x];
      else break;
    }
    for (let y = i; y !== x;) {
      const next = jump[y] >= 0 ? jump[y] : receiver[y];
      jump[y] = x;
      y = next;
    }
    return x;
  }
}

/**
 * Level patches: a vertex with no lower neighbour drains through a neighbour at the same level
 * whose water already reaches a drain. Sweeps over the level edges (pairs of vertex indices, in
 * mesh order) until nothing changes (a wide level area takes one sweep per step across it, so
 * the sweeps are bounded); returns how many such vertices are left without a way out.
 */
function levelPatches(
  edges: Int32Array,
  receiver: Int32Array,
  rootDrain: Int32Array,
  chains: Chains,
  open: number,
): number {
  const MAX_SWEEPS = 64;
  const settle = (x: number, y: number) => {
    if (receiver[x] >= 0 || rootDrain[x] >= 0 || rootDrain[chains.end(y)] < 0) return 0;
    receiver[x] = y;
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
  }
  return open;
}

/** What is left: connected level patches (joined by level edges) with no way down, each a pit (ponding). */
function markPits(
  V: number,
  z: Float64Array,
  edges: Int32Array,
  receiver: Int32Array,
  rootDrain: Int32Array,
  drains: Drain[],
): void {
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
    if (receiver[i] >= 0 || rootDrain[i] >= 0) continue;
    const id = drains.length;
    drains.push({ kind: "pit", index: pits++, level: z[i], vertex: i });
    let head = 0;
    let tail = 0;
    queue[tail++] = i;
    rootDrain[i] = id;
    while (head < tail) {
      const x = queue[head++];
      for (let k = degree[x]; k < degree[x + 1]; k++) {
        const y = adj[k];
        if (receiver[y] >= 0 || rootDrain[y] >= 0) continue;
        rootDrain[y] = id;
        receiver[y] = x;
        queue[tail++] = y;
      }
    }
    drains[id].vertex = i;
  }
}
