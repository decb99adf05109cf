/**
 * The fall map's colour scale: cividis (Nuñez, Anderton & Renslow 2018, PLOS ONE 13(7) e0199239),
 * designed to read the same with and without colour-vision deficiency, evaluated with the
 * published degree-5 polynomial fit (as in d3-scale-chromatic's interpolateCividis).
 * Position on the scale is log N: equal steps of the scale are equal ratios of fall.
 */

/** Steepest and flattest falls the scale spreads over; anything beyond sits at the end colours. */
export const SCALE_STEEP = 20;
export const SCALE_FLAT = 200;

const clamp01 = (t: number) => (t < 0 ? 0 : t > 1 ? 1 : t);
const byte = (v: number) => Math.max(0, Math.min(255, Math.round(v)));

/** cividis(t) as [r, g, b] in 0..255, t in 0..1 (dark blue → yellow). */
export function cividis(t: number): [number, number, number] {
  t = clamp01(t);
  return [
    byte(-4.54 - t * (35.34 - t * (2381.73 - t * (6402.7 - t * (7024.72 - t * 2710.57))))),
    byte(32.49 + t * (170.73 + t * (52.82 - t * (131.46 - t * (176.58 - t * 67.37))))),
    byte(81.24 + t * (442.36 - t * (2482.43 - t * (6167.24 - t * (6614.94 - t * 2475.67))))),
  ];
}

/** Scale position of a fall 1:N; a level face (null or ∞) sits at the flat end. */
export function fallPosition(ratio: number | null | undefined): number {
  if (ratio == null || !Number.isFinite(ratio)) return 1;
  return clamp01((Math.log(ratio) - Math.log(SCALE_STEEP)) / (Math.log(SCALE_FLAT) - Math.log(SCALE_STEEP)));
}

export function fallColour(ratio: number | null | undefined): [number, number, number] {
  return cividis(fallPosition(ratio));
}

export function fallColourCss(ratio: number | null | undefined): string {
  const [r, g, b] = fallColour(ratio);
  return `rgb(${r} ${g} ${b})`;
}

/** Legend ticks in 1:N: the ratios people quote, spread along the log scale. */
export const LEGEND_TICKS = [20, 40, 60, 100, 200];

/** A CSS gradient for the legend bar, sampled finely enough to look continuous. */
export function legendGradient(): string {
  const stops = Array.from({ length: 17 }, (_, i) => {
    const t = i / 16;
    const [r, g, b] = cividis(t);
    return `rgb(${r} ${g} ${b}) ${(t * 100).toFixed(1)}%`;
  });
  return `linear-gradient(to right, ${stops.join(", ")})`;
}
