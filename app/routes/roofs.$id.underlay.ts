/**
 * The roof's plan image. POST (multipart, field `file`) stores a new one; GET streams it to the
 * owner and, when the roof is shared, to colleagues in the organisation; DELETE removes it.
 * (X-Content-Type-Options: nosniff comes from the host on every response; setting it here too
 * would send it twice.)
 */
import { randomUUID } from "node:crypto";
import type { Route } from "./+types/roofs.$id.underlay";
import { getOptionalUser } from "~/lib/auth.server";
import { db } from "~/lib/db.server";
import { sniffUnderlay, UNDERLAY_MAX_BYTES, UNDERLAY_TYPES, type UnderlayType } from "~/lib/images.server";
import { jsonError, readFormCapped, requireApiPermission } from "~/lib/json-api.server";
import { defaultUnderlaySettings, underlayUrl } from "~/lib/underlay";
import { getRoofFor, getUpload, recordUpload, setUnderlay } from "~/lib/roofs.server";
import { deleteObject, getObjectStream, putObject } from "~/lib/storage.server";

/** Room for the multipart boundaries and headers around a file of the maximum size. */
const MULTIPART_SLACK = 64 * 1024;
const NOT_FOUND = "No roof with that id in your library.";
const STORE_DOWN = "The file store is not answering. The roof itself is safe; try again in a minute.";
const TOO_LARGE = "The image is over 10 MB. Export the plan at a lower resolution and try again.";

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await getOptionalUser(request);
  const roof = user ? await getRoofFor(user, params.id) : null;
  const upload = roof?.underlayId ? await getUpload(roof.underlayId) : null;
  if (!roof || !upload)
    return new Response("Not found", { status: 404, headers: { "Content-Type": "text/plain; charset=utf-8" } });
  const object = await getObjectStream(upload.storageKey).catch((error: Error) => {
    console.warn("[underlay] object store unavailable:", error.message);
    return "down" as const;
  });
  if (object === "down")
    return new Response(STORE_DOWN, {
      status: 503,
      headers: { "Content-Type": "text/plain; charset=utf-8", "Retry-After": "30" },
    });
  if (!object)
    return new Response("Not found", { status: 404, headers: { "Content-Type": "text/plain; charset=utf-8" } });
  const ext = UNDERLAY_TYPES[upload.contentType as UnderlayType] ?? "bin";
  return new Response(object.body, {
    headers: {
      "Content-Type": upload.contentType,
      "Content-Length": String(object.length ?? upload.size),
      "Content-Disposition": `inline; filename="underlay.${ext}"`,
      "Cache-Control": "private, max-age=300",
    },
  });
}

export async function action({ request, params }: Route.ActionArgs) {
  if (request.method !== "POST" && request.method !== "DELETE")
    return jsonError(405, "Use GET, POST or DELETE here.", [], { Allow: "GET, POST, DELETE" });
  const user = await requireApiPermission(request, "roofs:own");
  const roof = await getRoofFor(user, params.id);
  if (!roof) return jsonError(404, NOT_FOUND);
  if (!roof.canEdit) return jsonError(403, "Only the owner can change this roof's underlay.");
  const previous = roof.underlayId ? await getUpload(roof.underlayId) : null;

  if (request.method === "DELETE") {
    await setUnderlay(user, roof.id, { uploadId: null, settings: null });
    if (previous) await forget(roof.underlayId!, previous.storageKey);
    return Response.json({ underlay: null });
  }

  const read = await readFormCapped(request, UNDERLAY_MAX_BYTES + MULTIPART_SLACK);
  if (!read.ok) {
    if (read.status === 413) return jsonError(413, TOO_LARGE);
    if (read.status === 415) return jsonError(415, 'Send the image as multipart/form-data with the field "file".');
    return jsonError(400, "The upload could not be read as a form.", [
      { path: "file", message: "missing or malformed" },
    ]);
  }
  const file = read.form.get("file");
  if (!(file instanceof File) || file.size === 0)
    return jsonError(400, "Choose an image file to upload.", [{ path: "file", message: "is required" }]);
  if (file.size > UNDERLAY_MAX_BYTES) return jsonError(413, TOO_LARGE);
  const bytes = new Uint8Array(await file.arrayBuffer());
  const sniffed = await sniffUnderlay(bytes);
  if (!sniffed.ok) return jsonError(sniffed.status, sniffed.message, [{ path: "file", message: sniffed.message }]);

  // The key is ours alone: the user's file name never reaches the object store.
  const key = `underlays/${randomUUID()}.${sniffed.ext}`;
  try {
    await putObject(key, bytes, sniffed.mime);
  } catch (error) {
    console.warn("[underlay] object store unavailable:", (error as Error).message);
    return jsonError(503, STORE_DOWN, [], { "Retry-After": "30" });
  }
  const keep =
    roof.underlay && roof.underlay.widthPx === sniffed.widthPx && roof.underlay.heightPx === sniffed.heightPx;
  const settings = keep ? roof.underlay! : defaultUnderlaySettings(roof.spec, sniffed.widthPx, sniffed.heightPx);
  let uploadId: string;
  try {
    uploadId = await db().transaction(async (trx) => {
      const id = await recordUpload(trx, {
        ownerId: user.id,
        storageKey: key,
        contentType: sniffed.mime,
        size: bytes.byteLength,
        originalName: file.name,
      });
      await trx("roofs")
        .where({ id: roof.id, owner_id: user.id })
        .update({ underlay_id: id, underlay: JSON.stringify(settings) });
      return id;
    });
  } catch (error) {
    await deleteObject(key).catch(() => {});
    throw error;
  }
  if (previous) await forget(roof.underlayId!, previous.storageKey);
  return Response.json(
    { underlay: settings, url: underlayUrl(roof.id, uploadId), keptCalibration: !!keep },
    { status: 201 },
  );
}

/** Best effort: an orphaned object costs storage, never correctness. */
async function forget(uploadId: string, key: string) {
  await db()("uploads")
    .where({ id: uploadId })
    .delete()
    .catch(() => {});
  await deleteObject(key).catch((e: Error) => console.warn("[underlay] could not delete", key, e.message));
}
