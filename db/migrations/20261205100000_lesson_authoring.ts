import type { Knex } from "knex";

/**
 * Lessons written in the app (docs/data-model.md, "lessons"; docs/authoring.md): a lesson row
 * gains its owner organisation (null: a built-in lesson read from `lessons/*.md`), a status
 * (draft lessons are seen by their organisation's trainers and admins only), its author and
 * timestamps, and the lesson file's text for lessons written in the app. Every version keeps who
 * made it and a number a person can read (v1, v2, ...), numbered per lesson in the order seen.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable("lessons", (t) => {
    t.uuid("organisation_id").nullable().references("organisations.id");
    t.text("status").notNullable().defaultTo("published");
    t.uuid("author_id").nullable().references("users.id").onDelete("SET NULL");
    t.text("source").nullable();
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("updated_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(["organisation_id"]);
  });
  await knex.raw(`alter table lessons add constraint lessons_status_check check (status in ('draft', 'published'))`);
  await knex.raw(
    `alter table lessons add constraint lessons_builtin_published_check check (organisation_id is not null or status = 'published')`,
  );
  await knex.schema.alterTable("lesson_versions", (t) => {
    t.integer("number").nullable();
    t.uuid("created_by").nullable().references("users.id").onDelete("SET NULL");
    t.text("source").nullable();
  });
  await knex.raw(`
    update lesson_versions v set number = n.rn
    from (select slug, version, row_number() over (partition by slug order by first_seen_at, version) as rn
          from lesson_versions) n
    where v.slug = n.slug and v.version = n.version`);
  await knex.raw(`alter table lesson_versions alter column number set not null`);
  await knex.schema.alterTable("lesson_versions", (t) => {
    t.unique(["slug", "number"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable("lesson_versions", (t) => {
    t.dropUnique(["slug", "number"]);
    t.dropColumn("number");
    t.dropColumn("created_by");
    t.dropColumn("source");
  });
  await knex.raw(`alter table lessons drop constraint lessons_builtin_published_check`);
  await knex.raw(`alter table lessons drop constraint lessons_status_check`);
  await knex.schema.alterTable("lessons", (t) => {
    t.dropIndex(["organisation_id"]);
    t.dropColumn("organisation_id");
    t.dropColumn("status");
    t.dropColumn("author_id");
    t.dropColumn("source");
    t.dropColumn("created_at");
    t.dropColumn("updated_at");
  });
}
