/** GET /api/v1: what this API is, and a trivial JSON answer (the bench's baseline route). */
export function loader() {
  return Response.json({
    name: "Fallwright API",
    version: 1,
    endpoints: [
      "POST /api/v1/analyses",
      "POST /api/v1/analyses/as-built",
      "GET|POST /api/v1/roofs",
      "GET|PUT|DELETE /api/v1/roofs/:id",
      "GET /api/v1/lessons",
      "GET|POST /api/v1/attempts",
      "GET /api/v1/attempts/:id",
      "GET /api/v1/lessons/:slug",
      "GET /api/v1/openapi.json",
      "GET /api/v1/docs",
    ],
  });
}
