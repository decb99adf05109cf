/** Validation of roof writes for the JSON API (and the pages that post the same thing). */
import { z } from "zod";
import { parseSpec } from "~/engine";
import { pgInt } from "~/lib/input";
import { jsonError, zodIssues } from "~/lib/json-api.server";
import { roofNameSchema, type RoofDetail } from "~/lib/roofs.server";
import { ROOF_FILE_MAX_BYTES } from "~/lib/roof-file";

export const ROOF_BODY_LIMIT = ROOF_FILE_MAX_BYTES;

/** Body of POST /api/v1/roofs (the spec is then checked by the engine); also in the OpenAPI document. */
export const roofCreateSchema = z.object(
  { name: roofNameSchema, spec: z.unknown() },
  { error: "must be an object {name, spec}" },
);
/** Body of PUT /api/v1/roofs/:id; also in the OpenAPI document. */
export const roofUpdateSchema = z.object(
  {
    name: roofNameSchema.optional(),
    spec: z.unknown().optional(),
    version: pgInt(),
  },
  { error: "must be an object {name?, spec?, version}" },
);

export type RoofWrite =
  { ok: true; name?: string; spec?: unknown; version?: number } | { ok: false; response: Response };

/** Shape first (400), then the spec through the engine's parseSpec (400 malformed / 422 cannot be built). */
export function parseRoofWrite(body: unknown, mode: "create" | "update"): RoofWrite {
  const shaped = (mode === "create" ? roofCreateSchema : roofUpdateSchema).safeParse(body);
  if (!shaped.success)
    return { ok: false, response: jsonError(400, "The request body is malformed.", zodIssues(shaped.error.issues)) };
  const value = shaped.data as { name?: string; spec?: unknown; version?: number };
  if (mode === "create" && !("spec" in (body as object))) {
    return {
      ok: false,
      response: jsonError(400, "The request body is malformed.", [{ path: "spec", message: "is required" }]),
    };
  }
  if (mode === "update" && value.name === undefined && value.spec === undefined) {
    return {
      ok: false,
      response: jsonError(400, "Nothing to save: send a name, a spec or both.", [
        { path: "(body)", message: "needs name or spec" },
      ]),
    };
  }
  let spec: unknown;
  if (value.spec !== undefined || mode === "create") {
    const parsed = parseSpec(value.spec);
    if (!parsed.ok) {
      const issues = parsed.error.issues.map((i) => ({
        path: i.path === "(spec)" ? "spec" : `spec.${i.path}`,
        message: i.message,
      }));
      return { ok: false, response: jsonError(parsed.status, parsed.error.message, issues) };
    }
    spec = parsed.spec;
  }
  return { ok: true, name: value.name, spec, version: value.version };
}

export function roofJson(roof: RoofDetail) {
  return {
    id: roof.id,
    name: roof.name,
    version: roof.version,
    shared: roof.shared,
    canEdit: roof.canEdit,
    owner: { id: roof.ownerId, name: roof.ownerName },
    spec: roof.spec,
    underlay: roof.underlay,
    hasUnderlayImage: !!roof.underlayId,
    createdAt: roof.createdAt,
    updatedAt: roof.updatedAt,
  };
}
