import type { Knex } from "knex";

/**
 * What made each saved version: `created`, `auto` (an autosave of the spec), `named` (a save
 * that set the name) or `restored`. Autosaves by one person within a few minutes of each other
 * are coalesced into one `auto` row (app/lib/roofs.server.ts); the others are always kept.
 * Rows from before this migration are `kept` and never coalesced.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("roof_versions", (t) => {
    t.text("kind").notNullable().defaultTo("kept");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("roof_versions", (t) => {
    t.dropColumn("kind");
  });
}
