import type { FallResult, ParseSpecResult, RoofSpec, RuleSetId } from "~/engine";
import type { EngineOutcome } from "./analysis-outcome";
import type { Superseded } from "./engine-server";

/** A rule set as the picker and the sources list need it. */
export interface RuleSetInfo {
  id: RuleSetId;
  name: string;
  notes: string[];
}

/** Messages to the engine worker (or its main-thread stand-in) and what each answers. */
export type EngineRequest =
  /** preview: while a drag goes on, the same analysis on a mesh sized to a frame (PREVIEW_MESH_VERTICES). */
  | { kind: "analyse"; spec: RoofSpec; preview?: boolean }
  | { kind: "parseFall"; text: string }
  | { kind: "parseSpec"; input: unknown }
  | { kind: "ruleSets" };

export interface EngineAnswers {
  /** Superseded: a newer analysis came in before this one started, so it was dropped. */
  analyse: EngineOutcome | Superseded;
  parseFall: FallResult;
  parseSpec: ParseSpecResult;
  ruleSets: RuleSetInfo[];
}
