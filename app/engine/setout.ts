import type { Outlet, Roof } from "./roof";
import type { OutletJoist, Point, Warning } from "./types";

/**
 * How close (metres) a joist line must pass to an outlet's centre to count as landing on it.
 * Common practice, no source: 1 mm, the same as the outlet snap (docs/roof-method.md §5).
 */
export const ON_JOIST = 0.001;

const mod = (a: number, m: number) => ((a % m) + m) % m;

/** Distance from u to the nearest joist of the row first + k × spacing (k ≥ 0) or the far wall. */
function gapToRow(u: number, first: number, spacing: number, umax: number): number {
  const far = Math.abs(umax - u);
  if (u < first) return Math.min(first - u, far);
  const r = mod(u - first, spacing);
  return Math.min(r, spacing - r, far);
}

/**
 * The first joist offset that puts a joist on as many outlets as the spacing allows
 * (docs/roof-method.md §5, set-out from the outlets): each outlet proposes the offset that lands
 * a joist on it; the proposal serving most outlets wins, ties going to the lower-numbered outlet.
 * 0 when there are no outlets.
 */
export function offsetFromOutlets(outlets: Outlet[], umin: number, umax: number, spacing: number): number {
  let best = 0;
  let bestCount = -1;
  // Request order, so outlet 1 wins a tie.
  const ordered = [...outlets].sort((a, b) => a.index - b.index);
  for (const o of ordered) {
    const offset = mod(o.u - umin, spacing);
    const candidate = offset > spacing - ON_JOIST ? 0 : offset;
    let count = 0;
    for (const p of outlets) if (gapToRow(p.u, umin + candidate, spacing, umax) <= ON_JOIST) count++;
    if (count > bestCount) {
      best = candidate;
      bestCount = count;
    }
  }
  return best;
}

/** Which joist (if any) lands on each outlet, and for the others the joists either side of it. */
export function outletJoists(
  roof: Roof,
  positions: Float64Array,
  toPlan: (u: number, v: number) => Point,
): OutletJoist[] {
  return [...roof.outlets]
    .sort((a, b) => a.index - b.index)
    .map((o) => {
      let nearest = 0;
      for (let k = 1; k < positions.length; k++)
        if (Math.abs(positions[k] - o.u) < Math.abs(positions[nearest] - o.u)) nearest = k;
      const gap = Math.abs(positions[nearest] - o.u);
      const at = toPlan(o.u, o.v);
      if (gap <= ON_JOIST) return { outlet: o.index, at, joist: nearest + 1, between: null, gap: 0 };
      let below = -1;
      for (let k = 0; k < positions.length; k++) if (positions[k] < o.u) below = k;
      const above = below + 1 < positions.length ? below + 2 : null;
      return { outlet: o.index, at, joist: null, between: [below >= 0 ? below + 1 : null, above], gap };
    });
}

const mmText = (m: number) => `${Math.round(m * 1000)} mm`;
const ptText = (p: Point) => `(${p[0].toFixed(2)}, ${p[1].toFixed(2)})`;

/** One warning per outlet no joist lands on: a trimmer or noggin is needed there, between the named joists. */
export function trimWarnings(set: OutletJoist[], fromOutlets: boolean): Warning[] {
  const served = set.filter((s) => s.joist !== null).map((s) => s.outlet + 1);
  return set
    .filter((s) => s.joist === null)
    .map((s) => {
      const [a, b] = s.between ?? [null, null];
      const where =
        a !== null && b !== null
          ? `between joists ${a} and ${b}`
          : a !== null
            ? `beyond joist ${a}`
            : `before joist ${b}`;
      const why = !fromOutlets
        ? " set the joists out from the outlets, or trim round it"
        : served.length
          ? ` the spacing cannot also put a joist on outlet ${served.join(", ")}. Trim round it`
          : " no joist can land on it. Trim round it";
      return {
        code: "outlet-off-joist" as const,
        message: `Outlet ${s.outlet + 1} at ${ptText(s.at)} lies ${where}, ${mmText(s.gap)} from the nearest:${why} (trimmer or noggin ${where}) so the outlet's low point is carried.`,
        at: s.at,
        size: s.gap,
      };
    });
}
