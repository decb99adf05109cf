import type { Knex } from "knex";

/** The whole initial schema: accounts, sessions, audit, rate limits, roofs, lessons, classes. */
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`create extension if not exists pgcrypto`);

  await knex.schema.createTable("organisations", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.text("name").notNullable();
    t.boolean("open_designer_signup").notNullable().defaultTo(false);
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });

  await knex.schema.createTable("users", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("organisation_id").notNullable().references("organisations.id");
    t.text("email").notNullable();
    t.text("name").notNullable().defaultTo("");
    t.text("role").notNullable().checkIn(["admin", "trainer", "trainee", "designer"]);
    t.text("password_hash");
    t.boolean("active").notNullable().defaultTo(true);
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("password_changed_at", { useTz: true });
  });
  await knex.raw(`create unique index users_email_lower on users (lower(email))`);

  await knex.schema.createTable("sessions", (t) => {
    t.text("id").primary(); // sha-256 of the random cookie value
    t.uuid("user_id").notNullable().references("users.id").onDelete("CASCADE");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("last_seen_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("expires_at", { useTz: true }).notNullable();
    t.text("user_agent");
    t.index(["user_id"]);
  });

  await knex.schema.createTable("tokens", (t) => {
    t.text("hash").primary(); // sha-256 of the token sent by e-mail
    t.text("kind").notNullable().checkIn(["invitation", "reset"]);
    t.uuid("user_id").references("users.id").onDelete("CASCADE");
    t.text("email").notNullable();
    t.text("role");
    t.uuid("class_id");
    t.uuid("created_by").references("users.id");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("expires_at", { useTz: true }).notNullable();
    t.timestamp("used_at", { useTz: true });
    t.index(["email"]);
  });

  await knex.schema.createTable("rate_limits", (t) => {
    t.text("key").notNullable();
    t.timestamp("window_start", { useTz: true }).notNullable();
    t.integer("count").notNullable().defaultTo(0);
    t.primary(["key", "window_start"]);
  });

  await knex.schema.createTable("audit_log", (t) => {
    t.bigIncrements("id");
    t.uuid("actor_id").references("users.id").onDelete("SET NULL");
    t.uuid("subject_id").references("users.id").onDelete("SET NULL");
    t.text("action").notNullable();
    t.jsonb("detail").notNullable().defaultTo("{}");
    t.text("ip");
    t.timestamp("at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(["at"]);
  });

  await knex.schema.createTable("uploads", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("owner_id").notNullable().references("users.id").onDelete("CASCADE");
    t.text("storage_key").notNullable().unique();
    t.text("content_type").notNullable();
    t.integer("size").notNullable();
    t.text("original_name").notNullable().defaultTo("");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });

  await knex.schema.createTable("roofs", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("owner_id").notNullable().references("users.id").onDelete("CASCADE");
    t.text("name").notNullable();
    t.jsonb("spec").notNullable();
    t.integer("version").notNullable().defaultTo(1);
    t.boolean("shared").notNullable().defaultTo(false);
    t.uuid("underlay_id").references("uploads.id").onDelete("SET NULL");
    t.jsonb("underlay").notNullable().defaultTo("{}"); // placement, scale, opacity
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("updated_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp("deleted_at", { useTz: true });
    t.index(["owner_id"]);
  });

  await knex.schema.createTable("roof_versions", (t) => {
    t.uuid("roof_id").notNullable().references("roofs.id").onDelete("CASCADE");
    t.integer("version").notNullable();
    t.text("name").notNullable();
    t.jsonb("spec").notNullable();
    t.uuid("saved_by").references("users.id").onDelete("SET NULL");
    t.timestamp("saved_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(["roof_id", "version"]);
  });

  await knex.schema.createTable("lessons", (t) => {
    t.text("slug").primary();
    t.text("title").notNullable();
    t.integer("position").notNullable();
    t.text("version").notNullable(); // content hash
    t.jsonb("content").notNullable();
    t.timestamp("synced_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });

  await knex.schema.createTable("lesson_versions", (t) => {
    t.text("slug").notNullable();
    t.text("version").notNullable();
    t.jsonb("content").notNullable();
    t.timestamp("first_seen_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(["slug", "version"]);
  });

  await knex.schema.createTable("classes", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("organisation_id").notNullable().references("organisations.id");
    t.uuid("trainer_id").notNullable().references("users.id");
    t.text("name").notNullable();
    t.date("starts_on");
    t.date("ends_on");
    t.text("venue").notNullable().defaultTo("");
    t.jsonb("live_state"); // classroom mode: what the trainer presents
    t.integer("live_seq").notNullable().defaultTo(0);
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });

  await knex.schema.createTable("class_members", (t) => {
    t.uuid("class_id").notNullable().references("classes.id").onDelete("CASCADE");
    t.uuid("user_id").notNullable().references("users.id").onDelete("CASCADE");
    t.timestamp("joined_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(["class_id", "user_id"]);
  });

  await knex.schema.createTable("assignments", (t) => {
    t.uuid("class_id").notNullable().references("classes.id").onDelete("CASCADE");
    t.text("lesson_slug").notNullable().references("lessons.slug");
    t.date("due_on");
    t.timestamp("created_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(["class_id", "lesson_slug"]);
  });

  await knex.schema.createTable("attempts", (t) => {
    t.uuid("id").primary().defaultTo(knex.raw("gen_random_uuid()"));
    t.uuid("trainee_id").notNullable().references("users.id").onDelete("CASCADE");
    t.text("lesson_slug").notNullable().references("lessons.slug");
    t.text("lesson_version").notNullable();
    t.text("idempotency_key").notNullable();
    t.jsonb("spec");
    t.jsonb("answers").notNullable().defaultTo("{}");
    t.jsonb("results").notNullable(); // per question / criterion: score, passed, feedback
    t.float("score").notNullable();
    t.boolean("passed").notNullable();
    t.integer("time_spent_s").notNullable().defaultTo(0);
    t.timestamp("submitted_at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(["trainee_id", "idempotency_key"]);
    t.index(["lesson_slug", "trainee_id"]);
  });

  await knex.schema.createTable("attempt_reviews", (t) => {
    t.bigIncrements("id");
    t.uuid("attempt_id").notNullable().references("attempts.id").onDelete("CASCADE");
    t.uuid("reviewer_id").notNullable().references("users.id");
    t.text("comment").notNullable().defaultTo("");
    t.float("override_score");
    t.boolean("override_passed");
    t.text("reason");
    t.timestamp("at", { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(["attempt_id"]);
  });
}

export async function down(knex: Knex): Promise<void> {
  for (const table of [
    "attempt_reviews",
    "attempts",
    "assignments",
    "class_members",
    "classes",
    "lesson_versions",
    "lessons",
    "roof_versions",
    "roofs",
    "uploads",
    "audit_log",
    "rate_limits",
    "tokens",
    "sessions",
    "users",
    "organisations",
  ]) {
    await knex.schema.dropTableIfExists(table);
  }
}
