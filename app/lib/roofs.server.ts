/**
 * The saved-roofs library: who may see and change a roof, and every write that keeps `roofs`
 * and `roof_versions` in step (each in one transaction). Optimistic locking: a save names the
 * version it started from; if someone saved in between, nothing is written and the caller gets
 * the winner back (409) so it can offer "reload theirs" or "keep mine as a copy".
 */
import type { Knex } from "knex";
import type { RoofSpec } from "~/engine";
import { z } from "zod";
import { db } from "~/lib/db.server";
import type { SessionUser } from "~/lib/auth.server";
import { requestHash, sameRequest } from "~/lib/idempotency.server";
import { underlaySettingsSchema, type UnderlaySettings } from "~/lib/roof-file";

export { roofNameSchema } from "~/lib/roof-file";

/** How long a deleted roof can still be brought back by "Undo". */
export const RESTORE_WINDOW_HOURS = 24;
export const HISTORY_LIMIT = 30;
/** Autosaves by the same person within this many minutes of the last one share one version row. */
export const AUTOSAVE_COALESCE_MINUTES = 5;

/** What made a version: only `auto` rows are ever coalesced. */
export type VersionKind = "created" | "auto" | "named" | "restored";

import { isUuid } from "~/lib/input";

export { isUuid };

export interface RoofSummary {
  id: string;
  name: string;
  version: number;
  shared: boolean;
  updatedAt: string;
  createdAt: string;
}

export interface SharedRoofSummary extends RoofSummary {
  ownerName: string;
}

export interface RoofDetail extends RoofSummary {
  ownerId: string;
  ownerName: string;
  /** Every write goes through the engine's parseSpec (app/lib/roofs-api.server.ts), so a stored spec is a RoofSpec. */
  spec: RoofSpec;
  underlayId: string | null;
  underlay: UnderlaySettings | null;
  /** True for the owner; a colleague reading a shared roof gets false. */
  canEdit: boolean;
}

export interface RoofVersionRow {
  version: number;
  name: string;
  savedAt: string;
  savedBy: string | null;
}

export type UpdateResult =
  | { status: "ok"; id: string; version: number }
  | { status: "conflict"; current: { version: number; spec: RoofSpec; name: string } }
  | { status: "forbidden" }
  | { status: "not-found" };

const iso = (d: Date | string) => (d instanceof Date ? d.toISOString() : new Date(d).toISOString());

function summary(r: {
  id: string;
  name: string;
  version: number;
  shared: boolean;
  updated_at: Date;
  created_at: Date;
}): RoofSummary {
  return {
    id: r.id,
    name: r.name,
    version: r.version,
    shared: r.shared,
    updatedAt: iso(r.updated_at),
    createdAt: iso(r.created_at),
  };
}

function readUnderlay(raw: unknown): UnderlaySettings | null {
  const parsed = underlaySettingsSchema.safeParse(raw);
  return parsed.success ? parsed.data : null;
}

/** My roofs, most recently changed first (the newest `limit` of them when given). */
export async function listMyRoofs(user: SessionUser, limit?: number): Promise<RoofSummary[]> {
  const q = db()("roofs")
    .where({ owner_id: user.id })
    .whereNull("deleted_at")
    .orderBy("updated_at", "desc")
    .select("id", "name", "version", "shared", "updated_at", "created_at");
  if (limit !== undefined) q.limit(limit);
  return (await q).map(summary);
}

/** My newest roofs with their specs, for drawing a lesson figure from one (the lesson editor). */
export async function listMyRoofSpecs(
  user: SessionUser,
  limit = 30,
): Promise<{ id: string; name: string; spec: unknown }[]> {
  return db()("roofs")
    .where({ owner_id: user.id })
    .whereNull("deleted_at")
    .orderBy("updated_at", "desc")
    .limit(limit)
    .select("id", "name", "spec");
}

/** Roofs colleagues in my organisation have shared (read-only for me). */
export async function listSharedWithMe(user: SessionUser): Promise<SharedRoofSummary[]> {
  const rows = await db()("roofs as r")
    .join("users as u", "u.id", "r.owner_id")
    .where("u.organisation_id", user.organisationId)
    .andWhere("r.shared", true)
    .andWhereNot("r.owner_id", user.id)
    .whereNull("r.deleted_at")
    .orderBy("r.updated_at", "desc")
    .limit(200)
    .select(
      "r.id",
      "r.name",
      "r.version",
      "r.shared",
      "r.updated_at",
      "r.created_at",
      "u.name as owner_name",
      "u.email as owner_email",
    );
  return rows.map((r) => ({ ...summary(r), ownerName: r.owner_name || r.owner_email }));
}

/**
 * The roof if this user may see it: the owner always, a colleague in the same organisation when
 * it is shared. Anyone else gets null, which callers turn into 404 (never a hint it exists).
 * With `lock` (inside a transaction) the roof's row is locked FOR UPDATE until it ends.
 */
export async function getRoofFor(
  user: SessionUser,
  id: string,
  trx: Knex = db(),
  o: { lock?: boolean } = {},
): Promise<RoofDetail | null> {
  if (!isUuid(id)) return null;
  const q = trx("roofs as r")
    .join("users as u", "u.id", "r.owner_id")
    .where("r.id", id)
    .whereNull("r.deleted_at")
    .first(
      "r.id",
      "r.name",
      "r.version",
      "r.shared",
      "r.updated_at",
      "r.created_at",
      "r.owner_id",
      "r.spec",
      "r.underlay_id",
      "r.underlay",
      "u.name as owner_name",
      "u.email as owner_email",
      "u.organisation_id",
    );
  const r = await (o.lock ? q.forUpdate("r") : q);
  if (!r) return null;
  const isOwner = r.owner_id === user.id;
  if (!isOwner && !(r.shared && r.organisation_id === user.organisationId)) return null;
  return {
    ...summary(r),
    ownerId: r.owner_id,
    ownerName: r.owner_name || r.owner_email,
    spec: r.spec as RoofSpec,
    underlayId: r.underlay_id,
    underlay: readUnderlay(r.underlay),
    canEdit: isOwner,
  };
}

export const idempotencyKeySchema = z
  .string()
  .trim()
  .min(8)
  .max(100)
  .regex(/^[A-Za-z0-9_.:-]+$/);

export type CreatedRoof = { id: string; version: number; repeated?: boolean };
export type CreateRoofResult = CreatedRoof | { keyReused: string };
type NewRoof = { name: string; spec: RoofSpec; underlay?: UnderlaySettings | null };

/**
 * A new roof with its first version. With an idempotency key, a repeat of the same save (double
 * click, retried request) returns the roof the first one made instead of a second roof; the same
 * key with a different name, spec or underlay is refused (`keyReused`), never answered with the
 * first roof.
 */
export async function createRoof(user: SessionUser, input: NewRoof): Promise<CreatedRoof>;
export async function createRoof(
  user: SessionUser,
  input: NewRoof & { idempotencyKey: string | null | undefined },
): Promise<CreateRoofResult>;
export async function createRoof(
  user: SessionUser,
  input: NewRoof & { idempotencyKey?: string | null },
): Promise<CreateRoofResult> {
  const key = input.idempotencyKey ?? null;
  const hash =
    key === null ? null : requestHash({ name: input.name, spec: input.spec, underlay: input.underlay ?? null });
  return db().transaction(async (trx) => {
    const [roof] = await trx("roofs")
      .insert({
        owner_id: user.id,
        name: input.name,
        spec: JSON.stringify(input.spec),
        underlay: JSON.stringify(input.underlay ?? {}),
        idempotency_key: key,
        idempotency_hash: hash,
      })
      .onConflict(trx.raw("(owner_id, idempotency_key) where idempotency_key is not null"))
      .ignore()
      .returning(["id", "version"]);
    if (!roof) {
      const first = await trx("roofs")
        .where({ owner_id: user.id, idempotency_key: key })
        .first("id", "version", "idempotency_hash");
      if (!sameRequest(first!.idempotency_hash, hash!)) return { keyReused: key! };
      return { id: first!.id as string, version: first!.version as number, repeated: true };
    }
    await trx("roof_versions").insert({
      roof_id: roof.id,
      version: roof.version,
      name: input.name,
      spec: JSON.stringify(input.spec),
      saved_by: user.id,
      kind: "created",
    });
    return { id: roof.id as string, version: roof.version as number };
  });
}

/** Not visible → not-found; visible but not mine → forbidden; mine → the row, locked for this transaction. */
async function ownedForWrite(trx: Knex.Transaction, user: SessionUser, id: string) {
  const roof = await getRoofFor(user, id, trx, { lock: true });
  if (!roof) return { status: "not-found" as const };
  if (!roof.canEdit) return { status: "forbidden" as const };
  return { status: "ok" as const, roof };
}

/**
 * Saves a new name and/or spec if `version` is still the latest. The guarded update is the lock:
 * of two saves from the same version, PostgreSQL lets one through and the other matches 0 rows.
 * History stays useful and bounded: a save of the spec alone (an autosave) made by the same
 * person within AUTOSAVE_COALESCE_MINUTES of the previous autosave, with nothing saved between,
 * replaces that autosave's row instead of adding one. Created, named and restored versions are
 * always kept.
 */
export async function updateRoof(
  user: SessionUser,
  id: string,
  input: { name?: string; spec?: RoofSpec; version: number; kind?: VersionKind },
): Promise<UpdateResult> {
  if (!isUuid(id)) return { status: "not-found" };
  return db().transaction(async (trx) => {
    const changes: Record<string, unknown> = { version: trx.raw("version + 1"), updated_at: trx.fn.now() };
    if (input.name !== undefined) changes.name = input.name;
    if (input.spec !== undefined) changes.spec = JSON.stringify(input.spec);
    const [saved] = await trx("roofs")
      .where({ id, owner_id: user.id, version: input.version })
      .whereNull("deleted_at")
      .update(changes)
      .returning(["id", "version", "name", "spec"]);
    if (!saved) {
      const found = await ownedForWrite(trx, user, id);
      if (found.status !== "ok") return { status: found.status };
      return {
        status: "conflict",
        current: { version: found.roof.version, spec: found.roof.spec, name: found.roof.name },
      };
    }
    const kind: VersionKind = input.kind ?? (input.name !== undefined ? "named" : "auto");
    const row = { version: saved.version, name: saved.name, spec: JSON.stringify(saved.spec), saved_by: user.id, kind };
    if (kind === "auto") {
      const merged = await trx("roof_versions")
        .where({ roof_id: id, version: saved.version - 1, kind: "auto", saved_by: user.id })
        .andWhere("saved_at", ">", trx.raw(`now() - make_interval(mins => ?)`, [AUTOSAVE_COALESCE_MINUTES]))
        .update({ ...row, saved_at: trx.fn.now() });
      if (merged) return { status: "ok", id, version: saved.version as number };
    }
    await trx("roof_versions").insert({ roof_id: id, ...row });
    return { status: "ok", id, version: saved.version as number };
  });
}

type WriteStatus = "ok" | "not-found" | "forbidden";

export async function softDeleteRoof(user: SessionUser, id: string): Promise<WriteStatus> {
  if (!isUuid(id)) return "not-found";
  return db().transaction(async (trx) => {
    const found = await ownedForWrite(trx, user, id);
    if (found.status !== "ok") return found.status;
    await trx("roofs").where({ id }).update({ deleted_at: trx.fn.now() });
    return "ok";
  });
}

/** Undo of a delete: only the owner, only within the window. */
export async function restoreRoof(user: SessionUser, id: string): Promise<WriteStatus> {
  if (!isUuid(id)) return "not-found";
  const n = await db()("roofs")
    .where({ id, owner_id: user.id })
    .whereNotNull("deleted_at")
    .andWhere("deleted_at", ">", db().raw(`now() - make_interval(hours => ?)`, [RESTORE_WINDOW_HOURS]))
    .update({ deleted_at: null });
  return n ? "ok" : "not-found";
}

/** A copy in my library of any roof I can see (mine or shared with me). */
export async function duplicateRoof(
  user: SessionUser,
  id: string,
  name?: string,
): Promise<{ id: string; version: number } | null> {
  const roof = await getRoofFor(user, id);
  if (!roof) return null;
  const copyName = name ?? `${roof.name.slice(0, 112)} (copy)`;
  return createRoof(user, { name: copyName, spec: roof.spec, underlay: roof.underlay });
}

export async function setShared(user: SessionUser, id: string, shared: boolean): Promise<WriteStatus> {
  if (!isUuid(id)) return "not-found";
  return db().transaction(async (trx) => {
    const found = await ownedForWrite(trx, user, id);
    if (found.status !== "ok") return found.status;
    await trx("roofs").where({ id }).update({ shared });
    return "ok";
  });
}

export async function listVersions(roofId: string): Promise<RoofVersionRow[]> {
  const rows = await db()("roof_versions as v")
    .leftJoin("users as u", "u.id", "v.saved_by")
    .where("v.roof_id", roofId)
    .orderBy("v.version", "desc")
    .limit(HISTORY_LIMIT)
    .select("v.version", "v.name", "v.saved_at", "u.name as saved_by_name", "u.email as saved_by_email");
  return rows.map((r) => ({
    version: r.version,
    name: r.name,
    savedAt: iso(r.saved_at),
    savedBy: r.saved_by_name || r.saved_by_email || null,
  }));
}

/** Makes an old version the newest one (history is never rewritten). */
export async function restoreVersion(
  user: SessionUser,
  id: string,
  version: number,
  expectedVersion: number,
): Promise<UpdateResult> {
  if (!isUuid(id)) return { status: "not-found" };
  const old = await db()("roof_versions").where({ roof_id: id, version }).first("name", "spec");
  if (!old) return { status: "not-found" };
  return updateRoof(user, id, {
    name: old.name,
    spec: old.spec as RoofSpec,
    version: expectedVersion,
    kind: "restored",
  });
}

/** Underlay image and placement live beside the spec and do not bump its version. */
export async function setUnderlay(
  user: SessionUser,
  id: string,
  change: { uploadId?: string | null; settings: UnderlaySettings | null },
): Promise<WriteStatus> {
  if (!isUuid(id)) return "not-found";
  return db().transaction(async (trx) => {
    const found = await ownedForWrite(trx, user, id);
    if (found.status !== "ok") return found.status;
    const patch: Record<string, unknown> = { underlay: JSON.stringify(change.settings ?? {}) };
    if (change.uploadId !== undefined) patch.underlay_id = change.uploadId;
    await trx("roofs").where({ id }).update(patch);
    return "ok";
  });
}

export async function recordUpload(
  trx: Knex,
  row: { ownerId: string; storageKey: string; contentType: string; size: number; originalName: string },
): Promise<string> {
  const [u] = await trx("uploads")
    .insert({
      owner_id: row.ownerId,
      storage_key: row.storageKey,
      content_type: row.contentType,
      size: row.size,
      original_name: row.originalName.slice(0, 200),
    })
    .returning("id");
  return u.id as string;
}

export async function getUpload(id: string): Promise<{ storageKey: string; contentType: string; size: number } | null> {
  if (!isUuid(id)) return null;
  const u = await db()("uploads").where({ id }).first("storage_key", "content_type", "size");
  return u ? { storageKey: u.storage_key, contentType: u.content_type, size: u.size } : null;
}
