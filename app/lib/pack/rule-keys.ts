import type { UsedRule } from "~/engine";

/** What each rule-set value is, in words. */
export const RULE_KEY_NAMES: Record<string, string> = {
  fieldFall: "field fall, at least",
  fallLine: "fall lines, at least",
  gutterFall: "gutter sole fall",
  gutterWidth: "gutter width",
  gutterDepth: "gutter depth at high end",
  sumpDepth: "sump depth",
  overflowOpening: "overflow opening",
  pondingCheckBelow: "ponding check below",
  gutterRainfallFactor: "gutter rainfall factor",
};

/** Where a value comes from: its document and clause, or that it is trade habit with no source. */
export function citation(u: Pick<UsedRule, "confidence" | "document" | "clause">): string {
  return u.confidence === "common practice"
    ? "Common practice, no source"
    : `${u.document}${u.clause ? `, ${u.clause}` : ""}`;
}
