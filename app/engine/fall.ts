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

/**
 * The unit reader: mathjs units and fractions (`./fall-units.ts`, which installs itself when
 * imported). Falls written as a plain ratio, percent, degree or bare number are read here without
 * it, to the same bit (tests/unit/engine/fall-reader.test.ts), so a browser worker can start
 * without mathjs and load it only for a fall such as "1/4 in/ft" (docs/decisions/0015-lazy-unit-reader.md).
 */
type UnitSlopeReader = (normalised: string) => number | string;
let unitReader: UnitSlopeReader | null = null;

export function installFallUnitReader(reader: UnitSlopeReader) {
  unitReader = reader;
}

/** Lower case, an inch mark as "in" (1/4" per ft), single spaces. */
export function normaliseFallText(text: string): string {
  return text.trim().toLowerCase().replace(/["″”]/g, " in ").replace(/\s+/g, " ").trim();
}

const PLAIN = String.raw`\d+(?:\.\d+)?`;
const PLAIN_NUMBER = new RegExp(String.raw`^(${PLAIN})$`);
const PLAIN_RATIO = new RegExp(String.raw`^(${PLAIN}) ?(?::|in) ?(${PLAIN})$`);
const PLAIN_PERCENT = new RegExp(String.raw`^(${PLAIN}) ?%$`);
const PLAIN_DEGREES = new RegExp(String.raw`^(${PLAIN})(?: ?°| ?deg| degrees?)$`);

/**
 * The slope of a plain fall, computed exactly as mathjs computes it (a percent is 0.01 of a unit,
 * a degree π/180 rad, each multiplied as mathjs normalises a unit), or undefined when the text
 * needs the unit reader.
 */
export function plainSlope(s: string): number | undefined {
  let m = PLAIN_RATIO.exec(s);
  if (m) {
    const run = Number(m[2]);
    return run === 0 ? undefined : Number(m[1]) / run;
  }
  if ((m = PLAIN_PERCENT.exec(s))) return Number(m[1]) * 0.01;
  if ((m = PLAIN_DEGREES.exec(s))) return Math.tan(Number(m[1]) * (Math.PI / 180));
  if ((m = PLAIN_NUMBER.exec(s))) return 1 / Number(m[1]);
  return undefined;
}

/** Whether reading this fall needs the unit reader, and it is not installed yet. */
export function fallNeedsUnitReader(input: unknown): boolean {
  if (unitReader || typeof input !== "string" || input.length > 40) return false;
  const s = normaliseFallText(input);
  return s !== "" && plainSlope(s) === undefined;
}

class UnitReaderMissing extends Error {}

function slopeOf(text: string): number | string {
  const s = normaliseFallText(text);
  if (!s) return "is empty";
  const plain = plainSlope(s);
  if (plain !== undefined) return plain;
  if (!unitReader) throw new UnitReaderMissing("The fall unit reader is not loaded (import ./fall-units first).");
  return unitReader(s);
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
  } catch (error) {
    if (error instanceof UnitReaderMissing) throw error;
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
