/** Display helpers. The engine works in metres; people read levels and drops in millimetres or inches. */
import { useMemo } from "react";
import { useUnits } from "~/components/units";
import {
  fallDetail as unitsFallDetail,
  formatArea,
  formatFall,
  formatFlow,
  formatLength,
  formatLevel,
  formatPoint,
  type UnitSystem,
} from "~/lib/units";

export const mm = (metres: number | null | undefined) =>
  metres == null || !Number.isFinite(metres) ? "–" : `${Math.round(metres * 1000)} mm`;

export const metres = (value: number | null | undefined, digits = 2) =>
  value == null || !Number.isFinite(value) ? "–" : `${value.toFixed(digits)} m`;

export const area = (value: number | null | undefined) =>
  value == null || !Number.isFinite(value) ? "–" : `${value.toFixed(1)} m²`;

export const flow = (value: number | null | undefined) =>
  value == null || !Number.isFinite(value) ? "–" : `${value.toFixed(2)} L/s`;

export const point = (p: [number, number]) => `(${p[0].toFixed(2)}, ${p[1].toFixed(2)})`;

/** The other two forms of a fall, for a title or a table cell: "1.43° · 2.50 %". */
export function fallDetail(ratio: number | null | undefined): string {
  if (ratio == null || !Number.isFinite(ratio)) return "level: no fall";
  const degrees = (Math.atan(1 / ratio) * 180) / Math.PI;
  return `${degrees.toFixed(2)}° · ${(100 / ratio).toFixed(2)}\u00a0%`;
}

export { formatRatio } from "~/lib/units";

/** The display helpers above in the units chosen for this page or roof (app/lib/units.ts). */
export function formatIn(system: UnitSystem) {
  return {
    system,
    /** A level, drop or height: mm, or inches to 1/16. */
    mm: (v: number | null | undefined) => formatLevel(v, system),
    /** A plan length: m, or feet and inches. */
    metres: (v: number | null | undefined, digits = 2) => formatLength(v, system, digits),
    area: (v: number | null | undefined) => formatArea(v, system),
    flow: (v: number | null | undefined) => formatFlow(v, system),
    point: (p: [number, number]) => formatPoint(p, system),
    /** A fall as 1:N, or "1/4 in per ft (1:48)". */
    fall: (ratio: number | null | undefined) => formatFall(ratio, system),
    fallDetail: (ratio: number | null | undefined) => unitsFallDetail(ratio, system),
  };
}

export type Formatters = ReturnType<typeof formatIn>;

export function useFormat(): Formatters {
  const system = useUnits();
  return useMemo(() => formatIn(system), [system]);
}
