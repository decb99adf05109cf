/**
 * The OpenAPI 3.1 description of /api/v1, served at /api/v1/openapi.json (docs/api.md).
 * Request bodies are the very zod schemas the routes validate with; answers are the schemas of
 * app/lib/api-responses.ts, which the API tests hold the real responses to. zod-to-openapi reads
 * the classic zod schemas; the engine's roof spec is written with zod's small build (zod/mini),
 * which it cannot read, so that one is converted by zod's own z.toJSONSchema.
 */
import { OpenAPIRegistry, OpenApiGeneratorV31, type ResponseConfig } from "@asteasolutions/zod-to-openapi";
import { z } from "zod";
import { LIMITS } from "~/engine";
import { roofSpecSchema } from "~/engine/schema";
import {
  analysisSchema,
  apiErrorSchema,
  apiIndexSchema,
  attemptListSchema,
  attemptSchema,
  lessonListSchema,
  lessonSchema,
  roofConflictSchema,
  roofDeletedSchema,
  roofListSchema,
  roofSavedSchema,
  roofSchema,
  roofSpecRef,
} from "~/lib/api-responses";
import { asBuiltAnswerSchema, asBuiltBodySchema } from "~/lib/as-built-api";
import { submissionSchema } from "~/lib/lessons/attempts.server";
import { idempotencyKeySchema } from "~/lib/roofs.server";
import { roofCreateSchema, roofUpdateSchema } from "~/lib/roofs-api.server";

export type OpenApiDocument = ReturnType<OpenApiGeneratorV31["generateDocument"]>;

const json = <T>(schema: T) => ({ content: { "application/json": { schema } } });
const answer = (description: string, schema: z.ZodType): ResponseConfig => ({ description, ...json(schema) });
const error = (description: string): ResponseConfig => answer(description, apiErrorSchema);

const E401 = error("Not signed in (no live session cookie).");
const E405 = error("Method not allowed here; the Allow header lists the methods.");
const E413 = error("The body is over the limit.");
const E415 = error("The body is not sent as application/json.");
const SESSION = [{ session: [] }];

/** The request bodies with the roof spec shown as the engine's schema (the routes hand `spec` to parseSpec). */
const roofCreateBody = roofCreateSchema.extend({ spec: roofSpecRef }).meta({ id: "RoofCreate" });
const roofUpdateBody = roofUpdateSchema.extend({ spec: roofSpecRef.optional() }).meta({ id: "RoofUpdate" });
const submissionBody = submissionSchema.extend({ spec: roofSpecRef }).meta({ id: "AttemptSubmission" });
/** Bodies whose `spec` is required although a zod `unknown` reads as optional. */
const SPEC_REQUIRED = ["RoofCreate", "AttemptSubmission"];

const idParam = z.object({ id: z.string().describe("The record's id (a UUID).") });

function build(): OpenApiDocument {
  const registry = new OpenAPIRegistry();
  registry.registerComponent("securitySchemes", "session", {
    type: "apiKey",
    in: "cookie",
    name: "fw_session",
    description: "The session cookie that signing in at /login sets.",
  });

  registry.registerPath({
    method: "get",
    path: "/api/v1",
    summary: "What this API is",
    tags: ["Index"],
    responses: { 200: answer("Name, version and endpoints.", apiIndexSchema) },
  });

  registry.registerPath({
    method: "get",
    path: "/api/v1/openapi.json",
    summary: "This description, as OpenAPI 3.1 JSON",
    tags: ["Index"],
    responses: {
      200: answer(
        "The OpenAPI document.",
        z.looseObject({ openapi: z.string(), info: z.looseObject({ title: z.string() }), paths: z.looseObject({}) }),
      ),
    },
  });
  registry.registerPath({
    method: "get",
    path: "/api/v1/docs",
    summary: "This description as a page to read",
    tags: ["Index"],
    responses: { 200: { description: "An HTML page.", content: { "text/html": { schema: z.string() } } } },
  });

  registry.registerPath({
    method: "post",
    path: "/api/v1/analyses",
    summary: "Analyse a roof spec",
    description:
      "Open to anonymous callers, limited per client address. The method is docs/roof-method.md; limits: " +
      `${LIMITS.maxVertices} vertices, ${LIMITS.maxArea} m², ${LIMITS.maxProbes} probes, 256 kB body.`,
    tags: ["Analyses"],
    request: {
      query: z.object({
        mesh: z.enum(["true", "false"]).optional().describe("Add shaped.mesh, the 3D mesh."),
        traces: z.enum(["true", "false"]).optional().describe("Add shaped.flowTraces."),
      }),
      body: { required: true, ...json(roofSpecRef) },
    },
    responses: {
      200: answer("The analysis.", analysisSchema),
      400: error("The spec is malformed (shape, type, range or an unreadable fall)."),
      413: E413,
      415: E415,
      422: error(
        "The spec is well formed but cannot be built (self-crossing outline, outlet off every parapet edge, too large).",
      ),
      429: error("Too many requests from this address; see Retry-After."),
    },
  });
  registry.registerPath({
    method: "post",
    path: "/api/v1/analyses/as-built",
    summary: "Check measured levels against the design (as-built check)",
    description:
      "Open to anonymous callers, limited per client address like /api/v1/analyses. The method is docs/as-built.md.",
    tags: ["Analyses"],
    request: { body: { required: true, ...json(asBuiltBodySchema.extend({ spec: roofSpecRef })) } },
    responses: {
      200: answer("Deviations, the as-built surface with its ponds, the verdict and the fixes.", asBuiltAnswerSchema),
      400: error("The body is malformed (points, tolerance or the spec)."),
      413: E413,
      415: E415,
      422: error("The spec or the points cannot be used (e.g. points outside the roof)."),
      429: error("Too many requests from this address; see Retry-After."),
    },
  });
  registry.registerPath({
    method: "get",
    path: "/api/v1/analyses/as-built",
    summary: "Not used: POST a spec and measured points",
    tags: ["Analyses"],
    responses: { 405: E405 },
  });
  registry.registerPath({
    method: "get",
    path: "/api/v1/analyses",
    summary: "Not used: POST a roof spec",
    tags: ["Analyses"],
    responses: { 405: E405 },
  });

  registry.registerPath({
    method: "get",
    path: "/api/v1/roofs",
    summary: "My saved roofs, most recently changed first",
    tags: ["Roofs"],
    security: SESSION,
    responses: { 200: answer("My roofs.", roofListSchema), 401: E401 },
  });
  registry.registerPath({
    method: "post",
    path: "/api/v1/roofs",
    summary: "Save a new roof",
    tags: ["Roofs"],
    security: SESSION,
    request: {
      headers: z.object({
        "idempotency-key": idempotencyKeySchema.optional().describe("Makes a repeated save return the first roof."),
      }),
      body: { required: true, ...json(roofCreateBody) },
    },
    responses: {
      201: answer("Saved (or the roof a repeated Idempotency-Key made).", roofSavedSchema),
      400: error("Malformed body, name, spec or Idempotency-Key."),
      401: E401,
      413: E413,
      415: E415,
      422: error("The spec cannot be built."),
    },
  });

  registry.registerPath({
    method: "get",
    path: "/api/v1/roofs/{id}",
    summary: "A roof I own or that is shared with me",
    tags: ["Roofs"],
    security: SESSION,
    request: { params: idParam },
    responses: { 200: answer("The roof.", roofSchema), 401: E401, 404: error("No such roof that you may see.") },
  });
  registry.registerPath({
    method: "put",
    path: "/api/v1/roofs/{id}",
    summary: "Save a new version of my roof",
    tags: ["Roofs"],
    security: SESSION,
    request: { params: idParam, body: { required: true, ...json(roofUpdateBody) } },
    responses: {
      200: answer("Saved; the new version number.", roofSavedSchema),
      400: error("Malformed body, or nothing to save."),
      401: E401,
      403: error("The roof is shared with you read-only."),
      404: error("No such roof that you may see."),
      409: answer("Someone saved first.", roofConflictSchema),
      413: E413,
      415: E415,
      422: error("The spec cannot be built."),
    },
  });
  registry.registerPath({
    method: "delete",
    path: "/api/v1/roofs/{id}",
    summary: "Delete my roof",
    tags: ["Roofs"],
    security: SESSION,
    request: { params: idParam },
    responses: {
      200: answer("Deleted.", roofDeletedSchema),
      401: E401,
      403: error("Only the owner can delete it."),
      404: error("No such roof that you may see."),
    },
  });

  registry.registerPath({
    method: "get",
    path: "/api/v1/lessons",
    summary: "The course, with my progress when signed in",
    tags: ["Lessons"],
    responses: { 200: answer("Every lesson in course order.", lessonListSchema) },
  });
  registry.registerPath({
    method: "get",
    path: "/api/v1/lessons/{slug}",
    summary: "One lesson as the player shows it",
    tags: ["Lessons"],
    request: { params: z.object({ slug: z.string() }) },
    responses: { 200: answer("The lesson.", lessonSchema), 404: error("No such lesson.") },
  });

  registry.registerPath({
    method: "get",
    path: "/api/v1/attempts",
    summary: "Attempts of one trainee, newest first",
    description: "mine=1 for my own; trainee=<id> for a trainee of my classes (trainers) or organisation (admins).",
    tags: ["Attempts"],
    security: SESSION,
    request: {
      query: z.object({
        mine: z.string().optional(),
        trainee: z.string().optional().describe("A trainee's user id."),
        lesson: z.string().optional().describe("Only this lesson's attempts (its slug)."),
      }),
    },
    responses: {
      200: answer("The attempts.", attemptListSchema),
      400: error("Neither mine nor trainee given."),
      401: E401,
      403: error("Not a trainee you may see."),
    },
  });
  registry.registerPath({
    method: "post",
    path: "/api/v1/attempts",
    summary: "Submit a lesson attempt to be graded (docs/grading.md)",
    tags: ["Attempts"],
    security: SESSION,
    request: { body: { required: true, ...json(submissionBody) } },
    responses: {
      200: answer("This idempotency key was used before: the stored attempt.", attemptSchema),
      201: answer("Graded and stored.", attemptSchema),
      400: error("Malformed submission or spec."),
      401: E401,
      404: error("No such lesson."),
      409: error("The named lesson version is unknown: reload the lesson."),
      413: E413,
      415: E415,
      422: error("The spec cannot be built."),
    },
  });
  registry.registerPath({
    method: "get",
    path: "/api/v1/attempts/{id}",
    summary: "One graded attempt",
    tags: ["Attempts"],
    security: SESSION,
    request: { params: idParam },
    responses: {
      200: answer("The attempt.", attemptSchema),
      401: E401,
      404: error("No such attempt that you may see."),
    },
  });

  const document = new OpenApiGeneratorV31(registry.definitions).generateDocument({
    openapi: "3.1.0",
    info: {
      title: "Fallwright API",
      version: "1",
      description:
        "Shape and check flat membrane roofs inside parapets, keep a roof library, take graded lessons. " +
        "Figures are a teaching and early-design aid, to be confirmed by the designer of record against the local " +
        "building code and by licensed practitioners. Errors share one shape (Error); writes need " +
        "Content-Type: application/json and are refused from other sites.",
    },
    servers: [{ url: "/" }],
  });

  const schemas = ((document.components ??= {}).schemas ??= {});
  // The engine's schema as JSON Schema 2020-12, the dialect of OpenAPI 3.1; what a request carries.
  const { $schema: _dialect, ...spec } = z.toJSONSchema(roofSpecSchema, { target: "draft-2020-12", io: "input" });
  schemas.RoofSpec = {
    ...(spec as object),
    description: "A roof spec (docs/roof-method.md §1). Falls are written 1:40, 2°, 2.5%, 25 mm/m or as a number N.",
  };
  for (const id of SPEC_REQUIRED) {
    const schema = schemas[id] as { required?: string[] };
    schema.required = [...new Set([...(schema.required ?? []), "spec"])];
  }
  return document;
}

let cached: OpenApiDocument | null = null;

/** The document, built once per process; callers get their own copy. */
export function openApiDocument(): OpenApiDocument {
  cached ??= build();
  return structuredClone(cached);
}
