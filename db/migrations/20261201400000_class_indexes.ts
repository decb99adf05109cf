import type { Knex } from "knex";

/** Lookups the class pages make on every visit: my classes, a class's pending invitations, a trainee's attempts. */
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`create index if not exists classes_trainer on classes (trainer_id)`);
  await knex.raw(`create index if not exists class_members_user on class_members (user_id)`);
  await knex.raw(`create index if not exists tokens_pending_class on tokens (class_id) where used_at is null`);
  await knex.raw(`create index if not exists attempts_trainee_lesson on attempts (trainee_id, lesson_slug)`);
  await knex.raw(`create index if not exists attempt_reviews_attempt_at on attempt_reviews (attempt_id, at desc)`);
}

export async function down(knex: Knex): Promise<void> {
  for (const name of [
    "attempt_reviews_attempt_at",
    "attempts_trainee_lesson",
    "tokens_pending_class",
    "class_members_user",
    "classes_trainer",
  ]) {
    await knex.raw(`drop index if exists ${name}`);
  }
}
