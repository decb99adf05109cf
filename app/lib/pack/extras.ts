import type { Analysis, Point, RoofSpec } from "~/engine";

// Openings (roof lights, hatches) and ridges are being added to the engine; until every roof has
// them the pack draws them when the spec or the analysis carries them, in any of the plain forms
// below, and draws nothing otherwise.

type Loose = unknown;

const isPoint = (p: Loose): p is Point =>
  Array.isArray(p) && p.length >= 2 && Number.isFinite(p[0]) && Number.isFinite(p[1]);
const asPath = (x: Loose): Point[] | null => {
  if (Array.isArray(x) && x.length >= 2 && x.every(isPoint)) return x.map((p) => [p[0], p[1]] as Point);
  if (x && typeof x === "object") {
    const o = x as Record<string, Loose>;
    for (const key of ["outline", "points", "path", "polygon", "line"]) {
      const path = asPath(o[key]);
      if (path) return path;
    }
    if (isPoint(o.from) && isPoint(o.to))
      return [
        [o.from[0], o.from[1]],
        [o.to[0], o.to[1]],
      ];
    if (isPoint(o.start) && isPoint(o.end))
      return [
        [o.start[0], o.start[1]],
        [o.end[0], o.end[1]],
      ];
  }
  return null;
};
const paths = (list: Loose): Point[][] =>
  Array.isArray(list) ? list.map(asPath).filter((p): p is Point[] => p !== null) : [];

/** Openings in the deck, each a closed outline in plan metres (none when the roof has none). */
export function openingsOf(spec: RoofSpec): Point[][] {
  return paths((spec as { openings?: Loose }).openings).filter((p) => p.length >= 3);
}

/** Ridge lines as plan polylines, from the analysis (or the spec) when it has them. */
export function ridgesOf(spec: RoofSpec, analysis: Analysis): Point[][] {
  const found = paths((analysis.shaped as { ridges?: Loose }).ridges);
  return found.length ? found : paths((spec as { ridges?: Loose }).ridges);
}
