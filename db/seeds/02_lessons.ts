/**
 * Copies the course in lessons/ into the database (`lessons`, and every content hash into
 * `lesson_versions`). Idempotent: an unchanged lesson changes nothing. The app also does this at
 * start-up; seeding it first lets attempts (03_attempts.ts) refer to the lessons.
 */
import path from "node:path";
import type { Knex } from "knex";
import { loadLessons } from "../../app/lib/lessons/load.server.ts";
import { syncLessons } from "../../app/lib/lessons/sync.server.ts";

export function courseDir(): string {
  return process.env.LESSONS_DIR ?? path.resolve(import.meta.dirname, "../../lessons");
}

export async function seed(knex: Knex): Promise<void> {
  await syncLessons(knex, loadLessons(courseDir()));
}
