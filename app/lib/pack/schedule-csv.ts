import Papa from "papaparse";
import { formatRatio } from "~/engine";
import { CAUTION_LINE } from "~/lib/caution";
import { datumText, directionDegrees, isoDate, mmOf, packFileName, packOutlets, type PackRoof } from "./facts";
import { hasMultiSpan, scheduleRows, type ScheduleRow } from "./schedule-rows";

// The one writer of the drop schedule CSV: the sandbox's download, the roof's and the share
// page's, and `npm run analyse --csv`. Kept out of the browser's bundle.

type Cell = string | number;

/** Column headings with how each row fills them; `span` only when some joist has more than one. */
const COLUMNS: [string, (r: ScheduleRow) => Cell][] = [
  ["joist", (r) => r.joist],
  ["span", (r) => r.span ?? ""],
  ["offset_m", (r) => r.offset],
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

/** The header block: one `key,value…` line each, then the outlets. */
export function scheduleHeader(p: PackRoof): Cell[][] {
  const s = p.analysis.shaped;
  return [
    ["Fallwright drop schedule"],
    ["roof", p.name],
    ["date", isoDate(p.date)],
    ["units", "plan positions and lengths in metres; levels and drops in millimetres"],
    ["datum", datumText(p)],
    ["high_level_H_mm", mmOf(s.highLevel)],
    ["joist_spacing_mm", mmOf(s.setOut.spacing)],
    ["joist_direction_deg", directionDegrees(s.joistDirection), "anticlockwise from the plan's x axis"],
    ["first_joist_offset_m", Math.round(s.setOut.offset * 1000) / 1000, s.setOut.fromOutlets ? "set out from the outlets" : "as given"],
    ["base_fall", formatRatio(p.analysis.baseFall.ratio)],
    ["rule_set", p.analysis.ruleSet.name],
    ["outlets", "number", "x_m", "y_m", "level_mm", "joist"],
    ...packOutlets(p).map((o) => ["outlet", o.number, o.at[0], o.at[1], o.level, o.joist] as Cell[]),
    ["caution", CAUTION_LINE],
  ];
}

/** The columns this roof's schedule has (the span column only where a joist has more than one span). */
export function scheduleColumns(rows: ScheduleRow[]): [string, (r: ScheduleRow) => Cell][] {
  return hasMultiSpan(rows) ? COLUMNS : COLUMNS.filter(([name]) => name !== "span");
}

/**
 * The drop schedule as CSV: the header block, an empty line, then one row per joist span.
 * Text that a spreadsheet would run as a formula (a leading =, +, -, @) is quoted with a '.
 */
export function scheduleCsv(p: PackRoof): string {
  const rows = scheduleRows(p.analysis.shaped.joists);
  const columns = scheduleColumns(rows);
  const header = scheduleHeader(p);
  const width = columns.length;
  const pad = (r: Cell[]) => [...r, ...Array<Cell>(Math.max(0, width - r.length)).fill("")];
  return Papa.unparse(
    [...header.map(pad), pad([]), columns.map(([name]) => name), ...rows.map((r) => columns.map(([, get]) => get(r)))],
    { escapeFormulae: true, newline: "\r\n" },
  );
}

export const scheduleFileName = (p: Pick<PackRoof, "name" | "date">) => packFileName(p.name, "drop-schedule", p.date, "csv");
