import type { Route } from "./+types/api.v1.roofs.$id";
import { jsonError, readJsonBody, requireApiPermission } from "~/lib/json-api.server";
import { getRoofFor, softDeleteRoof, updateRoof } from "~/lib/roofs.server";
import { parseRoofWrite, ROOF_BODY_LIMIT, roofWriteError, roofJson } from "~/lib/roofs-api.server";

const NOT_FOUND = "No roof with that id in your library.";

/** GET /api/v1/roofs/:id: a roof I own, or one shared with me in my organisation. */
export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireApiPermission(request, "roofs:own");
  const roof = await getRoofFor(user, params.id);
  if (!roof) return jsonError(404, NOT_FOUND);
  return Response.json(roofJson(roof));
}

/** PUT {name?, spec?, version} → 200 {id, version} | 409 {error, current}; DELETE → 200. */
export async function action({ request, params }: Route.ActionArgs) {
  if (request.method !== "PUT" && request.method !== "DELETE") {
    return jsonError(405, "Use GET, PUT or DELETE here.", [], { Allow: "GET, PUT, DELETE" });
  }
  const user = await requireApiPermission(request, "roofs:own");

  if (request.method === "DELETE") {
    const result = await softDeleteRoof(user, params.id);
    if (result === "not-found") return jsonError(404, NOT_FOUND);
    if (result === "forbidden") return jsonError(403, "Only the owner can delete this roof.");
    return Response.json({ id: params.id, deleted: true });
  }

  const body = await readJsonBody(request, ROOF_BODY_LIMIT);
  if (!body.ok) return body.response;
  const input = parseRoofWrite(body.value, "update");
  if (!input.ok) return roofWriteError(input);
  const result = await updateRoof(user, params.id, { name: input.name, spec: input.spec, version: input.version });
  switch (result.status) {
    case "ok":
      return Response.json({ id: result.id, version: result.version });
    case "conflict":
      return Response.json(
        {
          error: {
            message: `Someone saved this roof first (now version ${result.current.version}). Nothing of yours was written.`,
            issues: [],
          },
          current: result.current,
        },
        { status: 409 },
      );
    case "forbidden":
      return jsonError(403, "This roof is shared with you read-only. Save a copy to change it.");
    case "not-found":
      return jsonError(404, NOT_FOUND);
  }
}
