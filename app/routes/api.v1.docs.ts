import { openApiHtml } from "~/lib/openapi-html.server";
import { openApiDocument } from "~/lib/openapi.server";

/** GET /api/v1/docs: the OpenAPI document as a readable page (no script, nothing from elsewhere). Public. */
export function loader() {
  return new Response(openApiHtml(openApiDocument()), {
    headers: { "Content-Type": "text/html; charset=utf-8", "Cache-Control": "public, max-age=300" },
  });
}
