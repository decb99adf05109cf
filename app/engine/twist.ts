import { chordsAt, type Chord } from "./chords";
import { perimeterLevelAt, chordLevel } from "./surface";
import type { PerimeterLevels } from "./perimeter";
import { toPlan, type Roof } from "./roof";
import type { Warning } from "./types";

/** Twists smaller than this (metres) are not worth a warning. */
export const TWIST_THRESHOLD = 0.001;

/** The surface as seen from one side of the line u: its chord there, else the parapet on the line. */
function levelOnSide(roof: Roof, levels: PerimeterLevels, chords: Chord[], u: number, v: number): number | null {
  for (const c of chords) if (v >= c.vA && v <= c.vB) return chordLevel(levels, c, v);
  return perimeterLevelAt(roof, levels, u, v, roof.tol * 1000);
}

/**
 * On a non-convex outline, the chords either side of a line through a re-entrant corner differ
 * in length, so the surface jumps there and twists sharply between the two joists that straddle
 * it (docs/roof-method.md §4). Reports each such place with the level difference between those joists.
 */
export function twistWarnings(roof: Roof, levels: PerimeterLevels, joists: Float64Array): Warning[] {
  if (roof.convex) return [];
  const warnings: Warning[] = [];
  const seen = new Set<number>();
  for (let i = 0; i < roof.n; i++) {
    if (!roof.reflex[i]) continue;
    const ur = roof.us[i];
    if (seen.has(ur)) continue;
    seen.add(ur);
    // The joists either side of the corner's line.
    let k = 0;
    while (k + 1 < joists.length && joists[k + 1] <= ur) k++;
    const uLeft = joists[k] < ur ? joists[k] : ur - roof.spacing / 2;
    const uRight = k + 1 < joists.length && joists[k + 1] > ur ? joists[k + 1] : ur + roof.spacing / 2;
    let worst = 0;
    let worstV = roof.vs[i];
    const left = chordsAt(roof, ur, -1);
    const right = chordsAt(roof, ur, 1);
    const samples: number[] = [roof.vs[i]];
    for (let s = 0; s <= 64; s++) samples.push(roof.vmin + ((roof.vmax - roof.vmin) * s) / 64);
    for (const c of [...left, ...right]) samples.push(c.vA, c.vB);
    for (const v of samples) {
      const a = levelOnSide(roof, levels, left, ur, v);
      const b = levelOnSide(roof, levels, right, ur, v);
      if (a === null || b === null) continue;
      const jump = Math.abs(a - b);
      if (jump > worst) {
        worst = jump;
        worstV = v;
      }
    }
    if (worst <= TWIST_THRESHOLD) continue;
    const ul = Math.max(uLeft, roof.umin);
    const ur2 = Math.min(uRight, roof.umax);
    const zl = levelOnSide(roof, levels, chordsAt(roof, ul, 1), ul, worstV);
    const zr = levelOnSide(roof, levels, chordsAt(roof, ur2, -1), ur2, worstV);
    const size = zl !== null && zr !== null ? Math.max(Math.abs(zl - zr), worst) : worst;
    warnings.push({
      code: "twist",
      message: `The surface twists by ${Math.round(size * 1000)} mm between two neighbouring joists at the line through a re-entrant corner; chords either side differ in length. Consider a joist direction that avoids it, an outlet nearer the corner, or a separate bay.`,
      at: toPlan(roof, ur, worstV),
      size,
    });
  }
  return warnings;
}
