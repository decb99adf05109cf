/**
 * Roof analyses for the open API and the schedule CSV, in a worker thread of the engine pool
 * (app/lib/pool.server.ts), so a two-second analysis never delays other requests.
 * The analysis is serialised here too (app/lib/analysis-answer.ts).
 */
import { analyse, asBuilt, parseRoofSpec, parseSpec } from "../../engine";
import { analysisAnswer } from "../../lib/analysis-answer";
import type { PoolTask, PoolResult } from "../../lib/pool-tasks";

function analyseTask(task: Extract<PoolTask, { kind: "analyse" }>): PoolResult {
  const started = performance.now();
  const parsed = parseRoofSpec(task.spec);
  if (!parsed.ok)
    return { kind: "refused", status: parsed.status, error: parsed.error, ms: performance.now() - started };
  // The bytes are cloned on the way back (a memcpy); piscina moves only a top-level transferable.
  return analysisAnswer(parsed.roof, task, started);
}

/** An analysis handed back as an object (structured clone keeps its typed arrays): the builder's pack files. */
function shapeTask(task: Extract<PoolTask, { kind: "shape" }>): PoolResult {
  const started = performance.now();
  const parsed = parseSpec(task.spec);
  if (!parsed.ok)
    return { kind: "refused", status: parsed.status, error: parsed.error, ms: performance.now() - started };
  try {
    return {
      kind: "analysis",
      analysis: analyse(parsed.spec, { mesh: task.mesh, traces: false }),
      ms: performance.now() - started,
    };
  } catch (error) {
    return { kind: "failed", message: (error as Error)?.message ?? String(error), ms: performance.now() - started };
  }
}

/** An as-built check (docs/as-built.md) of a spec and measured points. */
function asBuiltTask(task: Extract<PoolTask, { kind: "as-built" }>): PoolResult {
  const started = performance.now();
  const parsed = parseSpec(task.spec);
  if (!parsed.ok)
    return { kind: "refused", status: parsed.status, error: parsed.error, ms: performance.now() - started };
  try {
    const answer = asBuilt(parsed.spec, task.points, task.tolerance);
    if (!answer.ok)
      return {
        kind: "refused",
        status: answer.status,
        error: { message: answer.issues.map((i) => i.message).join(" "), issues: answer.issues },
        ms: performance.now() - started,
      };
    return { kind: "as-built", result: answer.result, ms: performance.now() - started };
  } catch (error) {
    return { kind: "failed", message: (error as Error)?.message ?? String(error), ms: performance.now() - started };
  }
}

export function runTask(task: PoolTask): PoolResult {
  switch (task.kind) {
    case "analyse":
      return analyseTask(task);
    case "shape":
      return shapeTask(task);
    case "as-built":
      return asBuiltTask(task);
    default:
      throw new Error(`the engine pool does not run ${task.kind} tasks`);
  }
}
