import Papa from "papaparse";
import type { Analysis } from "~/engine";
import { formatRatio } from "./format";
import { scheduleRows, type ScheduleRow } from "./schedule-rows";

// Kept apart from the rows so the CSV writer stays out of the browser's bundle: the download
// comes from a resource route, and the CLI writes the same file.

/** Column headings of the CSV file, in order, with how each row fills them. */
export const CSV_COLUMNS: [string, (r: ScheduleRow) => string | number][] = [
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

/** The drop schedule as CSV text (one heading row, then a row per span): the sandbox's download and the CLI. */
export function scheduleCsv(joists: Analysis["shaped"]["joists"]): string {
  return Papa.unparse({
    fields: CSV_COLUMNS.map(([name]) => name),
    data: scheduleRows(joists).map((r) => CSV_COLUMNS.map(([, get]) => get(r))),
  });
}
