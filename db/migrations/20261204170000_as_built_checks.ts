import type { Knex } from "knex";

/**
 * As-built checks kept with their roof (docs/as-built.md, "Saved checks"): who measured, who
 * checked, the day, the points, the tolerances, the design as it was checked, and the result.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("as_built_checks", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("roof_id").notNullable().references("roofs.id").onDelete("CASCADE");
    t.integer("roof_version").notNullable();
    t.jsonb("spec").notNullable();
    t.text("measured_by").notNullable();
    t.text("checked_by").notNullable();
    t.date("measured_on").notNullable();
    t.jsonb("points").notNullable();
    t.jsonb("tolerance").notNullable();
    t.boolean("passed").notNullable();
    t.jsonb("result").notNullable();
    t.text("source").notNullable().checkIn(["form", "csv"], "as_built_checks_source_check");
    t.uuid("created_by").references("users.id").onDelete("SET NULL");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(["roof_id", "created_at"]);
  });
  await knex.raw(
    "ALTER TABLE as_built_checks ADD CONSTRAINT as_built_checks_names_check CHECK (char_length(measured_by) BETWEEN 1 AND 120 AND char_length(checked_by) BETWEEN 1 AND 120)",
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("as_built_checks");
}
