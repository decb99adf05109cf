/**
 * The request handling the analysis endpoints share (POST /api/v1/analyses and
 * /api/v1/analyses/as-built): POST only, the per-address budget (docs/security.md), a JSON body of
 * at most 256 kB counted as it is read, answers never stored by caches.
 */
import type { AppLoadContext } from "react-router";
import { meshStationEstimate, type Roof } from "~/engine";
import { jsonError, readJsonBody, type JsonBody } from "~/lib/json-api.server";
import { limitApiRequest } from "~/lib/rate-limit.server";

/** Largest request body accepted: a 200-vertex outline with 1,000 probes fits well inside. */
export const ANALYSIS_BODY_LIMIT = 256 * 1024;

export const NO_STORE = { "Cache-Control": "no-store" } as const;

/** The answer to a GET: analyses are made by POSTing. */
export function postOnly(message: string): Response {
  return jsonError(405, message, [], { Allow: "POST" });
}

/**
 * The analysis request's JSON body, or the response that refuses it: 405 unless POST, 429 when
 * the address's budget is spent, 415/413/400 from the body. The budget is kept in this process's
 * memory, not in the database (see limitApiRequest), so analyses keep working while PostgreSQL is down.
 */
export async function readAnalysisRequest(request: Request, context: AppLoadContext | undefined): Promise<JsonBody> {
  if (request.method !== "POST")
    return { ok: false, response: jsonError(405, "Use POST here.", [], { Allow: "POST" }) };
  try {
    const limited = await limitApiRequest(context);
    if (limited) return { ok: false, response: limited };
  } catch {
    // A fault in the limiter must not stop an analysis that needs nothing else.
  }
  try {
    return await readJsonBody(request, ANALYSIS_BODY_LIMIT);
  } catch {
    return {
      ok: false,
      response: jsonError(
        400,
        "The request body could not be read.",
        [{ path: "(body)", message: "could not be read" }],
        NO_STORE,
      ),
    };
  }
}

/**
 * The largest analyses run on the request's own thread instead of the engine pool. Handing a task
 * to a worker thread and taking its answer back costs the server about 0.4 ms of CPU, as much as
 * analysing a 15 × 10 m roof; for roofs this small the hand-off was most of the cost (README,
 * Performance). The bounds keep the event loop's wait short: the most work they let in took about
 * 2 ms here, checks and JSON included (`npm run bench`, "API, largest on the request thread").
 * Anything larger, anything with the 3D mesh or flow traces, and every roof whose body is over
 * 4 kB goes to the pool as before.
 */
export const ON_REQUEST_THREAD = {
  /** Request body, in bytes: reading it fully on this thread stays trivial. */
  bodyBytes: 4 * 1024,
  /** Outline vertices: fall lines and the boundary grow with them. */
  vertices: 16,
  openings: 2,
  outlets: 8,
  /** meshStationEstimate(roof): a 30 × 30 m roof at 0.4 m joists is about 12,000. */
  stations: 20_000,
} as const;

/** Whether an analysis of this already checked roof runs on the request's thread (ON_REQUEST_THREAD). */
export function analysedOnRequestThread(
  bodyBytes: number,
  roof: Roof,
  options: { mesh: boolean; traces: boolean },
): boolean {
  const limit = ON_REQUEST_THREAD;
  return (
    !options.mesh &&
    !options.traces &&
    bodyBytes <= limit.bodyBytes &&
    roof.n <= limit.vertices &&
    roof.holes.length <= limit.openings &&
    roof.outlets.length <= limit.outlets &&
    meshStationEstimate(roof) <= limit.stations
  );
}
