/**
 * Classes demo data: the spring cohort's assigned lessons with due dates, a second (autumn)
 * cohort run by the other trainer (nobody invited yet), and one trainer's comment on a demo attempt. Idempotent; runs
 * after 02_lessons.ts has synced the course and skips any lesson that is not there.
 */
import type { Knex } from "knex";

const SPRING = { trainer: "trainer@tidemark.example", name: "Parapet roofs, spring cohort" };
const SPRING_ASSIGNMENTS = [
  { slug: "reading-falls", due: "2027-03-01" },
  { slug: "why-water-stands", due: "2027-03-02" },
  { slug: "outlets-and-overflows", due: "2027-03-03" },
  { slug: "shaping-to-an-outlet", due: "2027-03-04" },
  { slug: "the-longest-fall-line", due: "2027-03-05" },
];
const AUTUMN = {
  trainer: "trainer2@tidemark.example",
  name: "Parapet roofs, autumn cohort",
  starts_on: "2027-09-13",
  ends_on: "2027-09-17",
  venue: "Quayside annexe, room 3",
  assignments: [{ slug: "reading-falls", due: "2027-09-13" }],
};

async function userId(knex: Knex, email: string): Promise<string | null> {
  return (await knex("users").whereRaw("lower(email) = ?", [email]).first("id"))?.id ?? null;
}

async function assign(knex: Knex, classId: string, items: { slug: string; due: string }[]) {
  const known = new Set<string>(
    await knex("lessons")
      .whereIn(
        "slug",
        items.map((i) => i.slug),
      )
      .pluck("slug"),
  );
  for (const i of items.filter((x) => known.has(x.slug))) {
    await knex("assignments")
      .insert({ class_id: classId, lesson_slug: i.slug, due_on: i.due })
      .onConflict(["class_id", "lesson_slug"])
      .ignore();
  }
}

export async function seed(knex: Knex): Promise<void> {
  const springTrainer = await userId(knex, SPRING.trainer);
  const spring = springTrainer
    ? await knex("classes").where({ trainer_id: springTrainer, name: SPRING.name }).first("id", "organisation_id")
    : null;
  if (!spring) return;
  await assign(knex, spring.id, SPRING_ASSIGNMENTS);

  const autumnTrainer = await userId(knex, AUTUMN.trainer);
  if (autumnTrainer) {
    let autumn = await knex("classes").where({ trainer_id: autumnTrainer, name: AUTUMN.name }).first("id");
    if (!autumn) {
      [autumn] = await knex("classes")
        .insert({
          organisation_id: spring.organisation_id,
          trainer_id: autumnTrainer,
          name: AUTUMN.name,
          starts_on: AUTUMN.starts_on,
          ends_on: AUTUMN.ends_on,
          venue: AUTUMN.venue,
        })
        .returning("id");
    }
    await assign(knex, autumn!.id, AUTUMN.assignments);
  }

  // Tess's first go at lesson 2 (03_attempts.ts) gets a comment from her trainer.
  const tess = await userId(knex, "trainee@tidemark.example");
  const attempt = tess
    ? await knex("attempts").where({ trainee_id: tess, idempotency_key: "demo-tess-02-a" }).first("id")
    : null;
  if (
    attempt &&
    springTrainer &&
    !(await knex("attempt_reviews").where({ attempt_id: attempt.id, reviewer_id: springTrainer }).first("id"))
  ) {
    await knex("attempt_reviews").insert({
      attempt_id: attempt.id,
      reviewer_id: springTrainer,
      comment:
        "Good start on the quiz. On the roof, look at where the water stands before you change the fall: the outlet is the problem, not the slope.",
      at: new Date("2027-03-02T09:55:00Z"),
    });
  }
}
