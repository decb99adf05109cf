import type { Knex } from "knex";

/**
 * What a keyed request asked for (a SHA-256 of its canonical JSON), so the same key sent again
 * with a different body is refused (422) instead of silently answering with the first result.
 * Rows from before have none, and a repeat of them is taken as it comes.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("roofs", (t) => {
    t.text("idempotency_hash");
  });
  await knex.schema.alterTable("attempts", (t) => {
    t.text("idempotency_hash");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("attempts", (t) => {
    t.dropColumn("idempotency_hash");
  });
  await knex.schema.alterTable("roofs", (t) => {
    t.dropColumn("idempotency_hash");
  });
}
