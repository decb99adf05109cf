import type { Knex } from "knex";

/**
 * Courses (an ordered set of lessons an organisation's trainers put together), the course a class
 * follows, and the certificates a trainee earns by passing every lesson of one
 * (docs/data-model.md, docs/product.md). A certificate's verification code is random and unique
 * (docs/security.md, "Certificates").
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable("courses", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("organisation_id").notNullable().references("organisations.id");
    t.text("name").notNullable();
    t.text("description").notNullable().defaultTo("");
    t.uuid("created_by").references("users.id").onDelete("SET NULL");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("updated_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(["organisation_id", "name"]);
  });
  await knex.raw(
    "ALTER TABLE courses ADD CONSTRAINT courses_text_check CHECK (char_length(name) BETWEEN 1 AND 120 AND char_length(description) <= 2000)",
  );

  await knex.schema.createTable("course_lessons", (t) => {
    t.uuid("course_id").notNullable().references("courses.id").onDelete("CASCADE");
    t.text("lesson_slug").notNullable().references("lessons.slug").onDelete("CASCADE");
    t.integer("position").notNullable();
    t.primary(["course_id", "lesson_slug"]);
    t.index(["course_id", "position"]);
  });

  await knex.schema.alterTable("classes", (t) => {
    t.uuid("course_id").references("courses.id").onDelete("SET NULL");
    t.index(["course_id"]);
  });

  await knex.schema.createTable("certificates", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("trainee_id").notNullable().references("users.id").onDelete("CASCADE");
    t.uuid("course_id").notNullable().references("courses.id").onDelete("CASCADE");
    t.uuid("organisation_id").notNullable().references("organisations.id");
    t.timestamp("issued_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.text("code").notNullable().unique();
    t.timestamp("revoked_at", { useTz: true });
    t.uuid("revoked_by").references("users.id").onDelete("SET NULL");
    t.text("revoke_reason");
    t.unique(["trainee_id", "course_id"]);
  });
  await knex.raw(
    "ALTER TABLE certificates ADD CONSTRAINT certificates_revoked_check CHECK ((revoked_at IS NULL) = (revoke_reason IS NULL))",
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable("certificates");
  await knex.schema.alterTable("classes", (t) => {
    t.dropColumn("course_id");
  });
  await knex.schema.dropTable("course_lessons");
  await knex.schema.dropTable("courses");
}
