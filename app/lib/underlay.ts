/** Underlay helpers shared by the server and the calibration panel. */
import { create, unitDependencies } from "mathjs";
import type { RoofSpec } from "~/engine";
import type { UnderlaySettings } from "~/lib/roof-file";

const math = create({ unitDependencies });

/** Largest plan image accepted as an underlay (the server refuses more; the panel says so first). */
export const UNDERLAY_MAX_BYTES = 10 * 1024 * 1024;
/** UNDERLAY_MAX_BYTES as people read it. */
export const UNDERLAY_MAX_LABEL = `${UNDERLAY_MAX_BYTES / 1024 / 1024} MB`;

/** The image URL, with the upload id so a new image is never served from an old cache entry. */
export function underlayUrl(roofId: string, uploadId: string): string {
  return `/roofs/${roofId}/underlay?v=${uploadId.slice(0, 8)}`;
}

function outlineOf(spec: unknown): [number, number][] {
  const outline = (spec as { outline?: unknown } | null)?.outline;
  return Array.isArray(outline)
    ? outline.filter((p): p is [number, number] => Array.isArray(p) && p.length === 2 && p.every(Number.isFinite))
    : [];
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

export type LengthResult = { ok: true; metres: number } | { ok: false; message: string };

/** A real distance as typed ("12 m", "12000 mm", "40 ft"); a bare number is metres. */
export function parseLength(text: string): LengthResult {
  // "12,000 mm" groups thousands; "7,5 m" is a decimal comma.
  const s = text
    .trim()
    .replace(/,(?=\d{3}\b)/g, "")
    .replace(/,/g, ".");
  if (!s) return { ok: false, message: "Type the real distance between the two points, such as 12 m or 12000 mm." };
  if (s.length > 40) return { ok: false, message: "That is too long for a distance." };
  let metres: number;
  if (/^[+-]?(\d+(\.\d*)?|\.\d+)$/.test(s)) {
    metres = Number(s);
  } else {
    try {
      const u = math.unit(s);
      if (!u.equalBase(math.unit("1 m")))
        return { ok: false, message: `“${text.trim()}” is not a length. Use m, mm, cm or ft.` };
      metres = u.toNumber("m");
    } catch {
      return { ok: false, message: `“${text.trim()}” is not a distance Fallwright can read. Try 12 m or 12000 mm.` };
    }
  }
  if (!Number.isFinite(metres) || metres <= 0) return { ok: false, message: "The distance must be more than zero." };
  if (metres > 10_000) return { ok: false, message: "That is over 10 km; check the unit." };
  return { ok: true, metres };
}

/** New scale from two image points and the real distance between them; point A keeps its plan position. */
export function calibrate(
  u: UnderlaySettings,
  a: [number, number],
  b: [number, number],
  metres: number,
): UnderlaySettings | null {
  const px = Math.hypot(b[0] - a[0], b[1] - a[1]);
  if (!(px > 0)) return null;
  const metresPerPixel = metres / px;
  const [ax, ay] = pixelToPlan(u, a[0], a[1]);
  return { ...u, metresPerPixel, originX: ax - a[0] * metresPerPixel, originY: ay + a[1] * metresPerPixel };
}

export function formatMetres(m: number): string {
  return `${m.toFixed(2)} m`;
}

function closestOnSegment(p: [number, number], a: [number, number], b: [number, number]): [number, number] {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const len2 = dx * dx + dy * dy;
  const t = len2 ? Math.max(0, Math.min(1, ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / len2)) : 0;
  return [a[0] + t * dx, a[1] + t * dy];
}

/**
 * The spec with a traced outline: edge kinds start again as parapets (the count changed) and
 * each outlet moves to the nearest point of the new outline, so the roof still drains somewhere
 * and the user can drag it where it belongs.
 */
export function retraceSpec(spec: RoofSpec, outline: [number, number][]): RoofSpec {
  const round = (v: number) => Math.round(v * 1000) / 1000;
  const pts = outline.map(([x, y]) => [round(x), round(y)] as [number, number]);
  const nearest = (p: [number, number]) => {
    let best: [number, number] = pts[0];
    for (let i = 0; i < pts.length; i++) {
      const c = closestOnSegment(p, pts[i], pts[(i + 1) % pts.length]);
      if (Math.hypot(c[0] - p[0], c[1] - p[1]) < Math.hypot(best[0] - p[0], best[1] - p[1])) best = c;
    }
    return [round(best[0]), round(best[1])] as [number, number];
  };
  const base = { ...spec };
  delete base.edges;
  const outlets = Array.isArray(base.outlets) ? base.outlets : [];
  return {
    ...base,
    outline: pts,
    outlets: outlets.filter((o) => Array.isArray(o?.at)).map((o) => ({ ...o, at: nearest(o.at) })),
  };
}
