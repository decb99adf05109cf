import { chordThrough, type Chord } from "./chords";
import { nearestOnSegment } from "./geometry/segments";
import { levelOnEdge, type PerimeterLevels } from "./perimeter";
import { holeAt, type Roof } from "./roof";

/** Level along a chord at v: linear between its end levels (the chord rule, docs/roof-method.md §4). */
export function chordLevel(levels: PerimeterLevels, c: Chord, v: number): number {
  const zA = levelOnEdge(levels, c.edgeA, c.tA);
  const zB = levelOnEdge(levels, c.edgeB, c.tB);
  const L = c.vB - c.vA;
  if (L <= 0) return Math.min(zA, zB);
  const s = Math.min(1, Math.max(0, (v - c.vA) / L));
  return zA + (zB - zA) * s;
}

/** Perimeter level at (u, v) when the point lies on the outline (within tol), else null. */
export function perimeterLevelAt(
  roof: Roof,
  levels: PerimeterLevels,
  u: number,
  v: number,
  tol: number,
): number | null {
  const { n, us, vs, len } = roof;
  let best = -1;
  let bestDistance = tol;
  let bestS = 0;
  for (let j = 0; j < n; j++) {
    const q = j + 1 === n ? 0 : j + 1;
    const near = nearestOnSegment(us[j], vs[j], us[q], vs[q], u, v);
    if (near.distance <= bestDistance) {
      best = j;
      bestDistance = near.distance;
      bestS = near.s;
    }
  }
  return best < 0 ? null : levelOnEdge(levels, best, bestS * len[best]);
}

/**
 * Level of the shaped surface at frame point (u, v): the perimeter level on the outline, else
 * linear along the joist-direction chord through the point; null outside the outline or in an opening.
 */
export function levelAt(roof: Roof, levels: PerimeterLevels, u: number, v: number): number | null {
  // No deck inside an opening (docs/roof-method-plans.md P2); its boundary keeps the deck's level.
  if (roof.holes.length && holeAt(roof, u, v) >= 0) return null;
  const onRim = perimeterLevelAt(roof, levels, u, v, roof.tol * 1000);
  if (onRim !== null) return onRim;
  const c = chordThrough(roof, u, v);
  return c ? chordLevel(levels, c, v) : null;
}
