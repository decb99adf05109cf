import type { Analysis } from "~/engine";

/**
 * The joist the section view cuts along: the one chosen (0-based), or, before anyone chooses
 * (-1), the one that drops most, which on a shaped roof runs through an outlet.
 */
export function sectionJoistIndex(joists: Analysis["shaped"]["joists"], chosen: number): number {
  if (joists.length === 0) return -1;
  if (chosen >= 0) return Math.min(chosen, joists.length - 1);
  let best = 0;
  let bestDrop = -Infinity;
  joists.forEach((j, i) => {
    const drop = Math.max(...j.spans.map((s) => Math.max(s.startDrop, s.endDrop)), 0);
    if (drop > bestDrop + 1e-9) {
      bestDrop = drop;
      best = i;
    }
  });
  return best;
}
