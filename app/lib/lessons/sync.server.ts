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
        .insert({ slug: l.slug, version: l.version, content })
        .onConflict(["slug", "version"])
        .ignore();
      const rows = await trx("lessons")
        .insert({ slug: l.slug, title: l.title, position: l.position, version: l.version, content })
        .onConflict("slug")
        .merge({ title: l.title, position: l.position, version: l.version, content, synced_at: trx.fn.now() })
        .where("lessons.version", "<>", l.version)
        .orWhere("lessons.position", "<>", l.position)
        .returning("slug");
      if (rows.length) changed.push(l.slug);
    }
  });
  return { changed };
}

/** A stored version of a lesson (for grading an attempt made on a page opened before an update). */
export async function lessonVersion(knex: Knex, slug: string, version: string): Promise<Lesson | null> {
  const row = await knex("lesson_versions").where({ slug, version }).first("content");
  return row ? (row.content as Lesson) : null;
}
