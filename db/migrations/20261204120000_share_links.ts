import type { Knex } from "knex";

/**
 * Read-only links to a roof for someone without an account (a client, a builder): the link's
 * token is never stored, only its SHA-256; revoking keeps the row (who shared what, and when).
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("share_links", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("roof_id").notNullable().references("roofs.id").onDelete("CASCADE");
    t.text("token_hash").notNullable().unique();
    t.uuid("created_by").references("users.id").onDelete("SET NULL");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("revoked_at", { useTz: true });
    t.index(["roof_id"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists("share_links");
}
