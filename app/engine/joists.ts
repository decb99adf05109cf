import { chordsAt } from "./chords";
import { levelOnEdge, type PerimeterLevels } from "./perimeter";
import { toPlan, type Roof } from "./roof";
import type { Joist } from "./types";

/**
 * Joist positions across the roof (frame u): first offset + k × spacing from the extreme edge,
 * the last one against the far wall (docs/roof-method.md §5).
 */
export function joistPositions(roof: Roof): Float64Array {
  const { umin, umax, spacing, offset } = roof;
  const first = umin + Math.min(offset, umax - umin);
  const slack = roof.tol * 10;
  const count = Math.floor((umax - first + slack) / spacing) + 1;
  const last = first + (count - 1) * spacing;
  const total = umax - last > slack ? count + 1 : count;
  const out = new Float64Array(total);
  for (let k = 0; k < count; k++) out[k] = first + k * spacing;
  if (total > count) out[count] = umax;
  else out[count - 1] = Math.min(out[count - 1], umax);
  return out;
}

/** The drop schedule: each joist's spans with end levels, drops below H and fall ratio. */
export function dropSchedule(roof: Roof, levels: PerimeterLevels, positions: Float64Array): Joist[] {
  const joists: Joist[] = [];
  const H = levels.H;
  for (let k = 0; k < positions.length; k++) {
    const u = positions[k];
    const side = u >= roof.umax - roof.tol ? -1 : 1;
    const spans = chordsAt(roof, u, side).map((c) => {
      const startLevel = levelOnEdge(levels, c.edgeA, c.tA);
      const endLevel = levelOnEdge(levels, c.edgeB, c.tB);
      const length = c.vB - c.vA;
      const rise = Math.abs(endLevel - startLevel);
      const ratio = rise > 1e-12 ? length / rise : null;
      return {
        start: toPlan(roof, u, c.vA),
        end: toPlan(roof, u, c.vB),
        length,
        startLevel,
        endLevel,
        startDrop: H - startLevel,
        endDrop: H - endLevel,
        ratio,
      };
    });
    joists.push({ index: k, offset: u - roof.umin, spans });
  }
  return joists;
}
