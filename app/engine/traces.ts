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
 * Flow traces by steepest descent on the mesh (ROOF-METHOD.md §7) from a seed grid: each follows
 * the downhill neighbour chain, which runs along a parapet when it meets one, to an outlet,
 * an eaves edge or a pit.
 */
export function flowTraces(roof: Roof, mesh: SurfaceMesh, routing: Routing): FlowTraces {
  // Seeds are laid on the bounding box: keep that grid bounded too (a thin diagonal roof).
  const box = (roof.umax - roof.umin) * (roof.vmax - roof.vmin);
  const gap = Math.max(seedSpacing(roof.area), Math.sqrt(box / (50 * MAX_TRACES)));
  const { receiver, vertexDrain } = routing;
  const seeds: number[] = [];
  let total = 0;
  for (let u = roof.umin + gap / 2; u < roof.umax; u += gap) {
    for (let v = roof.vmin + gap / 2; v < roof.vmax; v += gap) {
      if (!insidePolygon(roof.us, roof.vs, u, v)) continue;
      const x = nearestVertex(mesh, u, v);
      if (x < 0) continue;
      seeds.push(x);
      for (let y = x, guard = 0; y >= 0 && guard < mesh.vertexCount; y = receiver[y], guard++) total++;
    }
  }
  const every = Math.max(1, Math.ceil(total / MAX_TRACE_POINTS));
  const points: number[] = [];
  const starts: number[] = [];
  const ends: string[] = [];
  const { dx, dy, ox, oy } = roof;
  // Traces are drawn, not measured: plan to the millimetre and levels to a tenth of one keep
  // the JSON small.
  const emit = (y: number) => {
    const u = mesh.u[y], v = mesh.v[y];
    points.push(
      Math.round((ox + u * dy + v * dx) * 1e3) / 1e3,
      Math.round((oy - u * dx + v * dy) * 1e3) / 1e3,
      Math.round(mesh.z[y] * 1e4) / 1e4,
    );
  };
  const labels = routing.drains.map((_, id) => drainLabel(roof, routing, id));
  for (const x of seeds) {
    starts.push(points.length / 3);
    let y = x;
    for (let k = 0, guard = 0; guard < mesh.vertexCount; guard++, k++) {
      if (k % every === 0 || receiver[y] < 0) emit(y);
      if (receiver[y] < 0) break;
      y = receiver[y];
    }
    ends.push(labels[vertexDrain[y]] ?? "none");
  }
  starts.push(points.length / 3);
  return { points, starts, ends };
}
