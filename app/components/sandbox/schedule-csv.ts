import Papa from "papaparse";
import type { Analysis } from "~/engine";
import { formatRatio, inchesPerFoot, type UnitSystem } from "../../lib/units";
import { scheduleRows, type ScheduleRow } from "./schedule-rows";

// Kept apart from the rows so the CSV writer stays out of the browser's bundle: the download
// comes from a resource route, and the CLI writes the same file.

type Column = [string, (r: ScheduleRow) => string | number];

/** Column headings of the CSV file, in order, with how each row fills them. */
export const CSV_COLUMNS: Column[] = [
  ["joist", (r) => r.joist],
  ["offset_m", (r) => r.offset],
  ["span", (r) => r.span],
  ["start_x_m", (r) => r.startX],
  ["start_y_m", (r) => r.startY],
  ["end_x_m", (r) => r.endX],
  ["end_y_m", (r) => r.endY],
  ["length_m", (r) => r.length],
  ["start_level_mm", (r) => r.startLevel],
  ["end_level_mm", (r) => r.endLevel],
  ["start_drop_below_H_mm", (r) => r.startDrop],
  ["end_drop_below_H_mm", (r) => r.endDrop],
  ["fall", (r) => formatRatio(r.ratio)],
];

/** Feet to 1/1000 ft (0.3048 m exactly, NIST SP 811); inches to 1/16 in, written as decimals. */
const ft = (m: number) => Math.round((m / 0.3048) * 1000) / 1000;
const inch = (m: number) => Math.round((m / 0.0254) * 16) / 16;

/** The same columns in US customary units: plan figures in feet, levels and drops in inches to 1/16. */
export const CSV_COLUMNS_US: Column[] = [
  ["joist", (r) => r.joist],
  ["offset_ft", (r) => ft(r.offset)],
  ["span", (r) => r.span],
  ["start_x_ft", (r) => ft(r.startX)],
  ["start_y_ft", (r) => ft(r.startY)],
  ["end_x_ft", (r) => ft(r.endX)],
  ["end_y_ft", (r) => ft(r.endY)],
  ["length_ft", (r) => ft(r.length)],
  ["start_level_in", (r) => inch(r.metres.startLevel)],
  ["end_level_in", (r) => inch(r.metres.endLevel)],
  ["start_drop_below_H_in", (r) => inch(r.metres.startDrop)],
  ["end_drop_below_H_in", (r) => inch(r.metres.endDrop)],
  ["fall", (r) => formatRatio(r.ratio)],
  ["fall_in_per_ft", (r) => (r.ratio == null || !Number.isFinite(r.ratio) ? "level" : inchesPerFoot(r.ratio))],
];

/** The drop schedule as CSV text (one heading row, then a row per span): the sandbox's download and the CLI. */
export function scheduleCsv(joists: Analysis["shaped"]["joists"], system: UnitSystem = "metric"): string {
  const columns = system === "us" ? CSV_COLUMNS_US : CSV_COLUMNS;
  return Papa.unparse({
    fields: columns.map(([name]) => name),
    data: scheduleRows(joists).map((r) => columns.map(([, get]) => get(r))),
  });
}
