import Papa from "papaparse";
import { formatRatio } from "~/engine";
import { inchesPerFoot } from "~/lib/units";
import { CAUTION_LINE } from "~/lib/caution";
import { datumText, directionDegrees, isoDate, mmOf, packFileName, packOutlets, type PackRoof } from "./facts";
import { checkPointLines } from "./measured-schedule";
import { hasMultiSpan, scheduleRows, type ScheduleRow } from "./schedule-rows";

// The one writer of the drop schedule CSV: the sandbox's download, the roof's and the share
// page's, and `npm run analyse --csv`. Kept out of the browser's bundle.

type Cell = string | number;

/**
 * Column headings with how each row fills them; `span` only when some joist has more than one,
 * `area` only when ridges divide the roof.
 */
const COLUMNS: [string, (r: ScheduleRow) => Cell][] = [
  ["area", (r) => r.area],
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

/** Feet to 1/1000 ft (0.3048 m exactly, NIST SP 811); inches to 1/16 in, written as decimals. */
const ft = (m: number) => Math.round((m / 0.3048) * 1000) / 1000;
const inch = (m: number) => Math.round((m / 0.0254) * 16) / 16;

/** The same columns in US customary units: plan figures in feet, levels and drops in inches to 1/16. */
const COLUMNS_US: [string, (r: ScheduleRow) => Cell][] = [
  ["area", (r) => r.area],
  ["joist", (r) => r.joist],
  ["span", (r) => r.span ?? ""],
  ["offset_ft", (r) => ft(r.offset)],
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

/** The header block: one `key,value…` line each, then the outlets. */
export function scheduleHeader(p: PackRoof): Cell[][] {
  const s = p.analysis.shaped;
  return [
    ["Fallwright drop schedule"],
    ["roof", p.name],
    ["date", isoDate(p.date)],
    [
      "units",
      p.units === "us"
        ? "plan positions and lengths in feet; levels and drops in inches (to 1/16)"
        : "plan positions and lengths in metres; levels and drops in millimetres",
    ],
    ["datum", datumText(p)],
    ["high_level_H_mm", mmOf(s.highLevel)],
    ["joist_spacing_mm", mmOf(s.setOut.spacing)],
    ["joist_direction_deg", directionDegrees(s.joistDirection), "anticlockwise from the plan's x axis"],
    [
      "first_joist_offset_m",
      Math.round(s.setOut.offset * 1000) / 1000,
      s.setOut.fromOutlets ? "set out from the outlets" : "as given",
    ],
    ["base_fall", formatRatio(p.analysis.baseFall.ratio)],
    ["rule_set", p.analysis.ruleSet.name],
    ["outlets", "number", "x_m", "y_m", "level_mm", "joist"],
    ...packOutlets(p).map((o) => ["outlet", o.number, o.at[0], o.at[1], o.level, o.joist] as Cell[]),
    ...planLines(p),
    ...checkPointLines(p.spec, s.joists, p.units === "us"),
    ["caution", CAUTION_LINE],
  ];
}

const r3 = (v: number) => Math.round(v * 1000) / 1000;
const ptText = (pts: [number, number][]) => pts.map((q) => `${r3(q[0])} ${r3(q[1])}`).join("; ");

/**
 * Openings, ridges and drainage areas (docs/roof-method-plans.md P2, P4), one line each, where the
 * roof has them: points as "x y" pairs in metres separated by ";".
 */
export function planLines(p: PackRoof): Cell[][] {
  const s = p.analysis.shaped;
  const lines: Cell[][] = [];
  const openings = (p.spec.openings ?? []).map((o, i) => ({ ...o, area: s.openings?.[i]?.area }));
  if (openings.length) {
    lines.push(["openings", "number", "kind", "upstand_mm", "area_m2", "outline_m"]);
    openings.forEach((o, i) =>
      lines.push([
        "opening",
        i + 1,
        o.kind ?? "other",
        mmOf(o.upstand ?? 0.15),
        o.area == null ? "" : Math.round(o.area * 100) / 100,
        ptText(o.outline),
      ]),
    );
  }
  const ridges = s.ridges ?? [];
  if (ridges.length) {
    lines.push(["ridges", "number", "kind", "line_m"]);
    for (const r of ridges) lines.push(["ridge", r.index + 1, r.kind, ptText(r.line)]);
  }
  const areas = s.areas ?? [];
  if (areas.length > 1) {
    lines.push(["areas", "number", "area_m2", "outlets", "joist_direction_deg", "own_high_level_mm"]);
    areas.forEach((a, k) =>
      lines.push([
        "area",
        k + 1,
        Math.round(a.area * 100) / 100,
        a.outlets.map((o) => `O${o + 1}`).join(" "),
        directionDegrees(a.joistDirection),
        mmOf(a.highLevel),
      ]),
    );
  }
  return lines;
}

/**
 * The columns this roof's schedule has (the span column only where a joist has more than one
 * span). With `measured`, an empty column beside each end's design level for the level measured
 * on site (docs/as-built.md, "Measured drop schedule").
 */
export function scheduleColumns(
  rows: ScheduleRow[],
  units: PackRoof["units"] = "metric",
  measured = false,
): [string, (r: ScheduleRow) => Cell][] {
  const all = units === "us" ? COLUMNS_US : COLUMNS;
  const areas = new Set(rows.map((r) => r.area)).size > 1;
  const unit = units === "us" ? "in" : "mm";
  const columns = all.filter(([name]) => (name !== "span" || hasMultiSpan(rows)) && (name !== "area" || areas));
  if (!measured) return columns;
  return columns.flatMap((c): [string, (r: ScheduleRow) => Cell][] =>
    /^(start|end)_level_/.test(c[0]) ? [c, [`${c[0].split("_")[0]}_measured_${unit}`, () => ""]] : [c],
  );
}

/**
 * The drop schedule as CSV: the header block (with the check points along long spans), an empty
 * line, then one row per joist span with an empty measured column beside each end's level.
 * Text that a spreadsheet would run as a formula (a leading =, +, -, @) is quoted with a '.
 */
export function scheduleCsv(p: PackRoof): string {
  const rows = scheduleRows(p.analysis.shaped.joists);
  const columns = scheduleColumns(rows, p.units, true);
  const header = scheduleHeader(p);
  const width = columns.length;
  const pad = (r: Cell[]) => [...r, ...Array<Cell>(Math.max(0, width - r.length)).fill("")];
  return Papa.unparse(
    [...header.map(pad), pad([]), columns.map(([name]) => name), ...rows.map((r) => columns.map(([, get]) => get(r)))],
    { escapeFormulae: true, newline: "\r\n" },
  );
}

export const scheduleFileName = (p: Pick<PackRoof, "name" | "date">) =>
  packFileName(p.name, "drop-schedule", p.date, "csv");
