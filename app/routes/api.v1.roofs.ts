import type { Route } from "./+types/api.v1.roofs";
import { jsonError, readJsonBody, requireApiPermission } from "~/lib/json-api.server";
import { createRoof, idempotencyKeySchema, listMyRoofs } from "~/lib/roofs.server";
import { keyReusedMessage } from "~/lib/idempotency.server";
import { parseRoofWrite, ROOF_BODY_LIMIT, roofWriteError } from "~/lib/roofs-api.server";

/** GET /api/v1/roofs: my saved roofs, newest first. */
export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireApiPermission(request, "roofs:own");
  return Response.json({ roofs: await listMyRoofs(user) });
}

/** POST /api/v1/roofs {name, spec} → 201 {id, version}; an Idempotency-Key header makes repeats harmless. */
export async function action({ request }: Route.ActionArgs) {
  if (request.method !== "POST") return jsonError(405, "Use GET or POST here.", [], { Allow: "GET, POST" });
  const user = await requireApiPermission(request, "roofs:own");
  const body = await readJsonBody(request, ROOF_BODY_LIMIT);
  if (!body.ok) return body.response;
  const input = parseRoofWrite(body.value, "create");
  if (!input.ok) return roofWriteError(input);
  const rawKey = request.headers.get("idempotency-key");
  const key = rawKey === null ? null : idempotencyKeySchema.safeParse(rawKey);
  if (key && !key.success)
    return jsonError(400, "The Idempotency-Key header must be 8-100 letters, digits or -_.:", [
      { path: "(header) Idempotency-Key", message: "is malformed" },
    ]);
  const result = await createRoof(user, { name: input.name, spec: input.spec, idempotencyKey: key?.data });
  if ("keyReused" in result)
    return jsonError(422, keyReusedMessage(result.keyReused), [
      { path: "(header) Idempotency-Key", message: "was already used for a different request" },
    ]);
  const { repeated, ...created } = result;
  const headers: Record<string, string> = { Location: `/api/v1/roofs/${created.id}` };
  if (repeated) headers["Idempotent-Replayed"] = "true";
  return Response.json(created, { status: 201, headers });
}
