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

/** The ink of the hatching on faces flatter than the minimum, and how much of it covers a stripe. */
export const HATCH_INK: [number, number, number] = [0x1f, 0x29, 0x33];
export const HATCH_MIX = 0.8;
/** The 3D view shades a face by its turn to the light: its colour times SHADE_MIN..1. */
export const SHADE_MIN = 0.62;

/** Water paths and drops: a light and a dark tone together, so one of them stands out on any face. */
export const WATER_LIGHT = "#ffffff";
export const WATER_DARK = "#0b0f19";

/** WCAG 2.x relative luminance of an sRGB colour (0..255 channels). */
export function relativeLuminance([r, g, b]: [number, number, number]): number {
  const lin = (c: number) => {
    const s = c / 255;
    return s <= 0.04045 ? s / 12.92 : ((s + 0.055) / 1.055) ** 2.4;
  };
  return 0.2126 * lin(r) + 0.7152 * lin(g) + 0.0722 * lin(b);
}

/** WCAG 2.x contrast ratio, 1 to 21. */
export function contrastRatio(a: [number, number, number], b: [number, number, number]): number {
  const [hi, lo] = [relativeLuminance(a), relativeLuminance(b)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
}

export function hexRgb(hex: string): [number, number, number] {
  const n = Number.parseInt(hex.replace("#", ""), 16);
  return [(n >> 16) & 255, (n >> 8) & 255, n & 255];
}
