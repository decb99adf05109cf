/** How sure we are of a value: read on a published page, recalled, derived, or trade habit. */
export type Confidence = "page" | "memory" | "derived" | "common practice";

/** One cited minimum. Ratios are N of 1:N; lengths are metres. */
export interface CitedValue {
  value: number;
  unit: "ratio" | "m" | "factor";
  document: string;
  clause: string | null;
  confidence: Confidence;
  note?: string;
}

/** Keys a rule set may give. Missing keys fall back to the common-practice set, labelled so. */
export interface RuleValues {
  /** Flattest fall allowed for the main field (checked against the base fall). */
  fieldFall?: CitedValue;
  /** Flattest fall allowed on any fall line to a drain (the spec's minFall default). */
  fallLine?: CitedValue;
  gutterFall?: CitedValue;
  gutterWidth?: CitedValue;
  /** Depth of an internal gutter at its high end. */
  gutterDepth?: CitedValue;
  sumpDepth?: CitedValue;
  /** Smallest secondary (overflow) opening. */
  overflowOpening?: CitedValue;
  /** Below this fall a ponding (progressive deflection) check is required. */
  pondingCheckBelow?: CitedValue;
  /** Internal gutters sized for this multiple of the external-gutter rainfall intensity. */
  gutterRainfallFactor?: CitedValue;
}

export type RuleSetId = "common-practice" | "us-ibc-2018" | "au-ncc-2022" | "nz-e2-as1" | "de-din-18531" | "uk-bs-6229";

export interface RuleSet {
  id: RuleSetId;
  name: string;
  jurisdiction: string;
  /** True for the set of trade habits that no code gives. */
  commonPractice: boolean;
  values: RuleValues;
  notes: string[];
}

const CP = "Common practice (no code)";
const cp = (value: number, unit: CitedValue["unit"], note: string): CitedValue => ({
  value,
  unit,
  document: CP,
  clause: null,
  confidence: "common practice",
  note,
});
const ratioOfDegrees = (deg: number) => 1 / Math.tan((deg * Math.PI) / 180);
// 1/4 in per 12 in, as a ratio N.
const QUARTER_INCH_PER_FOOT = 12 / 0.25;

/** Sources: docs/check-values.md, "Falls and gutters in published codes". */
export const RULE_SETS: Readonly<Record<RuleSetId, RuleSet>> = {
  "common-practice": {
    id: "common-practice",
    name: "Common practice (no code)",
    jurisdiction: "none",
    commonPractice: true,
    values: {
      fallLine: cp(100, "ratio", "longest fall line no flatter than 1:100, usual trade advice"),
      gutterFall: cp(100, "ratio", "internal gutter sole fall 1:100"),
      gutterWidth: cp(0.3, "m", "internal gutter at least 300 mm wide, room for a clamped outlet"),
      gutterDepth: cp(0.05, "m", "internal gutter 50 mm deep at its high end"),
    },
    notes: [
      "Trade habits, not a code. Pick a jurisdiction for cited minimums.",
      "Usual advice for the field of a membrane roof is 2° (1:28.6); it is advice, not a minimum, so it raises no warning.",
    ],
  },
  "us-ibc-2018": {
    id: "us-ibc-2018",
    name: "United States: International Building Code 2018",
    jurisdiction: "US",
    commonPractice: false,
    values: {
      fieldFall: {
        value: QUARTER_INCH_PER_FOOT,
        unit: "ratio",
        document: "International Building Code 2012-2018",
        clause: "1507.10.1-1507.15.1",
        confidence: "page",
        note: "1/4 in per 12 in minimum design slope for membrane roofs (1/8 in for coal-tar built-up roofs)",
      },
      fallLine: {
        value: QUARTER_INCH_PER_FOOT,
        unit: "ratio",
        document: "International Building Code 2012-2018",
        clause: "1507.10.1-1507.15.1",
        confidence: "derived",
        note: "an interpretation, not the code's words: the minimum design slope is read as applying to every part of the roof, so to every fall line",
      },
      pondingCheckBelow: {
        value: QUARTER_INCH_PER_FOOT,
        unit: "ratio",
        document: "International Building Code with ASCE 7",
        clause: "IBC 1611.2; ASCE 7 section 8.4",
        confidence: "page",
        note: "ponding (progressive deflection) check needed below 1/4 in per ft",
      },
      overflowOpening: {
        value: 0.1016,
        unit: "m",
        document: "International Plumbing Code 2015",
        clause: "1108.3",
        confidence: "page",
        note: "minimum scupper opening 4 in",
      },
    },
    notes: ["Gutter sizes are not given by the IBC here: the common-practice values are used and labelled."],
  },
  "au-ncc-2022": {
    id: "au-ncc-2022",
    name: "Australia: NCC 2019 with AS 4654.2-2012 and AS/NZS 3500.3:2015",
    jurisdiction: "AU",
    commonPractice: false,
    values: {
      fieldFall: {
        value: 100,
        unit: "ratio",
        document: "AS 4654.2-2012 (called up by NCC 2019 and NCC 2022)",
        clause: "2.5.2",
        confidence: "page",
        note: "1:100 minimum fall to outlets for external above-ground membranes",
      },
      fallLine: {
        value: 100,
        unit: "ratio",
        document: "AS 4654.2-2012 (called up by NCC 2019 and NCC 2022)",
        clause: "2.5.2",
        confidence: "page",
        note: "1:100 minimum fall to outlets",
      },
      gutterFall: {
        value: 100,
        unit: "ratio",
        document: "NCC 2019 Volume Two (housing provisions: houses, Class 1 and 10 buildings)",
        clause: "Part 3.5.3, installation of gutters",
        confidence: "memory",
        note: "box gutters not flatter than 1:100 (eaves gutters 1:500); the installation clause of Part 3.5.3 (its number not confirmed); in NCC 2022 it moved to Part 7.4 of the ABCB Housing Provisions",
      },
      gutterWidth: {
        value: 0.3,
        unit: "m",
        document: "Victorian Building Authority alert, October 2016",
        clause: null,
        confidence: "page",
        note: "box gutter at least 300 mm wide (commercial), deemed-to-satisfy",
      },
      gutterDepth: {
        value: 0.075,
        unit: "m",
        document: "Victorian Building Authority alert, October 2016",
        clause: null,
        confidence: "page",
        note: "75 mm deep at the high end; overflow at every sump or rainhead",
      },
      sumpDepth: {
        value: 0.15,
        unit: "m",
        document: "AS/NZS 3500.3:2015",
        clause: "3.7.4(e)",
        confidence: "page",
        note: "sump at least 150 mm deep; for box gutters, overflow capacity at least the outlet's design flow (3.7.7.1)",
      },
    },
    notes: [
      "Editions: NCC 2019 Volume Two, AS 4654.2-2012 and AS/NZS 3500.3:2015, as read; check clause numbers against the edition in force.",
      "The gutter values are housing provisions, written for houses (Class 1 and 10 buildings); other buildings follow NCC Volume One and AS/NZS 3500.3.",
      "For box gutters, overflow capacity at least the design flow of its outlet: AS/NZS 3500.3:2015 cl 3.7.7.1.",
    ],
  },
  "nz-e2-as1": {
    id: "nz-e2-as1",
    name: "New Zealand: Acceptable Solution E2/AS1",
    jurisdiction: "NZ",
    commonPractice: false,
    values: {
      fieldFall: {
        value: ratioOfDegrees(2),
        unit: "ratio",
        document: "E2/AS1",
        clause: "Table 1",
        confidence: "page",
        note: "editions conflict: 1.5° in one quoted edition, 2° in another; the stricter 2° is used",
      },
      gutterWidth: {
        value: 0.3,
        unit: "m",
        document: "E2/AS1 (as quoted by the national building research body)",
        clause: "8.1.6.1",
        confidence: "page",
        note: "internal gutter at least 300 mm wide",
      },
      gutterDepth: {
        value: 0.07,
        unit: "m",
        document: "E2/AS1 (as quoted by the national building research body)",
        clause: "8.1.6.1",
        confidence: "page",
        note: "at least 70 mm deep including 20 mm freeboard",
      },
      gutterRainfallFactor: {
        value: 2,
        unit: "factor",
        document: "E2/AS1 (as quoted by the national building research body)",
        clause: "8.1.6.3",
        confidence: "page",
        note: "internal gutters sized for twice the external-gutter rainfall intensity",
      },
    },
    notes: ["E2/AS1 Table 1 editions differ (1.5° / 2°): check the current edition."],
  },
  "de-din-18531": {
    id: "de-din-18531",
    name: "Germany: DIN 18531",
    jurisdiction: "DE",
    commonPractice: false,
    values: {
      fieldFall: {
        value: 50,
        unit: "ratio",
        document: "DIN 18531-1:2017",
        clause: "6.3.1",
        confidence: "page",
        note: "plan at least 2 % fall",
      },
      fallLine: {
        value: 100,
        unit: "ratio",
        document: "DIN 18531-1:2017",
        clause: "6.3.1",
        confidence: "memory",
        note: "secondary (valley) falls 1 %, in part 1 beside the 2 % value as far as known (part 5 covers balconies and walkways)",
      },
    },
    notes: ["The 1 % secondary fall is placed in DIN 18531-1 as far as known: check the edition in force."],
  },
  "uk-bs-6229": {
    id: "uk-bs-6229",
    name: "United Kingdom: BS 6229:2018",
    jurisdiction: "UK",
    commonPractice: false,
    values: {
      fieldFall: {
        value: 40,
        unit: "ratio",
        document: "BS 6229:2018",
        clause: null,
        confidence: "page",
        note: "design advice: design at 1:40 so that 1:80 is achieved as built (clause not found)",
      },
      fallLine: {
        value: 80,
        unit: "ratio",
        document: "BS 6229:2018",
        clause: null,
        confidence: "derived",
        note: "1:80 is an as-built (finished) value, after tolerance and deflection; used here as the floor for every designed fall line, which leaves no margin for either - design steeper (clause not found)",
      },
    },
    notes: [
      "Clause numbers were not found on the page read; values need checking against the standard.",
      "1:40 is design advice aimed at 1:80 finished; 1:80 is an as-built value, not a design target.",
    ],
  },
};

/** Rule-set ids in display order; the first is the default. */
export const RULE_SET_IDS = Object.keys(RULE_SETS) as RuleSetId[];
export const DEFAULT_RULE_SET: RuleSetId = "common-practice";

/** A value with the key it answers and the set it came from, as the analysis reports it. */
export interface UsedRule extends CitedValue {
  key: keyof RuleValues;
  ruleSet: RuleSetId;
}

/** The value a rule set gives for a key, or the common-practice value labelled as such. */
export function ruleValue(id: RuleSetId, key: keyof RuleValues): UsedRule | null {
  const own = RULE_SETS[id].values[key];
  if (own) return usedRule(own, key, id);
  const fallback = RULE_SETS["common-practice"].values[key];
  return fallback ? usedRule(fallback, key, "common-practice") : null;
}

/**
 * The cited value with its key and set, fields in the order a spread would give. Spelled out: a
 * spread over the sets' differently shaped values goes the slow, generic way on every analysis.
 */
function usedRule(v: CitedValue, key: keyof RuleValues, ruleSet: RuleSetId): UsedRule {
  const { value, unit, document, clause, confidence, note } = v;
  return note === undefined
    ? { value, unit, document, clause, confidence, key, ruleSet }
    : { value, unit, document, clause, confidence, note, key, ruleSet };
}
