import type { Analysis, RoofSpec } from "../../engine/types";
import { formatRatio } from "../../engine/fall";

/** What a criterion's limit measures, and so how an author may write it. */
export type LimitKind = "ratio" | "length" | "area" | "flow" | "count" | "percent" | "none";

export interface Measured {
  /** In the limit's base unit: ratio N, metres, m², L/s, a count or a percentage. */
  value: number | null;
  text: string;
}

export interface CriterionKind {
  limit: LimitKind;
  /** "atMost": measured ≤ limit passes; "atLeast": measured ≥ limit passes. */
  compare: "atMost" | "atLeast";
  /** How the criterion reads to a trainee, given the formatted limit. */
  label: (limit: string) => string;
  measure: (a: Analysis, spec: RoofSpec) => Measured;
}

const mm = (m: number) => `${Math.round(m * 1000)} mm`;
const m2 = (a: number) => `${a < 10 ? a.toFixed(2) : a.toFixed(1)} m²`;
const ls = (q: number) => `${q.toFixed(2)} L/s`;

/** Formats a limit or a measured value of the given kind for people. */
export function formatLimit(kind: LimitKind, v: number | null): string {
  if (v == null) return "none";
  switch (kind) {
    case "ratio":
      return formatRatio(v);
    case "length":
      return mm(v);
    case "area":
      return m2(v);
    case "flow":
      return ls(v);
    case "percent":
      return `${v.toFixed(1)}\u00a0%`;
    case "count":
      return String(v);
    default:
      return "";
  }
}

const ratioOrLevel = (r: number | null | undefined): Measured =>
  r == null || !Number.isFinite(r)
    ? { value: Number.POSITIVE_INFINITY, text: "level (no fall)" }
    : { value: r, text: formatRatio(r) };

const outletCatchments = (a: Analysis) => a.shaped.catchments.filter((c) => c.kind === "outlet");

/**
 * Every criterion kind a task may use, measured on the engine's outputs (docs/roof-method.md §9 keys).
 * Ratios: a bigger N is a flatter fall, so "no flatter than 1:100" is ratio ≤ 100.
 */
export const CRITERION_KINDS = {
  longestFallRatioAtMost: {
    limit: "ratio",
    compare: "atMost",
    label: (l) => `Longest fall line no flatter than ${l}`,
    measure: (a) => {
      const line = a.shaped.longestFallLine;
      if (!line) return { value: null, text: "no fall line (no drain)" };
      const r = ratioOrLevel(line.ratio);
      return { ...r, text: `${r.text} over ${line.length.toFixed(1)} m, drop ${mm(line.drop)}` };
    },
  },
  worstFallRatioAtMost: {
    limit: "ratio",
    compare: "atMost",
    label: (l) => `Flattest fall line no flatter than ${l}`,
    measure: (a) =>
      a.shaped.worstFallRatio == null
        ? { value: null, text: "no fall line (no drain)" }
        : ratioOrLevel(a.shaped.worstFallRatio),
  },
  edgeFallRatioAtMost: {
    limit: "ratio",
    compare: "atMost",
    label: (l) => `Every edge fall along the outlet parapets no flatter than ${l}`,
    measure: (a) => {
      const falls = a.shaped.edgeFalls.map((e) => e.ratio);
      if (!falls.length) return { value: null, text: "no outlet edge" };
      return ratioOrLevel(Math.max(...falls));
    },
  },
  highLevelAtMost: {
    limit: "length",
    compare: "atMost",
    label: (l) => `High level (height budget) at most ${l}`,
    measure: (a) => ({ value: a.shaped.highLevel, text: mm(a.shaped.highLevel) }),
  },
  heightSavedAtLeast: {
    limit: "length",
    compare: "atLeast",
    label: (l) => `Height saved against the internal-gutter layout at least ${l}`,
    measure: (a) =>
      a.comparison.heightSaved == null
        ? { value: null, text: `no comparison (${a.gutter.reason ?? "gutter layout not comparable"})` }
        : { value: a.comparison.heightSaved, text: mm(a.comparison.heightSaved) },
  },
  noPonding: {
    limit: "none",
    compare: "atMost",
    label: () => "No ponding: every drop of water reaches a drain",
    measure: (a) => {
      const pits = a.shaped.ponding;
      if (!pits.length) return { value: 0, text: "no ponding" };
      const area = pits.reduce((s, p) => s + p.area, 0);
      return {
        value: pits.length,
        text: `${pits.length} ponding ${pits.length === 1 ? "place" : "places"}, ${m2(area)} draining to them`,
      };
    },
  },
  maxOutlets: {
    limit: "count",
    compare: "atMost",
    label: (l) => `At most ${l} ${l === "1" ? "outlet" : "outlets"}`,
    measure: (_a, spec) => ({
      value: spec.outlets.length,
      text: `${spec.outlets.length} ${spec.outlets.length === 1 ? "outlet" : "outlets"}`,
    }),
  },
  minOutlets: {
    limit: "count",
    compare: "atLeast",
    label: (l) => `At least ${l} ${l === "1" ? "outlet" : "outlets"}`,
    measure: (_a, spec) => ({
      value: spec.outlets.length,
      text: `${spec.outlets.length} ${spec.outlets.length === 1 ? "outlet" : "outlets"}`,
    }),
  },
  minEavesEdges: {
    limit: "count",
    compare: "atLeast",
    label: (l) => `At least ${l} open (eaves) ${l === "1" ? "edge" : "edges"}`,
    measure: (_a, spec) => {
      const n = (spec.edges ?? []).filter((e) => e === "eaves").length;
      return { value: n, text: `${n} open ${n === 1 ? "edge" : "edges"}` };
    },
  },
  flatAreaAtMost: {
    limit: "area",
    compare: "atMost",
    label: (l) => `Area flatter than the minimum fall at most ${l}`,
    measure: (a) => ({
      value: a.shaped.fallMap.flatterThanMinimumArea,
      text: m2(a.shaped.fallMap.flatterThanMinimumArea),
    }),
  },
  flatShareAtMost: {
    limit: "percent",
    compare: "atMost",
    label: (l) => `Share of the roof flatter than the minimum fall at most ${l}`,
    measure: (a) => {
      const total = a.shaped.fallMap.area || a.area;
      const share = total > 0 ? (100 * a.shaped.fallMap.flatterThanMinimumArea) / total : 0;
      return { value: share, text: `${share.toFixed(1)}\u00a0% (${m2(a.shaped.fallMap.flatterThanMinimumArea)})` };
    },
  },
  catchmentFlowAtMost: {
    limit: "flow",
    compare: "atMost",
    label: (l) => `Design flow to the busiest outlet at most ${l}`,
    measure: (a) => {
      const c = outletCatchments(a);
      if (!c.length) return { value: null, text: "no outlet catchment" };
      const busiest = c.reduce((x, y) => (y.flow > x.flow ? y : x));
      return {
        value: busiest.flow,
        text: `${ls(busiest.flow)} (${busiest.label}, ${m2(busiest.area)} at ${a.rainfall.intensity} mm/h)`,
      };
    },
  },
  catchmentAreaAtMost: {
    limit: "area",
    compare: "atMost",
    label: (l) => `Largest outlet catchment at most ${l}`,
    measure: (a) => {
      const c = outletCatchments(a);
      if (!c.length) return { value: null, text: "no outlet catchment" };
      const biggest = c.reduce((x, y) => (y.area > x.area ? y : x));
      return { value: biggest.area, text: `${m2(biggest.area)} (${biggest.label})` };
    },
  },
  noTwist: {
    limit: "none",
    compare: "atMost",
    label: () => "No sharp twist between neighbouring joists",
    measure: (a) => {
      const n = a.warnings.filter((w) => w.code === "twist").length;
      return { value: n, text: n ? `${n} twist ${n === 1 ? "warning" : "warnings"}` : "no twist" };
    },
  },
} as const satisfies Record<string, CriterionKind>;

export type CriterionKindId = keyof typeof CRITERION_KINDS;
export const CRITERION_KIND_IDS = Object.keys(CRITERION_KINDS) as [CriterionKindId, ...CriterionKindId[]];

/**
 * Measures one criterion on an analysed roof and says whether it is met. Shared by the server's
 * grading and the lesson editor's live feedback (the server's grade is the one that counts).
 */
export function checkCriterion(
  c: { kind: CriterionKindId; limit: number },
  analysis: Analysis,
  spec: RoofSpec,
): { passed: boolean; measured: Measured } {
  const kind = CRITERION_KINDS[c.kind];
  const measured = kind.measure(analysis, spec);
  const v = measured.value;
  // Ratios and levels from the engine carry float noise: a roof exactly at the limit passes.
  const slack = 1e-9 * Math.max(1, Math.abs(c.limit));
  const passed = v != null && (kind.compare === "atMost" ? v <= c.limit + slack : v >= c.limit - slack);
  return { passed, measured };
}
