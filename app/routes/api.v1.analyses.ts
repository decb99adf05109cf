import type { Route } from "./+types/api.v1.analyses";
import { parseRoofSpec } from "~/engine";
import { analysisAnswer } from "~/lib/analysis-answer";
import {
  analysedOnRequestThread,
  NO_STORE,
  ON_REQUEST_THREAD,
  postOnly,
  readAnalysisRequest,
} from "~/lib/analysis-request.server";
import { jsonError } from "~/lib/json-api.server";
import { log } from "~/lib/log.server";
import { metrics } from "~/lib/metrics.server";
import type { PoolResult } from "~/lib/pool-tasks";
import { PoolBusy, PoolTimeout, runInPool } from "~/lib/pool.server";
import { chargeApiWork } from "~/lib/rate-limit.server";
import { currentRequest } from "~/lib/request-context.server";

/** Largest answer sent (docs/security.md): a 100 × 100 m roof with mesh and traces is about 7.4 MB. */
export const ANALYSIS_ANSWER_MAX_BYTES = 10 * 1024 * 1024;
/** Longest an analysis may take, waiting for a worker included. */
export const ANALYSIS_TIMEOUT_MS = 30_000;

/** GET has nothing to show: analyses are made by POSTing a roof spec. */
export function loader() {
  return postOnly("POST a roof spec as JSON to analyse it.");
}

const mb = (bytes: number) => `${(bytes / 1024 / 1024).toFixed(1)} MB`;

/**
 * POST /api/v1/analyses: a roof spec in, its analysis out (docs/roof-method.md §9). Open to
 * anonymous visitors, with a per-address budget charged by the work each analysis took
 * (rate-limit.server.ts, limitApiRequest). 415 unless JSON, 413 over 256 kB (counted as it is
 * read), 400 malformed, 422 cannot be built or the answer would be over 10 MB, 429 budget spent,
 * 503 the engine's workers are saturated or the analysis ran past 30 s; never 500. The roof is
 * checked, analysed and serialised in the engine's worker pool, so the event loop stays free; a
 * small roof (ON_REQUEST_THREAD) is analysed on the request's thread, where it costs less than
 * the hand-off to a worker.
 * The bulky 3D mesh and flow traces come only on request (`?mesh=true`, `?traces=true`).
 */
export async function action({ request, context }: Route.ActionArgs) {
  const body = await readAnalysisRequest(request, context);
  if (!body.ok) return body.response;
  const query = new URL(request.url).searchParams;
  const options = {
    mesh: query.get("mesh") === "true",
    traces: query.get("traces") === "true",
    maxBytes: ANALYSIS_ANSWER_MAX_BYTES,
  };
  const started = performance.now();
  let thread: "request" | "pool" = "pool";
  const observe = (outcome: string) =>
    metrics().analysisDuration.observe({ kind: "api", outcome, thread }, (performance.now() - started) / 1000);
  let result: PoolResult;
  // A small request is checked here: small roofs are analysed on this thread (ON_REQUEST_THREAD),
  // and a refused one needs no worker. Larger bodies are checked in the worker with the analysis.
  const parsed = body.bytes <= ON_REQUEST_THREAD.bodyBytes ? parseRoofSpec(body.value) : null;
  if (parsed && !parsed.ok) {
    thread = "request";
    result = { kind: "refused", status: parsed.status, error: parsed.error, ms: performance.now() - started };
  } else if (parsed && analysedOnRequestThread(body.bytes, parsed.roof, options)) {
    thread = "request";
    result = analysisAnswer(parsed.roof, options, started);
  } else {
    try {
      result = await runInPool("engine", { kind: "analyse", spec: body.value, ...options }, ANALYSIS_TIMEOUT_MS);
    } catch (error) {
      if (error instanceof PoolBusy || error instanceof PoolTimeout) {
        observe(error instanceof PoolBusy ? "busy" : "timeout");
        if (error instanceof PoolTimeout) chargeApiWork(context, ANALYSIS_TIMEOUT_MS);
        const message =
          error instanceof PoolBusy
            ? "The server is analysing many roofs at once. Try again in a few seconds."
            : `The analysis did not finish within ${ANALYSIS_TIMEOUT_MS / 1000} s. Try again, or send a simpler roof.`;
        return jsonError(503, message, [], { ...NO_STORE, "Retry-After": "5" });
      }
      throw error;
    }
  }
  chargeApiWork(context, result.ms);
  switch (result.kind) {
    case "bytes":
      observe("ok");
      return new Response(result.bytes as Uint8Array<ArrayBuffer>, {
        headers: { ...NO_STORE, "Content-Type": "application/json; charset=utf-8" },
      });
    case "refused":
      observe("refused");
      return Response.json({ error: result.error }, { status: result.status, headers: NO_STORE });
    case "too-large":
      observe("too_large");
      return jsonError(
        422,
        `The answer would be ${mb(result.bytes)}, over the ${mb(ANALYSIS_ANSWER_MAX_BYTES)} this API sends. Ask without the 3D mesh and flow traces (mesh, traces), use wider joist spacing or fewer probes.`,
        [{ path: "(answer)", message: `would be ${mb(result.bytes)}, over ${mb(ANALYSIS_ANSWER_MAX_BYTES)}` }],
        NO_STORE,
      );
    default:
      observe("failed");
      log().error(
        { reqId: currentRequest()?.id, reason: result.kind === "failed" ? result.message : result.kind },
        "analysis failed for a spec that passed validation",
      );
      return jsonError(
        422,
        "The roof passed validation but could not be analysed. Simplify the outline and try again.",
        [],
        NO_STORE,
      );
  }
}
