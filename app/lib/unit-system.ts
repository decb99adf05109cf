/**
 * The unit systems and how one is chosen, without the conversions: light enough for every page's
 * header (the units switch), so the conversions stay in the pages that convert (app/lib/units.ts).
 */
export type UnitSystem = "metric" | "us";
/** A person's choice; null follows the roof's rule set (US customary for a US code, else metric). */
export type UnitsPreference = UnitSystem | null;

export const UNIT_SYSTEMS: UnitSystem[] = ["metric", "us"];
export const UNIT_SYSTEM_LABELS: Record<UnitSystem, string> = { metric: "Metric", us: "US customary" };
/** Where the browser remembers an anonymous visitor's choice. */
export const UNITS_STORAGE_KEY = "fallwright:units";

export function isUnitSystem(value: unknown): value is UnitSystem {
  return value === "metric" || value === "us";
}

/** The system a roof is shown in: the person's choice, else its rule set's country. */
export function systemFor(preference: UnitsPreference | undefined, ruleSet?: string | null): UnitSystem {
  if (preference) return preference;
  return ruleSet?.startsWith("us-") ? "us" : "metric";
}

/** A plan length (m, or ft and in) or a level (mm, or in): what a bare number means. */
export type LengthKind = "length" | "level";

export type LengthResult = { ok: true; metres: number } | { ok: false; error: string };

export function bareUnit(system: UnitSystem, kind: LengthKind): string {
  if (system === "metric") return kind === "level" ? "mm" : "m";
  return kind === "level" ? "in" : "ft";
}
