import { create, fractionDependencies, unitDependencies } from "mathjs";

/**
 * Metric or US customary, at the edges only: roofs are stored and analysed in metres; this module
 * reads what people type and writes what they read. Conversions go through mathjs units, whose
 * inch is 0.0254 m exactly (the international yard and pound agreement of 1959, as NIST SP 811
 * gives it).
 */
const math = create({ unitDependencies, fractionDependencies });

export {
  isUnitSystem,
  systemFor,
  UNIT_SYSTEMS,
  UNIT_SYSTEM_LABELS,
  UNITS_STORAGE_KEY,
  type UnitSystem,
  type UnitsPreference,
} from "./unit-system";
import type { UnitSystem } from "./unit-system";

const NBSP = "\u00a0";
const NONE = "–";
const finite = (v: number | null | undefined): v is number => v != null && Number.isFinite(v);

const toUnit = (metres: number, unit: string) => math.unit(metres, "m").toNumber(unit);

/** 7/16, or "" for zero sixteenths. */
function sixteenths(n: number): string {
  if (n === 0) return "";
  let num = n;
  let den = 16;
  while (num % 2 === 0) {
    num /= 2;
    den /= 2;
  }
  return `${num}/${den}`;
}

/** Inches rounded to 1/16: "5 7/8", "0", "1/4". */
function inchesText(inches: number, zeroWhole = false): string {
  const n16 = Math.round(Math.abs(inches) * 16);
  const whole = Math.floor(n16 / 16);
  const frac = sixteenths(n16 % 16);
  const sign = inches < 0 && n16 > 0 ? "−" : "";
  if (!frac) return `${sign}${whole}`;
  return whole || zeroWhole ? `${sign}${whole} ${frac}` : `${sign}${frac}`;
}

/** A plan length: "12.50 m", or feet and inches to 1/16 in: 41' 0 1/8". */
export function formatLength(metres: number | null | undefined, system: UnitSystem, digits = 2): string {
  if (!finite(metres)) return NONE;
  if (system === "metric") return `${metres.toFixed(digits)}${NBSP}m`;
  const n16 = Math.round(Math.abs(toUnit(metres, "inch")) * 16);
  const feet = Math.floor(n16 / 192);
  const rest = inchesText((n16 - feet * 192) / 16, feet > 0);
  const sign = metres < 0 && n16 > 0 ? "−" : "";
  return feet ? `${sign}${feet}'${NBSP}${rest}"` : `${sign}${rest}"`;
}

/** A level, a drop or a height: "150 mm", or inches to 1/16: "5 7/8 in". */
export function formatLevel(metres: number | null | undefined, system: UnitSystem): string {
  if (!finite(metres)) return NONE;
  if (system === "metric") return `${Math.round(metres * 1000)}${NBSP}mm`;
  return `${inchesText(toUnit(metres, "inch"))}${NBSP}in`;
}

export function formatArea(squareMetres: number | null | undefined, system: UnitSystem): string {
  if (!finite(squareMetres)) return NONE;
  if (system === "metric") return `${squareMetres.toFixed(1)}${NBSP}m²`;
  return `${Math.round(math.unit(squareMetres, "m^2").toNumber("ft^2")).toLocaleString("en-US")}${NBSP}ft²`;
}

/** A flow: litres per second, or US gallons per minute. */
export function formatFlow(litresPerSecond: number | null | undefined, system: UnitSystem): string {
  if (!finite(litresPerSecond)) return NONE;
  if (system === "metric") return `${litresPerSecond.toFixed(2)}${NBSP}L/s`;
  return `${math.unit(litresPerSecond, "L/s").toNumber("gal/minute").toFixed(1)}${NBSP}gpm`;
}

/** A rainfall intensity: mm/h, or in/h. */
export function formatIntensity(mmPerHour: number | null | undefined, system: UnitSystem): string {
  if (!finite(mmPerHour)) return NONE;
  if (system === "metric") return `${Math.round(mmPerHour)}${NBSP}mm/h`;
  return `${math.unit(mmPerHour, "mm").toNumber("inch").toFixed(2)}${NBSP}in/h`;
}

export function formatPoint(p: readonly [number, number], system: UnitSystem): string {
  if (system === "metric") return `(${p[0].toFixed(2)}, ${p[1].toFixed(2)})`;
  return `(${formatLength(p[0], system)}, ${formatLength(p[1], system)})`;
}

/** "1:40"; one decimal when the ratio is not whole ("1:28.6"); "level" for no fall. */
export function formatRatio(ratio: number | null | undefined): string {
  if (ratio == null || !Number.isFinite(ratio)) return "level";
  const whole = Math.round(ratio);
  if (Math.abs(ratio - whole) < 0.05) return `1:${whole}`;
  return `1:${ratio.toFixed(1)}`;
}

/** Inches of fall per foot of run, 12/N: "1/4" when it is a whole number of sixteenths, else "0.30". */
export function inchesPerFoot(ratio: number): string {
  const perFoot = 12 / ratio;
  const n16 = perFoot * 16;
  if (Math.abs(n16 - Math.round(n16)) < 0.01 && Math.round(n16) > 0) return inchesText(Math.round(n16) / 16);
  return perFoot.toFixed(2);
}

/** A fall the way the chosen system says it: "1:40", or "1/4 in per ft (1:48)". */
export function formatFall(ratio: number | null | undefined, system: UnitSystem): string {
  if (ratio == null || !Number.isFinite(ratio)) return "level";
  if (system === "metric") return formatRatio(ratio);
  return `${inchesPerFoot(ratio)}${NBSP}in per ft (${formatRatio(ratio)})`;
}

/** The other forms of a fall, for a title or a table cell: "1.43° · 2.50 %" (and in per ft in US customary). */
export function fallDetail(ratio: number | null | undefined, system: UnitSystem = "metric"): string {
  if (ratio == null || !Number.isFinite(ratio)) return "level: no fall";
  const degrees = (Math.atan(1 / ratio) * 180) / Math.PI;
  const base = `${degrees.toFixed(2)}° · ${(100 / ratio).toFixed(2)}${NBSP}%`;
  return system === "us" ? `${inchesPerFoot(ratio)}${NBSP}in per ft · ${base}` : base;
}

/** What a length field shows for editing: a plain number in the metric unit, or feet and inches. */
export function lengthInputText(metres: number | undefined, system: UnitSystem, kind: LengthKind): string {
  if (metres == null || !Number.isFinite(metres)) return "";
  if (system === "metric")
    return kind === "level" ? String(Math.round(metres * 1000 * 10) / 10) : String(Number(metres.toFixed(3)));
  return (kind === "level" ? formatLevel(metres, "us").replace(/\u00a0in$/, '"') : formatLength(metres, "us"))
    .replace(/\u00a0/g, " ")
    .replace("−", "-");
}

/** A plan length (m, or ft and in) or a level (mm, or in): what a bare number means. */
export type LengthKind = "length" | "level";

export function bareUnit(system: UnitSystem, kind: LengthKind): string {
  if (system === "metric") return kind === "level" ? "mm" : "m";
  return kind === "level" ? "in" : "ft";
}

export type LengthResult = { ok: true; metres: number } | { ok: false; error: string };

const AMOUNT = String.raw`(?:\d+\s+\d+\s*/\s*\d+|\d+\s*/\s*\d+|(?:\d+(?:\.\d*)?|\.\d+)(?:e[+-]?\d+)?)`;
const TERM = new RegExp(String.raw`\s*(${AMOUNT})\s*([a-zµ]+)?\s*`, "y");

const WORDS: [RegExp, string][] = [
  [/['′’]/g, " ft "],
  [/["″”]/g, " in "],
  [/\b(?:feet|foot)\b/g, " ft "],
  [/\binch(?:es)?\b/g, " in "],
  [/\b(?:millimet(?:er|re)s?)\b/g, " mm "],
  [/\b(?:centimet(?:er|re)s?)\b/g, " cm "],
  [/\b(?:met(?:er|re)s?)\b/g, " m "],
];

/** "1/4", "6 1/2" or "2.5" as a number, through mathjs's exact fractions. */
function amount(text: string): number {
  const t = text
    .replace(/\s*\/\s*/, "/")
    .replace(/\s+/g, " ")
    .trim();
  return t.includes("/") ? Number(math.fraction(t).valueOf()) : Number(t);
}

/**
 * Reads a length typed in either system: `12' 6"`, `12 ft 6 in`, `6 1/2 in`, `150 mm`, `3.5 m`,
 * `1.2`. A bare number is in the field's unit for the chosen system (m or mm; ft or in), and a
 * bare number after feet is inches (`12' 6`). Units are converted by mathjs.
 */
export function parseLength(input: string, system: UnitSystem, kind: LengthKind): LengthResult {
  let s = input.trim().toLowerCase();
  if (!s) return { ok: false, error: "needs a value" };
  if (s.length > 40) return { ok: false, error: "is too long for a length" };
  let sign = 1;
  if (/^[-−]/.test(s)) {
    sign = -1;
    s = s.slice(1);
  }
  // A decimal comma, as many metric users type it, when it is the only separator.
  if (/^\d+,\d+(?:\s*[a-z]*)?$/.test(s.trim())) s = s.replace(",", ".");
  for (const [re, to] of WORDS) s = s.replace(re, to);
  s = s.replace(/\s+/g, " ").trim();
  const terms: { value: number; unit: string | undefined }[] = [];
  TERM.lastIndex = 0;
  while (TERM.lastIndex < s.length) {
    const at = TERM.lastIndex;
    const m = TERM.exec(s);
    if (!m || TERM.lastIndex === at) return { ok: false, error: "is not a length such as 3.5 m, 150 mm or 12' 6\"" };
    let value: number;
    try {
      value = amount(m[1]);
    } catch {
      return { ok: false, error: "has a fraction over zero" };
    }
    terms.push({ value, unit: m[2] });
  }
  if (!terms.length) return { ok: false, error: "is not a length such as 3.5 m, 150 mm or 12' 6\"" };
  let metres = 0;
  try {
    for (let i = 0; i < terms.length; i++) {
      const t = terms[i];
      const unit =
        t.unit ??
        (i > 0 && terms[i - 1].unit === "ft" ? "in" : terms.length === 1 ? bareUnit(system, kind) : undefined);
      if (!unit) return { ok: false, error: "needs a unit on each part, such as 12 ft 6 in" };
      if (!Number.isFinite(t.value)) return { ok: false, error: "is not a finite length" };
      const q = math.unit(t.value, unit);
      if (!q.equalBase(math.unit(1, "m"))) return { ok: false, error: `has ${unit}, which is not a length` };
      metres += q.toNumber("m");
    }
  } catch {
    return { ok: false, error: "has a unit that is not a length (use m, mm, ft or in)" };
  }
  return { ok: true, metres: sign * metres };
}

/**
 * An engine sentence (warnings are written in metres and millimetres) in the chosen system: each
 * quantity with its metric unit ("279 mm", "12.00 m", "4.9 m²", "2.67 L/s", "100 mm/h") and each
 * plan point "(12.00, 8.00)" is written again with the formatters above. Metric text is returned
 * as it is.
 */
export function localiseSentence(text: string, system: UnitSystem): string {
  if (system === "metric") return text;
  const n = String.raw`(-?\d+(?:\.\d+)?)`;
  return text
    .replace(new RegExp(String.raw`\(${n}, ${n}\)`, "g"), (_, x, y) => formatPoint([Number(x), Number(y)], system))
    .replace(new RegExp(String.raw`${n}[ \u00a0]mm/h\b`, "g"), (_, v) => formatIntensity(Number(v), system))
    .replace(new RegExp(String.raw`${n}[ \u00a0]L/s\b`, "g"), (_, v) => formatFlow(Number(v), system))
    .replace(new RegExp(String.raw`${n}[ \u00a0]m²`, "g"), (_, v) => formatArea(Number(v), system))
    .replace(new RegExp(String.raw`${n}[ \u00a0]mm\b`, "g"), (_, v) => formatLevel(Number(v) / 1000, system))
    .replace(new RegExp(String.raw`${n}[ \u00a0]m\b`, "g"), (_, v) => formatLength(Number(v), system));
}
