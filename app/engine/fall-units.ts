import { create, fractionDependencies, unitDependencies } from "mathjs";
import { installFallUnitReader } from "./fall";

/**
 * The fall reader for anything beyond a plain ratio, percent, degree or number: fractions ("1/4:12")
 * and units ("25 mm/m", "1/4 in/ft"), through mathjs units and exact fractions. Importing this file
 * installs it in `./fall.ts`; `~/engine` does so, and the sandbox's worker loads it on demand
 * (docs/decisions/0015-lazy-unit-reader.md).
 */
const math = create({ unitDependencies, fractionDependencies });

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

/** The slope of a fall already passed through `normaliseFallText`, or why it is not one. */
export function unitSlope(normalised: string): number | string {
  let s = normalised;
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

installFallUnitReader(unitSlope);
