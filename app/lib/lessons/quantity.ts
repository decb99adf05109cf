import { create, unitDependencies, type Unit } from "mathjs";
import { parseFall } from "../../engine/fall";
// Installs mathjs' fall units in the engine's parseFall (the lessons read "1/4 in/ft" and the like).
import "../../engine/fall-units";
import { parseLength } from "../units-reader";

/** Only the unit machinery of mathjs (same build as the engine's fall parser). */
const math = create({ unitDependencies });

export type QuantityResult =
  { ok: true; bare: false; unit: Unit } | { ok: true; bare: true; number: number } | { ok: false; error: string };

const MAX_LENGTH = 60;

/**
 * Reads a quantity a person typed: "250 mm", "0.25m", "25 cm", "2.5 %", "1.43°", "3.2 L/s",
 * "40 m²". Percent is one centimetre per metre (a dimensionless fall), degrees an angle.
 * A bare number is returned as dimensionless with `bare: true` so callers can ask for a unit.
 */
export function parseQuantity(input: string): QuantityResult {
  if (typeof input !== "string") return { ok: false, error: "is not text" };
  let s = input.trim();
  if (!s) return { ok: false, error: "is empty" };
  if (s.length > MAX_LENGTH) return { ok: false, error: "is too long" };
  // Feet and inches, and inches with fractions, as US builders write them: 12' 6", 5 7/8 in.
  if (
    /['"′″’”]/.test(s) ||
    /\d\s*\/\s*\d+\s*(?:in|ft|inch|inches|feet|foot)\b/i.test(s) ||
    /\b(?:ft|feet|foot)\s*\d/i.test(s)
  ) {
    const length = parseLength(s, "metric", "length");
    if (length.ok) return { ok: true, bare: false, unit: math.unit(length.metres, "m") };
  }
  s = s
    .replace(/,(?=\d{3}\b)/g, "") // 1,500 m² → 1500 m²
    .replace(/²/g, "^2")
    .replace(/³/g, "^3")
    .replace(/\s*%$/, " cm/m")
    .replace(/\s*°$/, " deg")
    .replace(/\bdegrees?$/i, "deg")
    .replace(/ per /gi, "/")
    .replace(/\bm2\b/g, "m^2")
    .replace(/\bsq\.? ?m\b/gi, "m^2");
  if (/^[+-]?(\d+(\.\d*)?|\.\d+)(e[+-]?\d+)?$/i.test(s)) {
    const n = Number(s);
    if (!Number.isFinite(n)) return { ok: false, error: "is not a finite number" };
    return { ok: true, bare: true, number: n };
  }
  try {
    const unit = math.unit(s);
    const value = unit.toNumber();
    if (!Number.isFinite(value)) return { ok: false, error: "is not a finite number" };
    if ((unit as unknown as { value: number | null }).value == null)
      return { ok: false, error: "has a unit but no number" };
    return { ok: true, unit, bare: false };
  } catch {
    return { ok: false, error: "is not a number with a unit, such as 250 mm or 3.2 L/s" };
  }
}

/** True when two quantities measure the same kind of thing (length with length, flow with flow). */
export function sameDimension(a: Unit, b: Unit): boolean {
  return a.equalBase(b);
}

/** A plain-language name for a quantity's kind, for feedback. */
export function dimensionName(u: Unit): string {
  const d = u.dimensions;
  const key = d.join(",");
  const names: Record<string, string> = {
    "0,1,0,0,0,0,0,0,0": "a length",
    "0,2,0,0,0,0,0,0,0": "an area",
    "0,3,0,0,0,0,0,0,0": "a volume",
    "0,3,-1,0,0,0,0,0,0": "a flow",
    "0,1,-1,0,0,0,0,0,0": "a speed or rainfall intensity",
    "1,-1,-2,0,0,0,0,0,0": "a pressure or load per area",
    "1,1,-2,0,0,0,0,0,0": "a force",
    "1,0,0,0,0,0,0,0,0": "a mass",
    "0,0,0,0,0,0,0,1,0": "an angle",
    "0,0,0,0,0,0,0,0,0": "a plain ratio or percentage",
    "0,0,1,0,0,0,0,0,0": "a time",
  };
  return names[key] ?? "another kind of quantity";
}

/** The number in the unit the lesson wrote its answer in, e.g. 0.25 m → 250 when asked in mm. */
export function valueIn(u: Unit, target: Unit): number {
  const units = (target as unknown as { units: { unit: unknown }[] }).units;
  if (!units || units.length === 0) return u.toNumber();
  return u.toNumber(target.formatUnits());
}

/**
 * A ratio "1:40" or "1 in 40" (also "1/40"), read as N. Rise may be other than one ("2:80").
 * Falls written any other way are refused here on purpose: the question asks for 1:N.
 */
export function parseRatio(input: string): { ok: true; ratio: number } | { ok: false; error: string } {
  if (typeof input !== "string") return { ok: false, error: "is not text" };
  const s = input.trim().toLowerCase();
  if (!s) return { ok: false, error: "is empty" };
  if (s.length > MAX_LENGTH) return { ok: false, error: "is too long" };
  const m = /^(\d+(?:\.\d*)?|\.\d+)\s*(?::|in|\/)\s*(\d+(?:\.\d*)?|\.\d+)$/.exec(s);
  if (!m) {
    // The US roofers' forms of the same fall: 1/4:12, 1/4 in/ft, 1/4 in per ft (read by the engine).
    if (/^\d+(?:\s+\d+)?\s*\/\s*\d+\s*:/.test(s) || /\b(?:in|inch|inches|")\s*(?:\/|per)\s*(?:ft|foot)$/.test(s)) {
      const f = parseFall(s);
      if (f.ok) return { ok: true, ratio: f.ratio };
    }
    return { ok: false, error: "is not written as a ratio such as 1:40 (or 1/4:12)" };
  }
  const rise = Number(m[1]);
  const run = Number(m[2]);
  if (!(rise > 0) || !(run > 0)) return { ok: false, error: "needs a rise and a run above zero" };
  const ratio = run / rise;
  if (!Number.isFinite(ratio)) return { ok: false, error: "is not a finite ratio" };
  return { ok: true, ratio };
}

/** A quantity a lesson author wrote ("0.2 m", "150 mm", or a bare number in `fallbackUnit`). */
export function authorQuantity(value: string | number, fallbackUnit: string): Unit | null {
  if (typeof value === "number") return Number.isFinite(value) ? math.unit(value, fallbackUnit) : null;
  const q = parseQuantity(value);
  if (!q.ok) return null;
  if (q.bare) return math.unit(q.number, fallbackUnit);
  return q.unit;
}

/** A number in a unit, e.g. a bare answer read in the unit the question suggests. */
export function quantityOf(value: number, unit: string): Unit {
  return math.unit(value, unit);
}
