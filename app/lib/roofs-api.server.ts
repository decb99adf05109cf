/** Validation of roof writes for the JSON API (and the pages that post the same thing). */
import { z } from "zod";
import { parseSpec, type RoofSpec } from "~/engine";
import { pgInt } from "~/lib/input";
import { jsonError, zodIssues, type ApiIssue } from "~/lib/json-api.server";
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

/** Why a roof write was refused (400 malformed, 422 cannot be built), with field issues. */
export type RoofWriteRefused = { ok: false; status: 400 | 422; message: string; issues: ApiIssue[] };
/** A checked new roof, or why not. */
export type RoofCreate = { ok: true; name: string; spec: RoofSpec } | RoofWriteRefused;
/** A checked change to a roof (a name, a spec or both, and the version it starts from), or why not. */
export type RoofUpdate = { ok: true; name?: string; spec?: RoofSpec; version: number } | RoofWriteRefused;

/** The JSON API's answer for a refused write. */
export function roofWriteError(refused: RoofWriteRefused): Response {
  return jsonError(refused.status, refused.message, refused.issues);
}

/** Shape first (400), then the spec through the engine's parseSpec (400 malformed / 422 cannot be built). */
export function parseRoofWrite(body: unknown, mode: "create"): RoofCreate;
export function parseRoofWrite(body: unknown, mode: "update"): RoofUpdate;
export function parseRoofWrite(body: unknown, mode: "create" | "update"): RoofCreate | RoofUpdate {
  const shaped = (mode === "create" ? roofCreateSchema : roofUpdateSchema).safeParse(body);
  if (!shaped.success)
    return {
      ok: false,
      status: 400,
      message: "The request body is malformed.",
      issues: zodIssues(shaped.error.issues),
    };
  const value = shaped.data as { name?: string; spec?: unknown; version?: number };
  if (mode === "create" && !("spec" in (body as object))) {
    return {
      ok: false,
      status: 400,
      message: "The request body is malformed.",
      issues: [{ path: "spec", message: "is required" }],
    };
  }
  if (mode === "update" && value.name === undefined && value.spec === undefined) {
    return {
      ok: false,
      status: 400,
      message: "Nothing to save: send a name, a spec or both.",
      issues: [{ path: "(body)", message: "needs name or spec" }],
    };
  }
  let spec: RoofSpec | undefined;
  if (value.spec !== undefined || mode === "create") {
    const parsed = parseSpec(value.spec);
    if (!parsed.ok) {
      const issues = parsed.error.issues.map((i) => ({
        path: i.path === "(spec)" ? "spec" : `spec.${i.path}`,
        message: i.message,
      }));
      return { ok: false, status: parsed.status, message: parsed.error.message, issues };
    }
    spec = parsed.spec;
  }
  return { ok: true, name: value.name, spec, version: value.version } as RoofCreate | RoofUpdate;
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
