import type { Knex } from "knex";

/**
 * Classroom mode, both directions (docs/decisions/0006-live-feed-over-listen-notify.md):
 * `live_phase` says whether the class's live session is live, paused or ended (idle: never
 * presented), and `class_hand_ups` holds the roofs trainees send to the trainer during a session,
 * one per trainee and class (a second hand-up replaces the first). `wall_seq` counts changes to
 * the wall, as `live_seq` counts changes to the presented roof.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("classes", (t) => {
    t.text("live_phase").notNullable().defaultTo("idle");
    t.integer("wall_seq").notNullable().defaultTo(0);
  });
  await knex.raw(
    `alter table classes add constraint classes_live_phase_check check (live_phase in ('idle', 'live', 'paused', 'ended'))`,
  );
  // A class that was presenting before this migration is live.
  await knex.raw(`update classes set live_phase = 'live' where live_state is not null`);
  await knex.schema.createTable("class_hand_ups", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("class_id").notNullable().references("classes.id").onDelete("CASCADE");
    t.uuid("user_id").notNullable().references("users.id").onDelete("CASCADE");
    t.text("title").notNullable().defaultTo("");
    t.jsonb("spec").notNullable();
    t.jsonb("figures").notNullable();
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(["class_id", "user_id"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists("class_hand_ups");
  await knex.raw(`alter table classes drop constraint if exists classes_live_phase_check`);
  await knex.schema.alterTable("classes", (t) => {
    t.dropColumn("live_phase");
    t.dropColumn("wall_seq");
  });
}
