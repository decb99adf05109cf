import type { Route } from "./+types/api.v1.analyses.as-built";
import { asBuilt, parseSpec } from "~/engine";
import { NO_STORE, postOnly, readAnalysisRequest } from "~/lib/analysis-request.server";
import { jsonError, zodIssues } from "~/lib/json-api.server";
import { asBuiltBodySchema as bodySchema } from "~/lib/as-built-api";

export function loader() {
  return postOnly("POST a roof spec with measured points as JSON to check them.");
}

/**
 * POST /api/v1/analyses/as-built: a roof spec and levels measured on site in, the as-built check
 * out (docs/as-built.md). Same habits as POST /api/v1/analyses: open, limited per address, 415
 * unless JSON, 413 over 256 kB, 400 malformed, 422 cannot be built, 429 too many; never 500.
 */
export async function action({ request, context }: Route.ActionArgs) {
  const body = await readAnalysisRequest(request, context);
  if (!body.ok) return body.response;
  const shaped = bodySchema.safeParse(body.value);
  if (!shaped.success) {
    const issues = zodIssues(shaped.error.issues.slice(0, 50));
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
