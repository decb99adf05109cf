import { formatRatio } from "~/engine";

/** Display helpers. The engine works in metres; people read levels and drops in millimetres. */

export const mm = (metres: number | null | undefined) => (metres == null || !Number.isFinite(metres) ? "–" : `${Math.round(metres * 1000)} mm`);

export const metres = (value: number | null | undefined, digits = 2) =>
  value == null || !Number.isFinite(value) ? "–" : `${value.toFixed(digits)} m`;

export const area = (value: number | null | undefined) => (value == null || !Number.isFinite(value) ? "–" : `${value.toFixed(1)} m²`);

export const flow = (value: number | null | undefined) => (value == null || !Number.isFinite(value) ? "–" : `${value.toFixed(2)} L/s`);

export const point = (p: [number, number]) => `(${p[0].toFixed(2)}, ${p[1].toFixed(2)})`;

/** The other two forms of a fall, for a title or a table cell: "1.43° · 2.50 %". */
export function fallDetail(ratio: number | null | undefined): string {
  if (ratio == null || !Number.isFinite(ratio)) return "level: no fall";
  const degrees = (Math.atan(1 / ratio) * 180) / Math.PI;
  return `${degrees.toFixed(2)}° · ${(100 / ratio).toFixed(2)} %`;
}

export { formatRatio };
