import type { FaceData } from "./faces";
import { formatRatio } from "./fall";
import type { Band } from "./types";

/** Band edges of the fall map as ratios N (docs/roof-method.md §6); a setting. */
export const DEFAULT_BAND_EDGES: readonly number[] = [40, 60, 80, 100];

/** Ratio N of a slope; a level face has no ratio (Infinity). */
export const ratioOfSlope = (slope: number) => (slope > 0 ? 1 / slope : Infinity);

/**
 * Area of the faces in each fall band. A face exactly on a band edge counts with the steeper
 * band; level faces are in the flattest band.
 */
export function fallMap(faces: FaceData, minFallRatio: number, edges: readonly number[] = DEFAULT_BAND_EDGES) {
  const sorted = [...edges].filter((e) => e > 0 && Number.isFinite(e)).sort((a, b) => a - b);
  const areas = new Float64Array(sorted.length + 1);
  // Compare squared slopes, not ratios: a face is in band b when its slope is below 1/edge of
  // every edge before b.
  const below = sorted.map((e) => 1 / (e * (1 + 1e-9)) ** 2);
  const flatSlope2 = 1 / (minFallRatio * (1 + 1e-9)) ** 2;
  let flatter = 0;
  let total = 0;
  const F = faces.area.length;
  const { area, slope2 } = faces;
  const nb = below.length;
  for (let f = 0; f < F; f++) {
    const s = slope2[f];
    const a = area[f];
    total += a;
    let band = 0;
    while (band < nb && s < below[band]) band++;
    areas[band] += a;
    if (s < flatSlope2) flatter += a;
  }
  const bands: Band[] = [];
  for (let b = 0; b <= sorted.length; b++) {
    const lo = b === 0 ? 0 : sorted[b - 1];
    const hi = b < sorted.length ? sorted[b] : null;
    const label =
      b === 0
        ? `steeper than ${formatRatio(hi!)}`
        : hi === null
          ? `flatter than ${formatRatio(lo)}`
          : `${formatRatio(lo)}-${formatRatio(hi)}`;
    bands.push({ label, minRatio: lo, maxRatio: hi, area: areas[b] });
  }
  return { faces: F, areaByBand: bands, flatterThanMinimumArea: flatter, area: total };
}
