/**
 * The API's analysis answer as UTF-8 JSON bytes, made the same way wherever it runs: in the engine
 * pool's worker thread (app/server/workers/engine-tasks.ts) or, for a small roof, on the request's
 * own thread (app/routes/api.v1.analyses.ts). Turning a large answer into JSON is a large share of
 * its cost, so it is serialised where it was analysed and handed on as bytes.
 */
import { analyseRoof, type Roof } from "../engine";
import type { PoolResult } from "./pool-tasks";

const encoder = new TextEncoder();

export interface AnswerOptions {
  mesh: boolean;
  traces: boolean;
  /** Larger answers are refused ("too-large") rather than sent. */
  maxBytes: number;
}

/** `started` is when the work began (performance.now()), so `ms` counts the checks before this too. */
export function analysisAnswer(roof: Roof, options: AnswerOptions, started: number): PoolResult {
  let json: string;
  try {
    json = JSON.stringify(analyseRoof(roof, { mesh: options.mesh, traces: options.traces }));
  } catch (error) {
    return { kind: "failed", message: (error as Error)?.message ?? String(error), ms: performance.now() - started };
  }
  // Length in UTF-16 units is at most the UTF-8 length for the ASCII-heavy answer; encode only what fits.
  if (json.length > options.maxBytes)
    return { kind: "too-large", bytes: Buffer.byteLength(json), ms: performance.now() - started };
  const bytes = encoder.encode(json);
  if (bytes.byteLength > options.maxBytes)
    return { kind: "too-large", bytes: bytes.byteLength, ms: performance.now() - started };
  return { kind: "bytes", bytes, ms: performance.now() - started };
}
