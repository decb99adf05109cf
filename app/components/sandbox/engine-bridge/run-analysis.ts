import { analyse, parseSpec, type RoofSpec } from "~/engine";
import { analysisOutcome, type EngineOutcome } from "./analysis-outcome";

export type { EngineOutcome } from "./analysis-outcome";

/** Validate and analyse a spec on this thread, every fall reader installed; never throws. */
export function runAnalysis(spec: RoofSpec): EngineOutcome {
  return analysisOutcome(spec, { parseSpec, analyse });
}
