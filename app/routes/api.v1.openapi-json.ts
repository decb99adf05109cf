import { openApiDocument } from "~/lib/openapi.server";

/** GET /api/v1/openapi.json: the OpenAPI 3.1 description of /api/v1 (docs/api.md). Public. */
export function loader() {
  return Response.json(openApiDocument(), { headers: { "Cache-Control": "public, max-age=300" } });
}
