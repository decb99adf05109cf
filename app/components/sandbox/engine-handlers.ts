import { parseFall, parseSpec, RULE_SETS } from "~/engine";
import type { EngineAnswers, EngineRequest } from "./engine-protocol";
import { runAnalysis } from "./run-analysis";

/** The engine's side of the protocol: runs in the worker, or on the main thread when there is none. */
export function handleEngineRequest(request: EngineRequest): EngineAnswers[EngineRequest["kind"]] {
  switch (request.kind) {
    case "analyse":
      return runAnalysis(request.spec);
    case "parseFall":
      return parseFall(request.text);
    case "parseSpec":
      return parseSpec(request.input);
    case "ruleSets":
      return Object.values(RULE_SETS).map((r) => ({ id: r.id, name: r.name, notes: r.notes }));
  }
}
