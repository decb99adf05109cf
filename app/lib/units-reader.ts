import { create, fractionDependencies, unitDependencies } from "mathjs";
import { bareUnit, type LengthKind, type LengthResult, type UnitSystem } from "./unit-system";

/**
 * The length reader: what people type in either system, read through mathjs units and exact
 * fractions (its inch is 0.0254 m exactly, the international yard and pound agreement of 1959, as
 * NIST SP 811 gives it). Pages load it on demand (`loadLengthReader` in ./units.ts); a plain number
 * is read there without it, to the same bit (docs/decisions/0015-lazy-unit-reader.md).
 */
const math = create({ unitDependencies, fractionDependencies });

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
