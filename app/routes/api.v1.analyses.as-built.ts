import type { Route } from "./+types/api.v1.analyses.as-built";
import { asBuilt, parseSpec } from "~/engine";
import { jsonError, readJsonBody } from "~/lib/json-api.server";
import { limitApiRequest } from "~/lib/rate-limit.server";
import { ANALYSIS_BODY_LIMIT } from "./api.v1.analyses";
import { asBuiltBodySchema as bodySchema } from "~/lib/as-built-api";

const NO_STORE = { "Cache-Control": "no-store" };

export function loader() {
  return jsonError(405, "POST a roof spec with measured points as JSON to check them.", [], { Allow: "POST" });
}

/**
 * POST /api/v1/analyses/as-built: a roof spec and levels measured on site in, the as-built check
 * out (docs/as-built.md). Same habits as POST /api/v1/analyses: open, limited per address, 415
 * unless JSON, 413 over 256 kB, 400 malformed, 422 cannot be built, 429 too many; never 500.
 */
export async function action({ request, context }: Route.ActionArgs) {
  if (request.method !== "POST") return jsonError(405, "Use POST here.", [], { Allow: "POST" });
  try {
    const limited = await limitApiRequest(context);
    if (limited) return limited;
  } catch {
    // As for analyses: a database fault must not stop a check that does not need it.
  }
  let body: Awaited<ReturnType<typeof readJsonBody>>;
  try {
    body = await readJsonBody(request, ANALYSIS_BODY_LIMIT);
  } catch {
    return jsonError(
      400,
      "The request body could not be read.",
      [{ path: "(body)", message: "could not be read" }],
      NO_STORE,
    );
  }
  if (!body.ok) return body.response;
  const shaped = bodySchema.safeParse(body.value);
  if (!shaped.success) {
    const issues = shaped.error.issues
      .slice(0, 50)
      .map((i) => ({ path: i.path.length ? i.path.map(String).join(".") : "(body)", message: i.message }));
    return jsonError(
      400,
      `The as-built request is malformed: ${issues
        .slice(0, 3)
        .map((i) => `${i.path}: ${i.message}`)
        .join("; ")}`,
      issues,
      NO_STORE,
    );
  }
  const spec = parseSpec(shaped.data.spec);
  if (!spec.ok) {
    const issues = spec.error.issues.map((i) => ({ path: `spec.${i.path}`, message: i.message }));
    return jsonError(spec.status, spec.error.message, issues, NO_STORE);
  }
  try {
    const answer = asBuilt(spec.spec, shaped.data.points, shaped.data.tolerance ?? {});
    if (!answer.ok) {
      return jsonError(
        answer.status,
        answer.issues.map((i) => `${i.path}: ${i.message}`).join("; "),
        answer.issues,
        NO_STORE,
      );
    }
    const { deviations, surface, verdict, fixes, tolerance } = answer.result;
    return Response.json({ deviations, surface, verdict, fixes, tolerance }, { headers: NO_STORE });
  } catch (error) {
    console.error("as-built check failed for input that passed validation", error);
    return jsonError(
      422,
      "The survey passed validation but could not be checked. Check the points and try again.",
      [],
      NO_STORE,
    );
  }
}
