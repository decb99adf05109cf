/**
 * Read-only share links: the owner of a roof makes a link (an unguessable token, 256 bits from the
 * CSPRNG; only its SHA-256 is stored) that shows the roof, its figures and its downloads to
 * anyone who has it, without signing in, until the owner revokes it (docs/security.md).
 */
import { db } from "~/lib/db.server";
import type { SessionUser } from "~/lib/auth.server";
import { isUuid } from "~/lib/roofs.server";
import { randomToken, sha256 } from "~/lib/tokens.server";

export interface ShareLinkRow {
  id: string;
  createdAt: string;
}

/** Most active links a roof may have at once (a handful is plenty; the cap keeps a loop from filling the table). */
export const MAX_LINKS_PER_ROOF = 20;

/** A token has this form; anything else is not looked up at all. */
const TOKEN = /^[A-Za-z0-9_-]{43}$/;

async function ownsRoof(user: SessionUser, roofId: string): Promise<"ok" | "forbidden" | "not-found"> {
  if (!isUuid(roofId)) return "not-found";
  const roof = await db()("roofs").where({ id: roofId }).whereNull("deleted_at").first("owner_id");
  if (!roof) return "not-found";
  return roof.owner_id === user.id ? "ok" : "forbidden";
}

/** A new link for the owner's roof; the token is returned once and never again. */
export async function createShareLink(
  user: SessionUser,
  roofId: string,
): Promise<{ status: "ok"; token: string; id: string } | { status: "forbidden" | "not-found" | "too-many" }> {
  const owns = await ownsRoof(user, roofId);
  if (owns !== "ok") return { status: owns };
  const active = await db()("share_links")
    .where({ roof_id: roofId })
    .whereNull("revoked_at")
    .count<{ count: string }[]>("id as count");
  if (Number(active[0].count) >= MAX_LINKS_PER_ROOF) return { status: "too-many" };
  const token = randomToken();
  const [row] = await db()("share_links")
    .insert({ roof_id: roofId, token_hash: sha256(token), created_by: user.id })
    .returning("id");
  return { status: "ok", token, id: row.id };
}

/** Revokes one of the owner's links (already revoked: nothing changes). */
export async function revokeShareLink(
  user: SessionUser,
  roofId: string,
  linkId: string,
): Promise<"ok" | "forbidden" | "not-found"> {
  const owns = await ownsRoof(user, roofId);
  if (owns !== "ok") return owns;
  if (!isUuid(linkId)) return "not-found";
  const n = await db()("share_links")
    .where({ id: linkId, roof_id: roofId })
    .update({ revoked_at: db().raw("coalesce(revoked_at, now())") });
  return n ? "ok" : "not-found";
}

/** The roof's links that still work, newest first. */
export async function listShareLinks(roofId: string): Promise<ShareLinkRow[]> {
  const rows = await db()("share_links")
    .where({ roof_id: roofId })
    .whereNull("revoked_at")
    .orderBy("created_at", "desc")
    .select("id", "created_at");
  return rows.map((r) => ({ id: r.id, createdAt: new Date(r.created_at).toISOString() }));
}

/** The roof behind a working link, or null (unknown, revoked, or the roof deleted). */
export async function findSharedRoof(token: string): Promise<{ name: string; spec: unknown } | null> {
  if (!TOKEN.test(token)) return null;
  const row = await db()("share_links as l")
    .join("roofs as r", "r.id", "l.roof_id")
    .where("l.token_hash", sha256(token))
    .whereNull("l.revoked_at")
    .whereNull("r.deleted_at")
    .first("r.name", "r.spec");
  return row ? { name: row.name, spec: row.spec } : null;
}
