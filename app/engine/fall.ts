import { create, fractionDependencies, unitDependencies } from "mathjs";

/** Only the unit and fraction machinery of mathjs, so the browser bundle stays small. */
const math = create({ unitDependencies, fractionDependencies });

/** A fall in every form the product shows. ratio N means 1 in N. */
export interface Fall {
  ratio: number;
  degrees: number;
  percent: number;
  mmPerM: number;
}

export type FallResult = ({ ok: true } & Fall) | { ok: false; error: string };

/** Flattest and steepest falls the engine accepts (1:10000 is practically level; 1:1 is 45°). */
export const FALL_RATIO_LIMITS = { min: 1, max: 10_000 } as const;

/**
 * A fall from its ratio N (1 in N). Trigonometry: slope = 1/N, angle = atan(1/N),
 * percent = 100/N (docs/check-values.md "Trigonometry (derived)").
 */
export function fallFromRatio(ratio: number): Fall {
  return {
    ratio,
    degrees: (Math.atan(1 / ratio) * 180) / Math.PI,
    percent: 100 / ratio,
    mmPerM: 1000 / ratio,
  };
}

/** A fall from its slope (rise over run); a level slope gives ratio Infinity. */
export function fallFromSlope(slope: number): Fall {
  return fallFromRatio(1 / Math.abs(slope));
}

const NUMBER = String.raw`[+]?(?:\d+(?:\.\d*)?|\.\d+)(?:e[+-]?\d+)?`;
/** A plain number, a fraction "1/4" or a mixed number "1 1/2" (read by mathjs's fraction). */
const AMOUNT = String.raw`(?:\d+\s+)?\d+\s*/\s*\d+|${NUMBER}`;
const RATIO = new RegExp(String.raw`^(${AMOUNT})\s*(?::|in)\s*(${AMOUNT})$`);
const LEADING_FRACTION = new RegExp(String.raw`^((?:\d+\s+)?\d+\s*/\s*\d+)(?=\s*[a-z])`);

/** "1/4", "1 1/2" or "0.25" as a number, through mathjs's exact fractions. */
function amount(text: string): number {
  const t = text.replace(/\s*\/\s*/, "/").trim();
  return t.includes("/") ? Number(math.fraction(t).valueOf()) : Number(t);
}

function slopeOf(text: string): number | string {
  // An inch mark is "in" to mathjs: 1/4" per ft.
  let s = text.trim().toLowerCase().replace(/["″”]/g, " in ").replace(/\s+/g, " ").trim();
  if (!s) return "is empty";
  const ratio = RATIO.exec(s);
  if (ratio) {
    // "1:40", "1 in 40" and the US roofers' "1/4:12" (1/4 in of rise in 12 in of run): a rise
    // over a run, in any one length unit.
    const run = amount(ratio[2]);
    if (run === 0) return "has a run of zero";
    const quotient: unknown = math.unit(`${amount(ratio[1])} m`).divide(math.unit(`${run} m`));
    // mathjs simplifies m/m to a plain number; keep the Unit branch for other builds.
    return typeof quotient === "number" ? quotient : (quotient as { toNumber(u: string): number }).toNumber("m/m");
  }
  // "1/4 in/ft": mathjs reads a unit after a plain number only, so settle the fraction first.
  s = s.replace(LEADING_FRACTION, (_, f: string) => String(amount(f)));
  s = s
    .replace(/%$/, " cm/m") // one percent is one centimetre per metre
    .replace(/°$/, " deg")
    .replace(/ per /g, "/")
    .replace(/\bdegrees?$/, "deg");
  const value = math.unit(s);
  if (value.equalBase(math.unit("1 rad"))) return Math.tan(value.toNumber("rad"));
  if (!value.dimensions.every((d: number) => d === 0)) return "is not a fall (it has a length or other dimension)";
  const units = (value as unknown as { units: unknown[] }).units;
  // A bare number is a ratio N, as in the JSON form `"baseFall": 40`.
  if (!units || units.length === 0) return 1 / value.toNumber();
  return value.toNumber("m/m");
}

/**
 * Reads a fall written as `1:40`, `1 in 40`, `1/4:12`, `2°`, `2 deg`, `2.5%`, `25 mm/m`, `1/4 in/ft`,
 * or a number N meaning 1:N. Unit conversion goes through mathjs units.
 */
export function parseFall(input: string | number): FallResult {
  if (typeof input === "string") {
    const known = memo.get(input);
    if (known) return { ...known };
    const result = parseFallUncached(input);
    if (memo.size >= 256) memo.clear();
    memo.set(input, result);
    return { ...result };
  }
  return parseFallUncached(input);
}

// Editing a roof re-reads the same few fall strings many times a second.
const memo = new Map<string, FallResult>();

function parseFallUncached(input: string | number): FallResult {
  try {
    let slope: number | string;
    if (typeof input === "number") {
      if (!Number.isFinite(input) || input <= 0) return { ok: false, error: "must be a positive ratio N (1 in N)" };
      slope = 1 / input;
    } else if (typeof input === "string") {
      if (input.length > 40) return { ok: false, error: "is too long for a fall" };
      slope = slopeOf(input);
    } else {
      return { ok: false, error: "must be a fall such as 1:40, 2°, 2.5% or 25 mm/m" };
    }
    if (typeof slope === "string") return { ok: false, error: slope };
    if (!Number.isFinite(slope)) return { ok: false, error: "is not a finite fall" };
    if (slope <= 0) return { ok: false, error: "must fall (a level or negative fall cannot drain)" };
    const ratio = 1 / slope;
    if (ratio < FALL_RATIO_LIMITS.min) return { ok: false, error: "is steeper than 1:1 (45°)" };
    if (ratio > FALL_RATIO_LIMITS.max) return { ok: false, error: "is flatter than 1:10000" };
    return { ok: true, ...fallFromRatio(ratio) };
  } catch {
    return { ok: false, error: "is not a fall such as 1:40, 2°, 2.5% or 25 mm/m" };
  }
}

/** "1:40"; one decimal when the ratio is not a whole number ("1:28.6"); "level" for no fall. */
export function formatRatio(ratio: number | null | undefined): string {
  if (ratio == null || !Number.isFinite(ratio)) return "level";
  const whole = Math.round(ratio);
  if (Math.abs(ratio - whole) < 0.05) return `1:${whole}`;
  return `1:${ratio.toFixed(1)}`;
}
