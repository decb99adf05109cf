/**
 * Courses demo data: the spring trainer's organisation gets a first course of five lessons, so a
 * trainer trying the app finds one to open, reorder or set a class to follow. No class follows it
 * (following assigns lessons, which the classes demo sets by hand). Idempotent; skips lessons that
 * are not there.
 */
import type { Knex } from "knex";

const COURSE = {
  owner: "trainer@tidemark.example",
  name: "Parapet roofs: the foundation course",
  description: "Reading falls, why water stands, outlets, shaping a roof to its outlet and the longest fall line.",
  lessons: [
    "reading-falls",
    "why-water-stands",
    "outlets-and-overflows",
    "shaping-to-an-outlet",
    "the-longest-fall-line",
  ],
};

export async function seed(knex: Knex): Promise<void> {
  const owner = await knex("users").whereRaw("lower(email) = ?", [COURSE.owner]).first("id", "organisation_id");
  if (!owner) return;
  const existing = await knex("courses")
    .where({ organisation_id: owner.organisation_id, name: COURSE.name })
    .first("id");
  if (existing) return;
  const known = new Set<string>(await knex("lessons").whereIn("slug", COURSE.lessons).pluck("slug"));
  await knex.transaction(async (trx) => {
    const [course] = await trx("courses")
      .insert({
        organisation_id: owner.organisation_id,
        name: COURSE.name,
        description: COURSE.description,
        created_by: owner.id,
      })
      .returning("id");
    const rows = COURSE.lessons
      .filter((slug) => known.has(slug))
      .map((lesson_slug, i) => ({ course_id: course.id, lesson_slug, position: i + 1 }));
    if (rows.length) await trx("course_lessons").insert(rows);
  });
}
