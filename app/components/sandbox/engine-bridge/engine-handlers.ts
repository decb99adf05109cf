import {
  analyse,
  loadFallUnits,
  needsFallUnits,
  parseFall,
  parseSpec,
  PREVIEW_MESH_VERTICES,
  RULE_SETS,
} from "~/engine/core";
import type { EngineAnswers, EngineRequest } from "./engine-protocol";
import type { Analysis, RoofSpec } from "~/engine/core";
import { analysisOutcome, type EngineOutcome } from "./analysis-outcome";

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

/**
 * The engine's side of the protocol: runs in the worker, or on the main thread when there is none.
 * Analyses carry their mesh as typed arrays (`shaped.meshBuffers`), which the worker hands over
 * without copying (see `transferablesOf`) and the 3D view uploads as they are.
 */
export function handleEngineRequest(request: EngineRequest): EngineAnswers[EngineRequest["kind"]] {
  switch (request.kind) {
    case "analyse":
      return request.preview
        ? previewOutcome(request.spec)
        : analysisOutcome(request.spec, { parseSpec, analyse }, { mesh: "typed" });
    case "parseFall":
      return parseFall(request.text);
    case "parseSpec":
      return parseSpec(request.input);
    case "ruleSets":
      return Object.values(RULE_SETS).map((r) => ({ id: r.id, name: r.name, notes: r.notes }));
  }
}

/**
 * The drag preview: the analysis on a coarser mesh, marked as such. Its coarse mesh is chosen,
 * so the warning that a mesh was coarsened is left out (the full analysis that follows gives it
 * when it applies).
 */
function previewOutcome(spec: RoofSpec): EngineOutcome {
  const outcome = analysisOutcome(
    spec,
    { parseSpec, analyse },
    {
      mesh: "typed",
      maxMeshVertices: PREVIEW_MESH_VERTICES,
    },
  );
  if (!outcome.ok) return outcome;
  const warnings = outcome.analysis.warnings.filter((w) => w.code !== "mesh-coarsened");
  return { ok: true, preview: true, analysis: { ...outcome.analysis, warnings } };
}

/** The typed arrays an answer can hand over to the page instead of copying them (none for other answers). */
export function transferablesOf(answer: unknown): ArrayBuffer[] {
  const analysis = (answer as { analysis?: Partial<Analysis> } | null)?.analysis;
  const buffers = analysis?.shaped?.meshBuffers;
  if (!buffers) return [];
  const out = new Set<ArrayBuffer>();
  for (const a of [buffers.positions, buffers.indices, buffers.faceRatio, buffers.faceDrain])
    if (a.buffer instanceof ArrayBuffer) out.add(a.buffer);
  return [...out];
}
