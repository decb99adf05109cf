/** The audit log: who did what to which account, from where. Read on /admin/audit. */
import type { Knex } from "knex";
import { db } from "~/lib/db.server";
import type { AuditAction } from "~/lib/audit-actions";

export { AUDIT_ACTIONS, type AuditAction } from "~/lib/audit-actions";

export interface AuditEntry {
  action: AuditAction;
  actorId?: string | null;
  subjectId?: string | null;
  detail?: Record<string, unknown>;
  ip?: string | null;
}

/** Writes one entry; pass `trx` to keep it in the same transaction as the change it records. */
export async function audit(entry: AuditEntry, trx: Knex | Knex.Transaction = db()): Promise<void> {
  await trx("audit_log").insert({
    action: entry.action,
    actor_id: entry.actorId ?? null,
    subject_id: entry.subjectId ?? null,
    detail: JSON.stringify(entry.detail ?? {}),
    ip: entry.ip ?? null,
  });
}

export interface AuditRow {
  id: string;
  action: AuditAction;
  at: string;
  ip: string | null;
  detail: Record<string, unknown>;
  actorEmail: string | null;
  subjectEmail: string | null;
}

/** Newest first, `limit` entries older than `before` (an id), optionally one action only. */
export async function listAudit(opts: {
  organisationId: string;
  before?: number;
  action?: AuditAction;
  limit?: number;
}): Promise<AuditRow[]> {
  const k = db();
  const q = k("audit_log as a")
    .leftJoin("users as actor", "actor.id", "a.actor_id")
    .leftJoin("users as subject", "subject.id", "a.subject_id")
    // Entries about nobody in particular (an unknown e-mail) have neither; they show to every admin.
    .where((w) =>
      w
        .where("actor.organisation_id", opts.organisationId)
        .orWhere("subject.organisation_id", opts.organisationId)
        .orWhere((n) => n.whereNull("a.actor_id").whereNull("a.subject_id")),
    )
    .orderBy("a.id", "desc")
    .limit(opts.limit ?? 100)
    .select(
      "a.id",
      "a.action",
      k.raw(`to_char(a.at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS"Z"') as at`),
      "a.ip",
      "a.detail",
      "actor.email as actorEmail",
      "subject.email as subjectEmail",
    );
  if (opts.before) q.where("a.id", "<", opts.before);
  if (opts.action) q.where("a.action", opts.action);
  const rows = await q;
  return rows.map((r) => ({ ...r, id: String(r.id) }));
}
