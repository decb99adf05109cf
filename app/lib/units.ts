/**
 * Metric or US customary, at the edges only: roofs are stored and analysed in metres; this module
 * reads what people type and writes what they read. It carries no mathjs: the formatters convert
 * with mathjs' own unit values, multiplied as mathjs multiplies them (tests/unit/units/lazy-reader.test.ts
 * holds them equal), and typed text that is more than a plain number is read by mathjs units in
 * ./units-reader.ts, loaded on demand (docs/decisions/0015-lazy-unit-reader.md). The inch is
 * 0.0254 m exactly (the international yard and pound agreement of 1959, as NIST SP 811 gives it).
 */
export {
  bareUnit,
  isUnitSystem,
  systemFor,
  UNIT_SYSTEMS,
  UNIT_SYSTEM_LABELS,
  UNITS_STORAGE_KEY,
  type LengthKind,
  type LengthResult,
  type UnitSystem,
  type UnitsPreference,
} from "./unit-system";
import { bareUnit, type LengthKind, type LengthResult, type UnitSystem } from "./unit-system";

const NBSP = "\u00a0";
const NONE = "–";
const finite = (v: number | null | undefined): v is number => v != null && Number.isFinite(v);

/** mathjs' unit values (unit × prefix, in SI base units) for the units shown. */
const UNIT_VALUE = {
  m: 1,
  mm: 1 * 0.001,
  inch: 0.0254,
  ft: 0.3048,
  L: 0.001,
  s: 1,
  gal: 0.003785411784,
  minute: 60,
} as const;
type UnitName = keyof typeof UNIT_VALUE;

/**
 * value in `from` units as `to` units, as mathjs' Unit normalises (× each unit value to its power)
 * and denormalises (÷ each), so the figures are those mathjs would give.
 */
export function convert(value: number, from: [UnitName, number][], to: [UnitName, number][]): number {
  let v = value;
  for (const [unit, power] of from) v = v * Math.pow(UNIT_VALUE[unit], power);
  for (const [unit, power] of to) v = v / Math.pow(UNIT_VALUE[unit], power);
  return v;
}

const toInches = (metres: number) => convert(metres, [["m", 1]], [["inch", 1]]);

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
  const n16 = Math.round(Math.abs(toInches(metres)) * 16);
  const feet = Math.floor(n16 / 192);
  const rest = inchesText((n16 - feet * 192) / 16, feet > 0);
  const sign = metres < 0 && n16 > 0 ? "−" : "";
  return feet ? `${sign}${feet}'${NBSP}${rest}"` : `${sign}${rest}"`;
}

/** A level, a drop or a height: "150 mm", or inches to 1/16: "5 7/8 in". */
export function formatLevel(metres: number | null | undefined, system: UnitSystem): string {
  if (!finite(metres)) return NONE;
  if (system === "metric") return `${Math.round(metres * 1000)}${NBSP}mm`;
  return `${inchesText(toInches(metres))}${NBSP}in`;
}

export function formatArea(squareMetres: number | null | undefined, system: UnitSystem): string {
  if (!finite(squareMetres)) return NONE;
  if (system === "metric") return `${squareMetres.toFixed(1)}${NBSP}m²`;
  return `${Math.round(convert(squareMetres, [["m", 2]], [["ft", 2]])).toLocaleString("en-US")}${NBSP}ft²`;
}

/** A flow: litres per second, or US gallons per minute. */
export function formatFlow(litresPerSecond: number | null | undefined, system: UnitSystem): string {
  if (!finite(litresPerSecond)) return NONE;
  if (system === "metric") return `${litresPerSecond.toFixed(2)}${NBSP}L/s`;
  return `${convert(
    litresPerSecond,
    [
      ["L", 1],
      ["s", -1],
    ],
    [
      ["gal", 1],
      ["minute", -1],
    ],
  ).toFixed(1)}${NBSP}gpm`;
}

/** A rainfall intensity: mm/h, or in/h. */
export function formatIntensity(mmPerHour: number | null | undefined, system: UnitSystem): string {
  if (!finite(mmPerHour)) return NONE;
  if (system === "metric") return `${Math.round(mmPerHour)}${NBSP}mm/h`;
  return `${convert(mmPerHour, [["mm", 1]], [["inch", 1]]).toFixed(2)}${NBSP}in/h`;
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

type LengthReader = (input: string, system: UnitSystem, kind: LengthKind) => LengthResult;
let reader: LengthReader | null = null;
let loading: Promise<LengthReader> | null = null;

/** Loads the full length reader (mathjs, ./units-reader.ts) once; call it when a field is focused. */
export function loadLengthReader(): Promise<LengthReader> {
  loading ??= import("./units-reader").then(
    (m) => (reader = m.parseLength),
    (error: unknown) => {
      loading = null;
      throw error;
    },
  );
  return loading;
}

const PLAIN_LENGTH = /^([-−]?)(\d+(?:\.\d*)?|\.\d+)$/;
const BARE_UNIT: Record<string, UnitName> = { m: "m", mm: "mm", ft: "ft", in: "inch" };

/**
 * A plain number (or a decimal comma: "2,5") in the field's bare unit, read exactly as the full
 * reader reads it (mathjs: value × the unit's value); null for anything else.
 */
export function parsePlainLength(input: string, system: UnitSystem, kind: LengthKind): LengthResult | null {
  const s = input.trim();
  if (!s) return { ok: false, error: "needs a value" };
  if (s.length > 40) return { ok: false, error: "is too long for a length" };
  const m = PLAIN_LENGTH.exec(/^[-−]?\d+,\d+$/.test(s) ? s.replace(",", ".") : s);
  if (!m) return null;
  const metres = convert(Number(m[2]), [[BARE_UNIT[bareUnit(system, kind)], 1]], [["m", 1]]);
  return { ok: true, metres: (m[1] ? -1 : 1) * metres };
}

/**
 * Reads a length typed in either system: `12' 6"`, `12 ft 6 in`, `6 1/2 in`, `150 mm`, `3.5 m`,
 * `1.2` (see ./units-reader.ts). A plain number is read at once; anything else once the reader is
 * loaded: null means "not yet", so call `loadLengthReader()` and read again.
 */
export function readLength(input: string, system: UnitSystem, kind: LengthKind): LengthResult | null {
  return parsePlainLength(input, system, kind) ?? (reader ? reader(input, system, kind) : null);
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
