/** Underlay helpers shared by the server and the calibration panel. */
import type { UnderlaySettings } from "~/lib/roof-file";

/** The image URL, with the upload id so a new image is never served from an old cache entry. */
export function underlayUrl(roofId: string, uploadId: string): string {
  return `/roofs/${roofId}/underlay?v=${uploadId.slice(0, 8)}`;
}

function outlineOf(spec: unknown): [number, number][] {
  const outline = (spec as { outline?: unknown } | null)?.outline;
  return Array.isArray(outline) ? outline.filter((p): p is [number, number] => Array.isArray(p) && p.length === 2 && p.every(Number.isFinite)) : [];
}

/** A first placement before calibration: the image spans the roof's width, top-left at the roof's top-left. */
export function defaultUnderlaySettings(spec: unknown, widthPx: number, heightPx: number): UnderlaySettings {
  const pts = outlineOf(spec);
  const xs = pts.map((p) => p[0]);
  const ys = pts.map((p) => p[1]);
  const width = pts.length ? Math.max(...xs) - Math.min(...xs) : 10;
  const metresPerPixel = (width > 0 ? width : 10) / widthPx;
  return {
    opacity: 0.5,
    originX: pts.length ? Math.min(...xs) : 0,
    originY: pts.length ? Math.max(...ys) : heightPx * metresPerPixel,
    metresPerPixel,
    widthPx,
    heightPx,
  };
}

/** Plan metres of an image pixel (image y runs down, plan y up). */
export function pixelToPlan(u: UnderlaySettings, px: number, py: number): [number, number] {
  return [u.originX + px * u.metresPerPixel, u.originY - py * u.metresPerPixel];
}

export function planToPixel(u: UnderlaySettings, x: number, y: number): [number, number] {
  return [(x - u.originX) / u.metresPerPixel, (u.originY - y) / u.metresPerPixel];
}
