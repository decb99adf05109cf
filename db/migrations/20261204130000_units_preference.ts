import type { Knex } from "knex";

/** A person's units: metric, US customary, or null to follow each roof's rule set. Roofs stay in metres. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("users", (t) => {
    t.text("units").nullable().checkIn(["metric", "us"], "users_units_check");
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("users", (t) => {
    t.dropChecks(["users_units_check"]);
    t.dropColumn("units");
  });
}
