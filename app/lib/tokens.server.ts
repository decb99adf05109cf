import { createHash, randomBytes } from "node:crypto";
import type { Role } from "~/lib/permissions";
import type { Knex } from "knex";
import { db } from "~/lib/db.server";

/** 256 bits from the CSPRNG, URL-safe: for session cookies and e-mailed links. */
export function randomToken(): string {
  return randomBytes(32).toString("base64url");
}

/** What the database keeps instead of a secret: a leaked table cannot be replayed as cookies or links. */
export function sha256(value: string): string {
  return createHash("sha256").update(value, "utf8").digest("hex");
}

export type TokenKind = "invitation" | "reset";

export interface TokenRow {
  hash: string;
  kind: TokenKind;
  user_id: string | null;
  email: string;
  role: Role | null;
  class_id: string | null;
  created_by: string | null;
  expires_at: Date;
  used_at: Date | null;
}

/** Stores the hash of a new single-use token and returns the token itself (it goes only into the e-mail). */
export async function issueToken(
  t: {
    kind: TokenKind;
    email: string;
    userId: string;
    role?: Role | null;
    classId?: string | null;
    createdBy?: string | null;
    ttlSeconds: number;
  },
  trx: Knex | Knex.Transaction = db(),
): Promise<string> {
  const token = randomToken();
  await trx("tokens").insert({
    hash: sha256(token),
    kind: t.kind,
    email: t.email,
    user_id: t.userId,
    role: t.role ?? null,
    class_id: t.classId ?? null,
    created_by: t.createdBy ?? null,
    expires_at: trx.raw("now() + make_interval(secs => ?)", [t.ttlSeconds]),
  });
  return token;
}

export type TokenState = { state: "valid"; row: TokenRow } | { state: "used" | "expired" | "unknown" };

/** Looks a token up without using it (to show the form behind an e-mailed link). */
export async function peekToken(kind: TokenKind, token: string): Promise<TokenState> {
  if (!/^[A-Za-z0-9_-]{20,100}$/.test(token)) return { state: "unknown" };
  const row = await db()("tokens")
    .where({ hash: sha256(token), kind })
    .first<(TokenRow & { expired: boolean }) | undefined>("*", db().raw("expires_at <= now() as expired"));
  if (!row) return { state: "unknown" };
  if (row.used_at) return { state: "used" };
  if (row.expired) return { state: "expired" };
  return { state: "valid", row };
}

/** Marks a token used if it is still valid, atomically: two racing requests cannot both use it. */
export async function consumeToken(
  kind: TokenKind,
  token: string,
  trx: Knex | Knex.Transaction,
): Promise<TokenRow | null> {
  if (!/^[A-Za-z0-9_-]{20,100}$/.test(token)) return null;
  const [row] = await trx("tokens")
    .where({ hash: sha256(token), kind })
    .whereNull("used_at")
    .andWhere("expires_at", ">", trx.fn.now())
    .update({ used_at: trx.fn.now() })
    .returning("*");
  return (row as TokenRow | undefined) ?? null;
}
