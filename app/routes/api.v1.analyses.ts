import type { Route } from "./+types/api.v1.analyses";
import { analyseRoof, parseRoofSpec } from "~/engine";
import { jsonError, readJsonBody } from "~/lib/json-api.server";
import { limitApiRequest } from "~/lib/rate-limit.server";

/** Largest request body accepted (issue 4): a 200-vertex outline with 1,000 probes fits well inside. */
export const ANALYSIS_BODY_LIMIT = 256 * 1024;

const NO_STORE = { "Cache-Control": "no-store" };

/** GET has nothing to show: analyses are made by POSTing a roof spec. */
export function loader() {
  return jsonError(405, "POST a roof spec as JSON to analyse it.", [], { Allow: "POST" });
}

/**
 * POST /api/v1/analyses: a roof spec in, its analysis out (ROOF-METHOD.md §9). Open to anonymous
 * visitors, limited per address. 415 unless JSON, 413 over 256 kB (counted as it is read), 400
 * malformed, 422 cannot be built, 429 too many; never 500. The bulky 3D mesh and flow traces
 * come only on request (`?mesh=true`, `?traces=true`): the sandbox builds its own in a worker,
 * and leaving them out keeps the API at better than half the speed of a trivial route.
 */
export async function action({ request, context }: Route.ActionArgs) {
  if (request.method !== "POST") return jsonError(405, "Use POST here.", [], { Allow: "POST" });
  // Counted in this process's memory, not in the database (see limitApiRequest): the sandbox's
  // analyses keep working while PostgreSQL is down.
  const limited = await limitApiRequest(context);
  if (limited) return limited;
  let body: Awaited<ReturnType<typeof readJsonBody>>;
  try {
    body = await readJsonBody(request, ANALYSIS_BODY_LIMIT);
  } catch {
    return jsonError(400, "The request body could not be read.", [{ path: "(body)", message: "could not be read" }], NO_STORE);
  }
  if (!body.ok) return body.response;
  // The roof prepared while checking the spec is the one analysed: no second preparation.
  const parsed = parseRoofSpec(body.value);
  if (!parsed.ok) return Response.json({ error: parsed.error }, { status: parsed.status, headers: NO_STORE });
  const query = new URL(request.url).searchParams;
  try {
    const analysis = analyseRoof(parsed.roof, {
      mesh: query.get("mesh") === "true",
      traces: query.get("traces") === "true",
    });
    return Response.json(analysis, { headers: NO_STORE });
  } catch (error) {
    console.error("analysis failed for a spec that passed validation", error);
    return jsonError(422, "The roof passed validation but could not be analysed. Simplify the outline and try again.", [], NO_STORE);
  }
}
