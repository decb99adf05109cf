import Papa from "papaparse";
import { designLevelAt, type Analysis, type Point, type RoofSpec } from "~/engine";
import { feetInches } from "~/lib/survey-csv";

/**
 * The measured drop schedule (docs/as-built.md, "Measured drop schedule"): the drop schedule CSV
 * carries an empty measured column beside each joist end's design level, and a few check points
 * along long spans; the builder fills them on site and uploads the file back. This module names
 * the joist ends and check points, and reads a filled file: every problem names its row (as a
 * spreadsheet numbers it), and every value typed is kept, good or bad, so nothing is lost.
 */

/** A span longer than this gets check points along it, at most this far apart (common practice, no source). */
export const CHECK_POINT_SPACING = 3;

/** One place a level is measured: a joist end, or a check point along a long span. */
export interface MeasurePlace {
  /** "J4 start", "J4.2 end" (joist 4, span 2), "C3" (check point 3). */
  label: string;
  kind: "end" | "check";
  /** Joist number (from 1). */
  joist: number;
  /** Span number along the joist (from 1), null when the joist has one span. */
  span: number | null;
  /** Joist index and span index as the engine numbers them (from 0). */
  joistIndex: number;
  spanIndex: number;
  end: "start" | "end" | null;
  at: Point;
  /** Design level, metres above the datum. */
  design: number;
}

const r3 = (v: number) => Math.round(v * 1000) / 1000;

export const endLabel = (joist: number, span: number | null, end: "start" | "end") =>
  `J${joist}${span === null ? "" : `.${span}`} ${end}`;

/**
 * Every joist end of the drop schedule (docs/roof-method.md §5), then check points along spans
 * longer than CHECK_POINT_SPACING, equally spaced; a joist's level is linear along it
 * (docs/roof-method.md §4), so a check point's design level is read off its span. A span along
 * the line of a re-entrant corner, where the surface twists (docs/roof-method.md §4, "Twist"),
 * gets none: there the design surface is not the joist's straight line.
 */
export function measurePlaces(spec: RoofSpec, joists: Analysis["shaped"]["joists"]): MeasurePlace[] {
  const surface = designLevelAt(spec);
  const ends: MeasurePlace[] = [];
  const checks: MeasurePlace[] = [];
  for (const j of joists) {
    j.spans.forEach((s, k) => {
      const span = j.spans.length > 1 ? k + 1 : null;
      const base = { joist: j.index + 1, span, joistIndex: j.index, spanIndex: k };
      ends.push({
        ...base,
        label: endLabel(j.index + 1, span, "start"),
        kind: "end",
        end: "start",
        at: s.start,
        design: s.startLevel,
      });
      ends.push({
        ...base,
        label: endLabel(j.index + 1, span, "end"),
        kind: "end",
        end: "end",
        at: s.end,
        design: s.endLevel,
      });
      if (s.length > CHECK_POINT_SPACING + 1e-9) {
        const parts = Math.ceil(s.length / CHECK_POINT_SPACING);
        for (let i = 1; i < parts; i++) {
          const t = i / parts;
          const at: Point = [s.start[0] + t * (s.end[0] - s.start[0]), s.start[1] + t * (s.end[1] - s.start[1])];
          const design = s.startLevel + t * (s.endLevel - s.startLevel);
          const onSurface = surface(at);
          if (onSurface === null || Math.abs(onSurface - design) > 0.0005) continue;
          checks.push({
            ...base,
            label: `C${checks.length + 1}`,
            kind: "check",
            end: null,
            at,
            design,
          });
        }
      }
    });
  }
  return [...ends, ...checks];
}

/** The check points' lines for the schedule CSV's header block (`check_point`, label, joist, span, x, y, level, measured). */
export function checkPointLines(
  spec: RoofSpec,
  joists: Analysis["shaped"]["joists"],
  us: boolean,
): (string | number)[][] {
  const checks = measurePlaces(spec, joists).filter((p) => p.kind === "check");
  if (!checks.length) return [];
  const plan = (m: number) => (us ? Math.round((m / 0.3048) * 1000) / 1000 : r3(m));
  const level = (m: number) => (us ? Math.round((m / 0.0254) * 16) / 16 : Math.round(m * 1000));
  const u = us ? ["ft", "in"] : ["m", "mm"];
  return [
    [
      "check_points",
      "point",
      "joist",
      "span",
      `x_${u[0]}`,
      `y_${u[0]}`,
      `level_${u[1]}`,
      `measured_level_${u[1]}`,
      "along long spans: measure here too",
    ],
    ...checks.map((c) => [
      "check_point",
      c.label,
      c.joist,
      c.span ?? "",
      plan(c.at[0]),
      plan(c.at[1]),
      level(c.design),
      "",
    ]),
  ];
}

export interface MeasuredIssue {
  /** Row in the file as a spreadsheet numbers it (from 1), or 0 for the file as a whole. */
  row: number;
  label?: string;
  kind: "missing" | "unknown" | "units" | "typo" | "format";
  message: string;
}

export interface MeasuredEntry {
  label: string;
  row: number;
  /** What was typed, as typed (so a form can show it again). */
  raw: string;
  /** Metres, when it reads cleanly. */
  level: number | null;
}

export interface MeasuredParse {
  ok: boolean;
  units: "metric" | "us";
  /** Every value typed, by place label, good or bad. */
  entries: MeasuredEntry[];
  /** The clean measured points, at the design's own positions. */
  points: { at: Point; level: number; label: string }[];
  issues: MeasuredIssue[];
}

/** The most rows a measured file may have (a 100 × 100 m roof at 0.3 m has about 700 spans). */
export const MEASURED_MAX_ROWS = 5000;

/** A typed level to metres, in the file's units; a string says what is wrong with it. */
export function readLevel(raw: string, units: "metric" | "us"): number | string {
  const s = raw.trim().toLowerCase();
  if (units === "metric") {
    if (/['"″′]|\bin\b|inch|\bft\b|feet|foot/.test(s))
      return "is in feet or inches, but this file's levels are in millimetres";
    const m = /^([+-]?(?:\d+(?:\.\d*)?|\.\d+))\s*(mm|m)?$/.exec(s);
    if (!m) return "is not a number of millimetres";
    const v = Number(m[1]);
    return m[2] === "m" ? v : v / 1000;
  }
  if (/\d\s*(mm|m|cm)$/.test(s)) return "is in metric units, but this file's levels are in inches";
  // Inches: 1.5, 1-1/2, 1 1/2, 1/2, with or without ", or feet and inches 0' 1-1/2".
  if (/['′]|ft|feet|foot/.test(s)) {
    const v = feetInches(s);
    return v === null ? "is not a length in inches (e.g. 1-1/2)" : v;
  }
  const m = /^([+-])?\s*(?:(\d+(?:\.\d+)?)(?:\s+|-)?)?(?:(\d+)\/(\d+))?\s*(?:"|in|inch|inches|″)?$/.exec(s);
  if (!m || (!m[2] && !m[3]) || (m[4] !== undefined && Number(m[4]) === 0))
    return "is not a length in inches (e.g. 1-1/2)";
  const inches = Number(m[2] ?? 0) + (m[3] ? Number(m[3]) / Number(m[4]) : 0);
  return (m[1] === "-" ? -1 : 1) * inches * 0.0254;
}

/** A level far from the design that would sit on it with the decimal point moved (or in metres, not mm). */
function typo(level: number, design: number, units: "metric" | "us"): string | null {
  const off = Math.abs(level - design);
  if (off <= 0.05) return null;
  const near = (v: number) => Math.abs(v - design) <= 0.01;
  if (near(level / 10)) return "is 10× the design level: check the decimal point";
  if (near(level * 10)) return "is a tenth of the design level: check the decimal point";
  if (units === "metric" && near(level * 1000)) return "looks like metres: this column is in millimetres";
  return null;
}

const findColumn = (header: string[], re: RegExp) => header.findIndex((h) => re.test(h.trim().toLowerCase()));

/**
 * Read a filled measured schedule against the roof's analysis. Joist ends are found by joist (and
 * span) number and take the design's own positions; check points by their label. Every problem
 * names its row; clean values become points for the as-built check (docs/as-built.md).
 */
export function parseMeasuredSchedule(
  text: string,
  spec: RoofSpec,
  joists: Analysis["shaped"]["joists"],
): MeasuredParse {
  const rows = Papa.parse<string[]>(text.replace(/^\uFEFF/, ""), { skipEmptyLines: false }).data;
  const issues: MeasuredIssue[] = [];
  const entries: MeasuredEntry[] = [];
  const places = measurePlaces(spec, joists);
  const byLabel = new Map(places.map((p) => [p.label, p]));
  const unitsLine = rows.find((r) => (r[0] ?? "").trim().toLowerCase() === "units");
  const tableAt = rows.findIndex((r) => (r[0] ?? "").trim().toLowerCase() === "joist");
  const header = tableAt >= 0 ? rows[tableAt] : [];
  const usByHeader = header.some((h) => /_in$/.test(h.trim()));
  const units: "metric" | "us" = usByHeader || /feet|inches/i.test(unitsLine?.[1] ?? "") ? "us" : "metric";
  const fail = (issue: MeasuredIssue): MeasuredParse => ({ ok: false, units, entries, points: [], issues: [issue] });
  if (rows.length > MEASURED_MAX_ROWS)
    return fail({
      row: 0,
      kind: "format",
      message: `At most ${MEASURED_MAX_ROWS} rows; this file has ${rows.length}.`,
    });
  if (tableAt < 0)
    return fail({
      row: 0,
      kind: "format",
      message: "No drop schedule table in this file: it needs the header row starting with “joist” from the download.",
    });
  const col = {
    joist: 0,
    span: findColumn(header, /^span$/),
    startMeasured: findColumn(header, /^start_measured/),
    endMeasured: findColumn(header, /^end_measured/),
  };
  if (col.startMeasured < 0 || col.endMeasured < 0)
    return fail({
      row: tableAt + 1,
      kind: "format",
      message: `Row ${tableAt + 1}: the table has no start_measured and end_measured columns. Download the drop schedule again and fill those.`,
    });
  const suffix = units === "us" ? "in" : "mm";

  const take = (row: number, label: string, raw: string, place: MeasurePlace) => {
    const typed = raw.trim();
    if (typed === "") {
      entries.push({ label, row, raw: "", level: null });
      issues.push({ row, label, kind: "missing", message: `Row ${row}: ${label} has no measured level.` });
      return;
    }
    const v = readLevel(typed, units);
    if (typeof v === "string") {
      entries.push({ label, row, raw: typed, level: null });
      issues.push({ row, label, kind: "units", message: `Row ${row}: ${label} "${typed.slice(0, 20)}" ${v}.` });
      return;
    }
    if (!Number.isFinite(v) || Math.abs(v) > 10) {
      entries.push({ label, row, raw: typed, level: null });
      issues.push({
        row,
        label,
        kind: "typo",
        message: `Row ${row}: ${label} ${typed} ${suffix} is over 10 m from the datum: check the value.`,
      });
      return;
    }
    const t = typo(v, place.design, units);
    entries.push({ label, row, raw: typed, level: t ? null : v });
    if (t) {
      issues.push({
        row,
        label,
        kind: "typo",
        message: `Row ${row}: ${label} ${typed} ${suffix} ${t} (design ${units === "us" ? `${Math.round((place.design / 0.0254) * 16) / 16} in` : `${Math.round(place.design * 1000)} mm`}).`,
      });
    }
  };

  // Check points in the header block.
  rows.slice(0, tableAt).forEach((r, k) => {
    if ((r[0] ?? "").trim().toLowerCase() !== "check_point") return;
    const row = k + 1;
    const label = (r[1] ?? "").trim();
    const place = byLabel.get(label);
    if (!place || place.kind !== "check") {
      issues.push({
        row,
        kind: "unknown",
        message: `Row ${row}: check point "${label.slice(0, 20)}" is not one of this roof's check points.`,
      });
      return;
    }
    take(row, label, r[7] ?? "", place);
  });

  // The table: one row per joist span.
  rows.slice(tableAt + 1).forEach((r, k) => {
    const row = tableAt + 2 + k;
    if (r.every((c) => c.trim() === "")) return;
    const joistText = (r[col.joist] ?? "").trim();
    const spanText = col.span >= 0 ? (r[col.span] ?? "").trim() : "";
    const joist = /^\d+$/.test(joistText) ? Number(joistText) : NaN;
    const span = spanText === "" ? null : /^\d+$/.test(spanText) ? Number(spanText) : NaN;
    const start = byLabel.get(Number.isFinite(joist) && !Number.isNaN(span) ? endLabel(joist, span, "start") : "");
    if (!start) {
      const typed = [r[col.startMeasured], r[col.endMeasured]].filter((c) => (c ?? "").trim() !== "");
      issues.push({
        row,
        kind: "unknown",
        message: `Row ${row}: joist "${joistText.slice(0, 12)}"${spanText ? ` span "${spanText.slice(0, 6)}"` : ""} is not in this roof's drop schedule${typed.length ? ` (its values ${typed.map((c) => c.trim()).join(", ")} were not used)` : ""}.`,
      });
      return;
    }
    take(row, start.label, r[col.startMeasured] ?? "", start);
    take(row, endLabel(joist, span, "end"), r[col.endMeasured] ?? "", byLabel.get(endLabel(joist, span, "end"))!);
  });

  const points = entries.flatMap((e) =>
    e.level === null ? [] : [{ at: byLabel.get(e.label)!.at, level: e.level, label: e.label }],
  );
  if (!entries.length && !issues.length)
    issues.push({ row: 0, kind: "missing", message: "The file has no joist rows to read." });
  return { ok: issues.length === 0, units, entries, points, issues };
}
