import { fallFromRatio } from "./fall";
import type { Routing } from "./flow";
import type { Destination, Geodesic } from "./geodesic";
import type { SurfaceMesh } from "./mesh";
import type { PerimeterLevels } from "./perimeter";
import type { Roof } from "./roof";
import { drainLabel } from "./traces";
import type { FallLine, Point } from "./types";

/**
 * Start points of fall lines: perimeter vertices at H and the high points half-way between
 * outlets. A half-way point is a ridge, where water could turn either way: it is given the
 * outlet before it on its edge (both are equally far along the parapet), so rounding in the
 * mesh never decides. The third number is that outlet's index, or -1.
 */
export function fallLineStarts(roof: Roof, levels: PerimeterLevels): [number, number, number][] {
  const starts: [number, number, number][] = [];
  const H = levels.H;
  for (let i = 0; i < roof.n; i++)
    if (Math.abs(levels.vertex[i] - H) <= 1e-12) starts.push([roof.xs[i], roof.ys[i], -1]);
  for (let j = 0; j < roof.n; j++) {
    const q = (j + 1) % roof.n;
    for (let k = 0; k < levels.t[j].length; k++) {
      if (levels.kind[j][k] !== 2) continue;
      const s = levels.t[j][k] / roof.len[j];
      starts.push([
        roof.xs[j] + s * (roof.xs[q] - roof.xs[j]),
        roof.ys[j] + s * (roof.ys[q] - roof.ys[j]),
        outletAt(roof, j, levels.t[j][k - 1]),
      ]);
    }
  }
  return starts;
}

/** The outlet at distance t along internal edge j (corner outlets included), or -1. */
function outletAt(roof: Roof, j: number, t: number | undefined): number {
  if (t === undefined) return -1;
  const q = (j + 1) % roof.n;
  const tol = 1e-9 * Math.max(1, roof.len[j]);
  return roof.outlets.findIndex((o) =>
    o.vertex === j
      ? t <= tol
      : o.vertex === q
        ? Math.abs(t - roof.len[j]) <= tol
        : o.vertex < 0 && o.edge === j && Math.abs(o.t - t) <= tol,
  );
}

const plan = (roof: Roof, x: number, y: number): Point => [roof.ox + x, roof.oy + y];

/**
 * Fall lines (docs/roof-method.md §7): from each start, the shortest path inside the outline to the
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
  const destinationOf = (id: number): Destination => {
    let to = destinations.get(id);
    if (!to) {
      const drain = routing.drains[id];
      // Outlet drains come first, in the roof's outlet order: drain id k is roof.outlets[k].
      const o = drain.kind === "outlet" ? roof.outlets[id] : null;
      to = o ? geodesic.toPoint(o.x, o.y) : geodesic.toEdge(drain.index);
      destinations.set(id, to);
    }
    return to;
  };
  // Starts sit at H, often on a ridge or a level patch where water may turn either way; which
  // mesh vertex is nearest, or which way a cell's diagonal runs, must not decide (both flip with
  // rounding when the spec is moved). Every drain reached from the mesh within a disc around the
  // start is a candidate, and the start takes the one reached by the shortest path, as water would.
  const cell = Math.max(mesh.step, roof.spacing * mesh.stride);
  const radius = 1.6 * cell;
  for (const [sx, sy, outlet] of fallLineStarts(roof, levels)) {
    const candidates = new Set<number>();
    if (outlet >= 0) candidates.add(outlet);
    else drainsWithin(mesh, routing, sx * roof.dy - sy * roof.dx, sx * roof.dx + sy * roof.dy, radius, candidates);
    let id = -1;
    let path: ReturnType<Geodesic["path"]> | null = null;
    for (const c of candidates) {
      const d = routing.drains[c];
      if (!d || d.kind === "pit") continue;
      const p = geodesic.path(sx, sy, destinationOf(c));
      if (!(p.length > 0) || !Number.isFinite(p.length)) continue;
      if (!path || p.length < path.length - 1e-9 || (Math.abs(p.length - path.length) <= 1e-9 && c < id)) {
        path = p;
        id = c;
      }
    }
    const drain = routing.drains[id];
    if (!drain || !path) continue;
    const drop = levels.H - drain.level;
    if (drop <= 0) continue;
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

/** Drains of the mesh vertices within `radius` of frame point (u, v), added to `out`. */
function drainsWithin(
  mesh: SurfaceMesh,
  routing: Routing,
  u: number,
  v: number,
  radius: number,
  out: Set<number>,
): void {
  const { lineU, lineStart } = mesh;
  const r2 = radius * radius;
  for (let j = 0; j < lineU.length; j++) {
    const du = lineU[j] - u;
    if (du < -radius || du > radius) continue;
    let lo = lineStart[j];
    let hi = lineStart[j + 1];
    // First station at or above v - radius (stations run up v along each line).
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      if (mesh.v[mid] < v - radius) lo = mid + 1;
      else hi = mid;
    }
    for (let s = lo; s < lineStart[j + 1] && mesh.v[s] <= v + radius; s++) {
      const dv = mesh.v[s] - v;
      if (du * du + dv * dv <= r2) out.add(routing.vertexDrain[s]);
    }
  }
}
