import type { Knex } from "knex";
import { db } from "../db.server";
import { loadLessons } from "./load.server";
import type { Lesson } from "./schema";
import { syncLessons } from "./sync.server";

// Validated when the server starts: a broken lesson stops start-up with a message naming file and field.
const LESSONS: Lesson[] = loadLessons();
const BY_SLUG = new Map(LESSONS.map((l) => [l.slug, l]));

export function allLessons(): Lesson[] {
  return LESSONS;
}

export function getLesson(slug: string): Lesson | null {
  return BY_SLUG.get(slug) ?? null;
}

let synced: Promise<void> | null = null;

/** Copies the lesson files into `lessons`/`lesson_versions` once per process (retried after a failure). */
export function ensureLessonsSynced(knex: Knex = db()): Promise<void> {
  const run =
    synced ??
    syncLessons(knex, LESSONS).then(
      () => undefined,
      (e) => {
        synced = null;
        throw e;
      },
    );
  synced = run;
  return run;
}

if (!process.env.VITEST && process.env.DATABASE_URL) {
  ensureLessonsSynced().catch((e: Error) =>
    console.warn(`[lessons] sync at start-up failed, will retry on first use: ${e.message}`),
  );
}
