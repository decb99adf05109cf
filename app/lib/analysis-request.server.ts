/**
 * The request handling the analysis endpoints share (POST /api/v1/analyses and
 * /api/v1/analyses/as-built): POST only, the per-address budget (docs/security.md), a JSON body of
 * at most 256 kB counted as it is read, answers never stored by caches.
 */
import type { AppLoadContext } from "react-router";
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
