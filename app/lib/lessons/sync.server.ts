import type { Knex } from "knex";
import type { Lesson } from "./schema";

/**
 * Writes the lessons into the database: every content hash once in `lesson_versions` (attempts keep
 * the version they were graded on), the current one in `lessons`. Idempotent; safe when two
 * processes sync at once. Lessons whose file was removed keep their rows for old attempts.
 */
export async function syncLessons(knex: Knex, lessons: Lesson[]): Promise<{ changed: string[] }> {
  const changed: string[] = [];
  await knex.transaction(async (trx) => {
    for (const l of lessons) {
      const content = JSON.stringify(l);
      await trx("lesson_versions")
        .insert({ slug: l.slug, version: l.version, content, number: nextVersionNumber(trx, l.slug) })
        .onConflict(["slug", "version"])
        .ignore();
      const rows = await trx("lessons")
        .insert({ slug: l.slug, title: l.title, position: l.position, version: l.version, content })
        .onConflict("slug")
        .merge({ title: l.title, position: l.position, version: l.version, content, synced_at: trx.fn.now() })
        // A lesson written in the app never takes a built-in file's changes (authoring.server.ts keeps slugs apart).
        .where("lessons.organisation_id", null)
        .andWhere((w) => w.where("lessons.version", "<>", l.version).orWhere("lessons.position", "<>", l.position))
        .returning("slug");
      if (rows.length) changed.push(l.slug);
    }
  });
  return { changed };
}

/** The next readable version number (v1, v2, ...) of a lesson, as a subquery for an insert. */
export function nextVersionNumber(knex: Knex, slug: string): Knex.Raw {
  return knex.raw("(select coalesce(max(number), 0) + 1 from lesson_versions where slug = ?)", [slug]);
}

/** A stored version of a lesson (for grading an attempt made on a page opened before an update). */
export async function lessonVersion(knex: Knex, slug: string, version: string): Promise<Lesson | null> {
  const row = await knex("lesson_versions").where({ slug, version }).first("content");
  return row ? (row.content as Lesson) : null;
}
