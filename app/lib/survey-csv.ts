import Papa from "papaparse";

/**
 * Survey import (docs/as-built.md): a CSV of measured points, x, y, level, and an optional
 * label (a joist end's name from the drop schedule, or any note). With or without a header row;
 * metres, or feet and inches (12' 6-1/2", 12 ft 6 in, or plain numbers as feet). Every problem
 * names its row (as a spreadsheet numbers it, header included), and the good rows are kept.
 */
export type SurveyUnits = "m" | "ft-in";

export interface SurveyRow {
  /** Row number in the file, 1-based. */
  row: number;
  at: [number, number];
  /** Metres. */
  level: number;
  label?: string;
}

export interface SurveyIssue {
  row: number;
  column?: "x" | "y" | "level" | "label";
  message: string;
}

export interface SurveyParse {
  ok: boolean;
  units: SurveyUnits;
  header: boolean;
  /** The rows that read cleanly, in metres. */
  points: SurveyRow[];
  issues: SurveyIssue[];
}

export interface SurveyOptions {
  /** "auto" (default): feet and inches when any value has ' or " or ft/in, else metres. */
  units?: SurveyUnits | "auto";
  /** The design level at a plan point (metres), to catch a level typed 10× off. */
  designLevel?: (at: [number, number]) => number | null;
  /** Known labels (joist ends of the drop schedule); a label outside it is refused. */
  labels?: ReadonlySet<string>;
  maxRows?: number;
}

/** The international foot, exactly 0.3048 m (International Yard and Pound Agreement, 1959). */
export const FOOT = 0.3048;

const IMPERIAL = /['"′″]|\bft\b|\bin\b|feet|foot|inch/i;
const COLUMNS = ["x", "y", "level", "label"] as const;

/** A length in feet and inches ("12' 6-1/2"", "12 ft 6 in", "-0' 1/4"", "3.5") to metres; null if unreadable. */
export function feetInches(text: string): number | null {
  let s = text.trim().toLowerCase().replace(/′/g, "'").replace(/″/g, '"');
  let sign = 1;
  if (/^[+-]/.test(s)) {
    sign = s[0] === "-" ? -1 : 1;
    s = s.slice(1).trim();
  }
  if (s === "") return null;
  // A plain number in a feet-and-inches file is feet.
  if (/^\d+(\.\d+)?$/.test(s)) return sign * Number(s) * FOOT;
  let feet = 0;
  const f = /^(\d+(?:\.\d+)?)\s*(?:'|ft|feet|foot)\s*-?\s*/.exec(s);
  if (f) {
    feet = Number(f[1]);
    s = s.slice(f[0].length);
  }
  let inches = 0;
  if (s !== "") {
    // 6, 6.5, 6-1/2, 6 1/2 or 1/2, then " or in.
    const i = /^(?:(\d+(?:\.\d+)?)(?:\s+|-)?)?(?:(\d+)\/(\d+))?\s*(?:"|in|inch|inches)$/.exec(s);
    if (!i || (!i[1] && !i[2])) return null;
    if (i[3] !== undefined && Number(i[3]) === 0) return null;
    inches = Number(i[1] ?? 0) + (i[2] ? Number(i[2]) / Number(i[3]) : 0);
  } else if (!f) return null;
  return sign * (feet * 12 + inches) * (FOOT / 12);
}

function metres(text: string): number | null {
  const s = text.trim().replace(/\s*m$/i, "");
  return /^[+-]?(\d+(\.\d*)?|\.\d+)(e[+-]?\d+)?$/i.test(s) ? Number(s) : null;
}

export function parseSurveyCsv(text: string, options: SurveyOptions = {}): SurveyParse {
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ""), { skipEmptyLines: "greedy" });
  const rows = parsed.data;
  const issues: SurveyIssue[] = [];
  const points: SurveyRow[] = [];
  // A header is a first row whose x and y are not numbers; its names may reorder the columns.
  const first = rows[0] ?? [];
  const header = first.length >= 2 && metres(first[0] ?? "") === null && feetInches(first[0] ?? "") === null;
  let order: number[] = [0, 1, 2, 3];
  if (header) {
    const names = first.map((h) => h.trim().toLowerCase());
    const find = (re: RegExp) => names.findIndex((n) => re.test(n));
    const ix = [
      find(/^x\b|east/),
      find(/^y\b|north/),
      find(/level|height|^z\b|elev/),
      find(/label|name|joist|point|note/),
    ];
    const missing = COLUMNS.slice(0, 3).filter((_, k) => ix[k] < 0);
    if (missing.length) {
      return {
        ok: false,
        units: "m",
        header,
        points,
        issues: [{ row: 1, message: `The header has no ${missing.join(", ")} column (found: ${first.join(", ")}).` }],
      };
    }
    order = ix;
  }
  const body = header ? rows.slice(1) : rows;
  const max = options.maxRows ?? 2000;
  if (body.length > max) {
    return {
      ok: false,
      units: "m",
      header,
      points,
      issues: [{ row: (header ? 1 : 0) + max + 1, message: `At most ${max} rows; this file has ${body.length}.` }],
    };
  }
  const headerUnits = header && IMPERIAL.test(first.join(" ").replace(/\blabel\b|\bpoint\b/gi, "")) ? "ft-in" : null;
  const valuesImperial = body.some((r) => order.slice(0, 3).some((k) => /['"′″]|ft|in/i.test(r[k] ?? "")));
  const units: SurveyUnits =
    options.units && options.units !== "auto" ? options.units : (headerUnits ?? (valuesImperial ? "ft-in" : "m"));
  const read = units === "m" ? metres : feetInches;
  const unitWord = units === "m" ? "metres (e.g. 12.35)" : `feet and inches (e.g. 12' 6-1/2")`;

  body.forEach((r, k) => {
    const row = k + 1 + (header ? 1 : 0);
    const values: (number | null)[] = [];
    let bad = false;
    for (let c = 0; c < 3; c++) {
      const raw = (r[order[c]] ?? "").trim();
      if (raw === "") {
        issues.push({ row, column: COLUMNS[c], message: `Row ${row}: ${COLUMNS[c]} is missing.` });
        bad = true;
        values.push(null);
        continue;
      }
      const v = read(raw);
      if (v === null || !Number.isFinite(v)) {
        const hint =
          units === "m" && feetInches(raw) !== null && /['"]/.test(raw)
            ? " It looks like feet and inches: choose that unit for the whole file."
            : "";
        issues.push({
          row,
          column: COLUMNS[c],
          message: `Row ${row}: ${COLUMNS[c]} "${raw.slice(0, 30)}" is not a length in ${unitWord}.${hint}`,
        });
        bad = true;
      }
      values.push(v);
    }
    const labelRaw = order[3] >= 0 ? (r[order[3]] ?? "").trim() : "";
    if (labelRaw && options.labels && !options.labels.has(labelRaw)) {
      issues.push({
        row,
        column: "label",
        message: `Row ${row}: "${labelRaw.slice(0, 40)}" is not a joist end of this roof's drop schedule.`,
      });
      bad = true;
    }
    if (bad) return;
    const [x, y, level] = values as number[];
    if (units === "m" && Math.abs(level) >= 10) {
      issues.push({
        row,
        column: "level",
        message: `Row ${row}: level ${level} m is over 10 m: was it typed in millimetres? Give metres (${(level / 1000).toFixed(3)}).`,
      });
      return;
    }
    const design = options.designLevel?.([x, y]);
    if (design !== undefined && design !== null) {
      const off = Math.abs(level - design);
      // 10× off: far from the design, yet within 10 mm of it once moved one decimal place.
      for (const f of [10, 0.1]) {
        if (off > 0.1 && Math.abs(level / f - design) <= 0.01) {
          issues.push({
            row,
            column: "level",
            message: `Row ${row}: level ${fmt(level)} is ${f === 10 ? "10× the" : "a tenth of the"} design level ${fmt(design)}: check the decimal point.`,
          });
          return;
        }
      }
    }
    points.push({ row, at: [x, y], level, ...(labelRaw ? { label: labelRaw } : {}) });
  });
  if (!body.length) issues.push({ row: header ? 1 : 0, message: "The file has no measured points." });
  return { ok: issues.length === 0, units, header, points, issues };
}

const fmt = (m: number) => `${Math.round(m * 10000) / 10000} m`;
