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
 * Where the water goes (ROOF-METHOD.md §7): each vertex drains to its steepest downhill neighbour;
 * flat patches drain through the neighbour that already drains; what is left are pits. Each face
 * goes to the drain of its lowest vertex.
 */
export function routeWater(roof: Roof, mesh: SurfaceMesh, faces: FaceData): Routing {
  const V = mesh.vertexCount;
  const F = mesh.faceCount;
  const { u, v, z, tri } = mesh;
  const drains: Drain[] = roof.outlets.map((o) => ({ kind: "outlet", index: o.index, level: o.level, vertex: -1 }));
  const drainMark = markDrains(roof, mesh, drains);

  const receiver = new Int32Array(V).fill(-1);
  const best = new Float64Array(V);
  for (let f = 0; f < F; f++) {
    for (let k = 0; k < 3; k++) {
      const a = tri[3 * f + k];
      const b = tri[3 * f + (k === 2 ? 0 : k + 1)];
      const du = u[b] - u[a];
      const dv = v[b] - v[a];
      const s = (z[a] - z[b]) / Math.sqrt(du * du + dv * dv);
      if (s > best[a]) {
        best[a] = s;
        receiver[a] = b;
      } else if (-s > best[b]) {
        best[b] = -s;
        receiver[b] = a;
      }
    }
  }
  const vertexDrain = new Int32Array(V).fill(-1);
  let unresolved = 0;
  for (let i = 0; i < V; i++) {
    if (drainMark[i] >= 0) {
      receiver[i] = -1;
      vertexDrain[i] = drainMark[i];
    } else if (receiver[i] < 0) unresolved++;
  }

  if (unresolved > 0) unresolved = relaxFlats(mesh, receiver, vertexDrain, unresolved);
  if (unresolved > 0) resolveFlats(mesh, receiver, vertexDrain, drains);

  // Follow receivers to a drain, recording the answer along the way.
  const stack = new Int32Array(V);
  for (let i = 0; i < V; i++) {
    if (vertexDrain[i] >= 0) continue;
    let top = 0;
    let x = i;
    while (vertexDrain[x] < 0 && receiver[x] >= 0 && top < V) {
      stack[top++] = x;
      x = receiver[x];
    }
    const d = vertexDrain[x];
    while (top > 0) vertexDrain[stack[--top]] = d;
  }

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
 * Small flat patches (a corner vertex whose neighbours sit at the same level) drain through a
 * neighbour that already drains. A few passes over the faces settle them without building an
 * adjacency; large level areas are left for the breadth-first search.
 */
function relaxFlats(mesh: SurfaceMesh, receiver: Int32Array, vertexDrain: Int32Array, unresolved: number): number {
  const { z, tri } = mesh;
  const F = mesh.faceCount;
  const open = new Uint8Array(mesh.vertexCount);
  for (let i = 0; i < mesh.vertexCount; i++) if (receiver[i] < 0 && vertexDrain[i] < 0) open[i] = 1;
  const settle = (x: number, y: number) => {
    if (open[x] && !open[y] && Math.abs(z[x] - z[y]) <= FLAT) {
      receiver[x] = y;
      open[x] = 0;
      unresolved--;
    }
  };
  for (let pass = 0; pass < 3 && unresolved > 0; pass++) {
    const before = unresolved;
    for (let f = 0; f < F; f++) {
      const a = tri[3 * f], b = tri[3 * f + 1], c = tri[3 * f + 2];
      if (!(open[a] | open[b] | open[c])) continue;
      settle(a, b);
      settle(a, c);
      settle(b, a);
      settle(b, c);
      settle(c, a);
      settle(c, b);
    }
    if (unresolved === before) break;
  }
  return unresolved;
}

/** Flat patches drain through a neighbour at the same level that already drains; the rest are pits. */
function resolveFlats(mesh: SurfaceMesh, receiver: Int32Array, vertexDrain: Int32Array, drains: Drain[]): void {
  const V = mesh.vertexCount;
  const { z, tri } = mesh;
  const F = mesh.faceCount;
  // Vertex adjacency (compressed rows) from the faces' edges.
  const degree = new Int32Array(V + 1);
  for (let k = 0; k < 3 * F; k++) degree[tri[k] + 1] += 2;
  for (let i = 0; i < V; i++) degree[i + 1] += degree[i];
  const fill = degree.slice(0, V);
  const adj = new Int32Array(degree[V]);
  for (let f = 0; f < F; f++) {
    for (let k = 0; k < 3; k++) {
      const a = tri[3 * f + k];
      const b = tri[3 * f + (k === 2 ? 0 : k + 1)];
      adj[fill[a]++] = b;
      adj[fill[b]++] = a;
    }
  }
  const done = new Uint8Array(V);
  const queue = new Int32Array(V);
  let head = 0, tail = 0;
  for (let i = 0; i < V; i++) {
    if (receiver[i] >= 0 || vertexDrain[i] >= 0) {
      done[i] = 1;
      queue[tail++] = i;
    }
  }
  while (head < tail) {
    const x = queue[head++];
    for (let k = degree[x]; k < degree[x + 1]; k++) {
      const y = adj[k];
      if (done[y] || Math.abs(z[y] - z[x]) > FLAT) continue;
      done[y] = 1;
      receiver[y] = x;
      queue[tail++] = y;
    }
  }
  // Pits: connected level patches with no way down.
  let pits = 0;
  for (let i = 0; i < V; i++) {
    if (done[i]) continue;
    const id = drains.length;
    drains.push({ kind: "pit", index: pits++, level: z[i], vertex: i });
    head = tail = 0;
    queue[tail++] = i;
    done[i] = 1;
    while (head < tail) {
      const x = queue[head++];
      vertexDrain[x] = id;
      for (let k = degree[x]; k < degree[x + 1]; k++) {
        const y = adj[k];
        if (done[y] || Math.abs(z[y] - z[x]) > FLAT) continue;
        done[y] = 1;
        queue[tail++] = y;
      }
    }
  }
}
