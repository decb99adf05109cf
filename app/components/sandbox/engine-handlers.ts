import { analyse, loadFallUnits, needsFallUnits, parseFall, parseSpec, RULE_SETS } from "~/engine/core";
import type { EngineAnswers, EngineRequest } from "./engine-protocol";
import { analysisOutcome } from "./analysis-outcome";

/**
 * Loads the fall unit reader (mathjs) first when the request holds a fall that needs it; a plain
 * ratio, percent or degree does not (docs/decisions/0015-lazy-unit-reader.md).
 */
export async function prepareEngineRequest(request: EngineRequest): Promise<void> {
  const holder =
    request.kind === "analyse"
      ? request.spec
      : request.kind === "parseFall"
        ? request.text
        : request.kind === "parseSpec"
          ? request.input
          : null;
  if (needsFallUnits(holder)) await loadFallUnits();
}

/** The engine's side of the protocol: runs in the worker, or on the main thread when there is none. */
export function handleEngineRequest(request: EngineRequest): EngineAnswers[EngineRequest["kind"]] {
  switch (request.kind) {
    case "analyse":
      return analysisOutcome(request.spec, { parseSpec, analyse });
    case "parseFall":
      return parseFall(request.text);
    case "parseSpec":
      return parseSpec(request.input);
    case "ruleSets":
      return Object.values(RULE_SETS).map((r) => ({ id: r.id, name: r.name, notes: r.notes }));
  }
}
