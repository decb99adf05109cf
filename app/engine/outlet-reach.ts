import type { Catchment, Point, Warning } from "./types";
import type { PerimeterLevels } from "./perimeter";
import { toPlan, type Roof } from "./roof";

/**
 * Width across the joists of an outlet's own stretch of wall, from the knot before it to the knot
 * after it (docs/roof-method-plans.md P7): the strip of joists that end on that stretch and so
 * fall toward the outlet. A corner outlet takes the wider of its two walls.
 */
export function outletReach(roof: Roof, levels: PerimeterLevels, outlet: number): number {
  const o = roof.outlets[outlet];
  const { n } = roof;
  if (o.vertex >= 0) {
    const before = (o.vertex + n - 1) % n;
    return Math.max(stretchWidth(roof, levels, before, roof.len[before]), stretchWidth(roof, levels, o.vertex, 0));
  }
  return stretchWidth(roof, levels, o.edge, o.t);
}

function stretchWidth(roof: Roof, levels: PerimeterLevels, edge: number, t: number): number {
  if (roof.eaves[edge]) return 0;
  const kt = levels.t[edge];
  let k = 0;
  while (k + 1 < kt.length && kt[k + 1] <= t + roof.tol) k++;
  // The knot at the outlet is k; its stretch runs to the knots either side (clamped to the edge).
  const lo = kt[Math.max(0, k - 1)];
  const hi = kt[Math.min(kt.length - 1, k + 1)];
  return (hi - lo) * wallSine(roof, edge);
}

/**
 * Fewer joists than this many spacings ending on an outlet's stretch of wall leave it a sliver,
 * when its wall runs within 30° of the joists (sine below one half). Both figures are common
 * practice, no source: crowded outlets on a wall across the joists also have short stretches,
 * but that is not this fault.
 */
export const REACH_SPACINGS = 2;
export const ALONG_SINE = 0.5;

/** Sine of the angle between internal edge j and the joists. */
function wallSine(roof: Roof, j: number): number {
  const q = (j + 1) % roof.n;
  return Math.abs(roof.us[q] - roof.us[j]) / roof.len[j];
}

/**
 * `outlet-parallel-to-joists` (docs/roof-method-plans.md P7): an outlet on a wall that runs along
 * the joists, or nearly, is at the end of no joist; it drains a sliver and the surface dips
 * steeply beside it. Names the outlet, the area it drains and the fixes, the first of them the
 * joist direction that would run toward its wall.
 */
export function outletParallelWarnings(roof: Roof, levels: PerimeterLevels, catchments: Catchment[]): Warning[] {
  const out: Warning[] = [];
  for (let i = 0; i < roof.outlets.length; i++) {
    const o = roof.outlets[i];
    if (outletReach(roof, levels, i) >= REACH_SPACINGS * roof.spacing) continue;
    const before = o.vertex >= 0 ? (o.vertex + roof.n - 1) % roof.n : o.edge;
    if (Math.min(wallSine(roof, o.edge), wallSine(roof, before)) >= ALONG_SINE) continue;
    const drained = catchments.find((c) => c.kind === "outlet" && c.index === o.index)?.area ?? 0;
    const q = (o.edge + 1) % roof.n;
    // Inward normal of the outlet's wall in plan (counter-clockwise outline: the edge turned left).
    const direction: Point = [
      -(roof.ys[q] - roof.ys[o.edge]) / roof.len[o.edge] + 0,
      (roof.xs[q] - roof.xs[o.edge]) / roof.len[o.edge] + 0,
    ];
    out.push({
      code: "outlet-parallel-to-joists",
      message: `Outlet ${o.index + 1} sits on a wall that runs along the joists: no joist ends on it, so it drains only ${drained.toFixed(1)} m² and the deck dips steeply beside it. Turn the joists to run toward that wall, move the outlet to a wall the joists end on, or divide the roof with a ridge so the outlet has an area of its own.`,
      at: toPlan(roof, o.u, o.v),
      outlet: o.index,
      drainedArea: drained,
      fixes: [{ kind: "turn-joists", direction }, { kind: "move-outlet" }, { kind: "divide-roof" }],
    });
  }
  return out;
}
