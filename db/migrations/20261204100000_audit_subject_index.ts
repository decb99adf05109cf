import type { Knex } from "knex";

/**
 * The admin users list asks, for each user, for their last sign-in (`subject_id`, `action`,
 * max `at`), and sign-in asks whether an account signed in from an address before. With only
 * the index on `at` both scanned the whole log; this one answers each from the index's end.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`create index if not exists audit_log_subject_action_at on audit_log (subject_id, action, at desc)`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`drop index if exists audit_log_subject_action_at`);
}
