import { fallFromRatio } from "./fall";
import { nearestVertex } from "./faces";
import type { Routing } from "./flow";
import type { Destination, Geodesic } from "./geodesic";
import type { SurfaceMesh } from "./mesh";
import type { PerimeterLevels } from "./perimeter";
import type { Roof } from "./roof";
import { drainLabel } from "./traces";
import type { FallLine, Point } from "./types";

/** Start points of fall lines: perimeter vertices at H and the high points half-way between outlets. */
export function fallLineStarts(roof: Roof, levels: PerimeterLevels): [number, number][] {
  const starts: [number, number][] = [];
  const H = levels.H;
  for (let i = 0; i < roof.n; i++) if (Math.abs(levels.vertex[i] - H) <= 1e-12) starts.push([roof.xs[i], roof.ys[i]]);
  for (let j = 0; j < roof.n; j++) {
    const q = (j + 1) % roof.n;
    for (let k = 0; k < levels.t[j].length; k++) {
      if (levels.kind[j][k] !== 2) continue;
      const s = levels.t[j][k] / roof.len[j];
      starts.push([roof.xs[j] + s * (roof.xs[q] - roof.xs[j]), roof.ys[j] + s * (roof.ys[q] - roof.ys[j])]);
    }
  }
  return starts;
}

const plan = (roof: Roof, x: number, y: number): Point => [roof.ox + x, roof.oy + y];

/**
 * Fall lines (ROOF-METHOD.md §7): from each start, the shortest path inside the outline to the
 * drain its water reaches; length over drop is its ratio. Starts whose water ponds have none.
 */
export function fallLines(
  roof: Roof,
  levels: PerimeterLevels,
  mesh: SurfaceMesh,
  routing: Routing,
  geodesic: Geodesic,
): FallLine[] {
  const lines: FallLine[] = [];
  const destinations = new Map<number, Destination>();
  for (const [sx, sy] of fallLineStarts(roof, levels)) {
    const u = sx * roof.dy - sy * roof.dx;
    const v = sx * roof.dx + sy * roof.dy;
    const vertex = nearestVertex(mesh, u, v);
    const id = vertex >= 0 ? routing.vertexDrain[vertex] : -1;
    const drain = routing.drains[id];
    if (!drain || drain.kind === "pit") continue;
    let to = destinations.get(id);
    if (!to) {
      const o = drain.kind === "outlet" ? roof.outlets[drain.index] : null;
      to = o ? geodesic.toPoint(o.x, o.y) : geodesic.toEdge(drain.index);
      destinations.set(id, to);
    }
    const path = geodesic.path(sx, sy, to);
    const drop = levels.H - drain.level;
    if (!(path.length > 0) || !Number.isFinite(path.length) || drop <= 0) continue;
    const ratio = path.length / drop;
    lines.push({
      from: plan(roof, sx, sy),
      to: plan(roof, path.path[path.path.length - 1][0], path.path[path.path.length - 1][1]),
      length: path.length,
      drop,
      drainLevel: drain.level,
      ratio,
      fall: fallFromRatio(ratio),
      path: path.path.map(([x, y]) => plan(roof, x, y)),
      drain: drainLabel(roof, routing, id),
    });
  }
  return lines;
}
