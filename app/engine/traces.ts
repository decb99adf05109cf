import { nearestVertex } from "./faces";
import type { Routing } from "./flow";
import { insidePolygon } from "./geometry/inside";
import type { SurfaceMesh } from "./mesh";
import type { Roof } from "./roof";
import type { FlowTraces } from "./types";

/** Traces drawn for the plan view: about 0.5 m apart, finer on small roofs, at most this many. */
export const MAX_TRACES = 400;

/** Seed grid spacing: about 0.5 m (0.25 m under 40 m²), wider when that would exceed MAX_TRACES seeds. */
export function seedSpacing(area: number): number {
  const base = area < 40 ? 0.25 : 0.5;
  return Math.max(base, Math.sqrt(area / MAX_TRACES));
}

/** Labels drains in reports and traces: "outlet-0", "eaves-3" (request edge), "pit-1". */
export function drainLabel(roof: Roof, routing: Routing, id: number): string {
  const d = routing.drains[id];
  if (!d) return "none";
  if (d.kind === "eaves") return `eaves-${roof.userEdge[d.index]}`;
  return `${d.kind}-${d.index}`;
}

/** Total points kept across all traces; long traces keep every k-th vertex. */
export const MAX_TRACE_POINTS = 4_000;

/**
 * Flow traces by steepest descent on the mesh (docs/roof-method.md §7) from a seed grid: each follows
 * the downhill neighbour chain, which runs along a parapet when it meets one, to an outlet,
 * an eaves edge or a pit.
 */
export function flowTraces(roof: Roof, mesh: SurfaceMesh, routing: Routing): FlowTraces {
  // Seeds are laid on the bounding box: keep that grid bounded too (a thin diagonal roof).
  const box = (roof.umax - roof.umin) * (roof.vmax - roof.vmin);
  const gap = Math.max(seedSpacing(roof.area), Math.sqrt(box / (50 * MAX_TRACES)));
  const { receiver, vertexDrain } = routing;
  // Steps from each vertex to the end of its chain, each chain walked once.
  const V = mesh.vertexCount;
  const depth = new Int32Array(V).fill(-1);
  const stack = new Int32Array(V);
  for (let i = 0; i < V; i++) {
    let top = 0;
    let x = i;
    while (depth[x] < 0 && receiver[x] >= 0 && top < V) {
      stack[top++] = x;
      x = receiver[x];
    }
    let d = depth[x] >= 0 ? depth[x] : (depth[x] = 0);
    while (top > 0) depth[stack[--top]] = ++d;
  }
  const seeds: number[] = [];
  let total = 0;
  for (let u = roof.umin + gap / 2; u < roof.umax; u += gap) {
    for (let v = roof.vmin + gap / 2; v < roof.vmax; v += gap) {
      if (!insidePolygon(roof.us, roof.vs, u, v)) continue;
      const x = nearestVertex(mesh, u, v);
      if (x < 0) continue;
      seeds.push(x);
      total += depth[x] + 1;
    }
  }
  const every = Math.max(1, Math.ceil(total / MAX_TRACE_POINTS));
  let count = 0;
  for (const x of seeds) count += Math.floor(depth[x] / every) + 1 + (depth[x] % every ? 1 : 0);
  const points = new Array<number>(3 * count);
  const starts = new Array<number>(seeds.length + 1);
  const ends = new Array<string>(seeds.length);
  const { dx, dy, ox, oy } = roof;
  const labels = routing.drains.map((_, id) => drainLabel(roof, routing, id));
  let p = 0;
  for (let t = 0; t < seeds.length; t++) {
    starts[t] = p / 3;
    let y = seeds[t];
    const steps = depth[y];
    for (let k = 0; k <= steps; k++) {
      const last = receiver[y] < 0 || k === steps;
      if (k % every === 0 || last) {
        // Traces are drawn, not measured: plan to the millimetre and levels to a tenth of one
        // keep the JSON small.
        const u = mesh.u[y],
          v = mesh.v[y];
        points[p++] = Math.round((ox + u * dy + v * dx) * 1e3) / 1e3;
        points[p++] = Math.round((oy - u * dx + v * dy) * 1e3) / 1e3;
        points[p++] = Math.round(mesh.z[y] * 1e4) / 1e4;
      }
      if (last) break;
      y = receiver[y];
    }
    ends[t] = labels[vertexDrain[y]] ?? "none";
  }
  starts[seeds.length] = p / 3;
  return { points, starts, ends };
}
