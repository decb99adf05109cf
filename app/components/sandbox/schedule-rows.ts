import type { Analysis } from "~/engine";
import Papa from "papaparse";
import { formatRatio } from "./format";

/** One span of one joist, as the builder reads it. Levels and drops in millimetres. */
export interface ScheduleRow {
  joist: number;
  offset: number;
  span: number;
  startX: number;
  startY: number;
  endX: number;
  endY: number;
  length: number;
  startLevel: number;
  endLevel: number;
  startDrop: number;
  endDrop: number;
  /** Fall ratio N, null when level. */
  ratio: number | null;
}

const r3 = (v: number) => Math.round(v * 1000) / 1000;
const mm = (v: number) => Math.round(v * 1000);

/** The drop schedule (ROOF-METHOD.md §5) flattened to rows, joists and spans numbered from 1. */
export function scheduleRows(joists: Analysis["shaped"]["joists"]): ScheduleRow[] {
  const rows: ScheduleRow[] = [];
  for (const j of joists) {
    j.spans.forEach((s, k) => {
      rows.push({
        joist: j.index + 1,
        offset: r3(j.offset),
        span: k + 1,
        startX: r3(s.start[0]),
        startY: r3(s.start[1]),
        endX: r3(s.end[0]),
        endY: r3(s.end[1]),
        length: r3(s.length),
        startLevel: mm(s.startLevel),
        endLevel: mm(s.endLevel),
        startDrop: mm(s.startDrop),
        endDrop: mm(s.endDrop),
        ratio: s.ratio,
      });
    });
  }
  return rows;
}

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
