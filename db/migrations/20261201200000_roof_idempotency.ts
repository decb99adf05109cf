import type { Knex } from "knex";

/** A save carries a key from the client so a double-click or a retried request makes one roof. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("roofs", (t) => {
    t.text("idempotency_key");
  });
  await knex.raw(
    `create unique index roofs_owner_idempotency on roofs (owner_id, idempotency_key) where idempotency_key is not null`,
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`drop index if exists roofs_owner_idempotency`);
  await knex.schema.alterTable("roofs", (t) => {
    t.dropColumn("idempotency_key");
  });
}
