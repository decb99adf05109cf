import type { Knex } from "knex";
import { z } from "zod";
import { isUuid } from "../input";
import { keyReusedMessage, requestHash, sameRequest } from "../idempotency.server";
import { gradeLesson, type GradeResult } from "./grade";
import type { Lesson } from "./schema";
import { lessonVersion } from "./sync.server";
import { traineeGrades } from "~/lib/grades.server";

/** The body of POST /api/v1/attempts and of the player's form (after decoding). */
export const submissionSchema = z.object({
  lesson: z.string({ error: "must be the lesson's slug" }).min(1).max(100),
  version: z
    .string()
    .regex(/^[0-9a-f]{64}$/, "must be the lesson's version hash")
    .optional(),
  answers: z
    .record(z.string().max(40), z.union([z.string().max(200), z.array(z.string().max(40)).max(8)]), {
      error: "must map question ids to answers",
    })
    .refine((a) => Object.keys(a).length <= 50, "has too many answers")
    .default({}),
  spec: z.unknown(),
  idempotencyKey: z
    .string({ error: "must be a random key made once per submit (8-100 letters, digits, dashes)" })
    .regex(/^[A-Za-z0-9_-]{8,100}$/, "must be 8-100 letters, digits, dashes or underscores"),
  // Measured in the browser: shown to trainers as information, never used in the grade.
  timeSpentSeconds: z.number().finite().min(0).max(1e7).default(0),
});
export type Submission = z.output<typeof submissionSchema>;

export interface AttemptView {
  id: string;
  traineeId: string;
  lesson: string;
  lessonTitle: string;
  lessonVersion: string;
  submittedAt: string;
  score: number;
  passed: boolean;
  timeSpentSeconds: number;
  answers: Record<string, string | string[]>;
  spec: unknown;
  results: GradeResult;
}

type Row = {
  id: string;
  trainee_id: string;
  lesson_slug: string;
  lesson_version: string;
  title: string | null;
  submitted_at: Date | string;
  score: number;
  passed: boolean;
  time_spent_s: number;
  answers: Record<string, string | string[]>;
  spec: unknown;
  results: GradeResult;
};

const COLUMNS = [
  "a.id",
  "a.trainee_id",
  "a.lesson_slug",
  "a.lesson_version",
  "l.title",
  "a.submitted_at",
  "a.score",
  "a.passed",
  "a.time_spent_s",
  "a.answers",
  "a.spec",
  "a.results",
];

function view(r: Row): AttemptView {
  return {
    id: r.id,
    traineeId: r.trainee_id,
    lesson: r.lesson_slug,
    lessonTitle: r.title ?? r.lesson_slug,
    lessonVersion: r.lesson_version,
    submittedAt: new Date(r.submitted_at).toISOString(),
    score: r.score,
    passed: r.passed,
    timeSpentSeconds: r.time_spent_s,
    answers: r.answers,
    spec: r.spec,
    results: r.results,
  };
}

const selectAttempts = (knex: Knex) =>
  knex("attempts as a").leftJoin("lessons as l", "l.slug", "a.lesson_slug").select(COLUMNS);

export type CreateOutcome =
  | { status: 200 | 201; attempt: AttemptView }
  | { status: 400 | 404 | 409 | 422; message: string; issues?: { path: string; message: string }[] };

/**
 * Grades and stores one attempt. The same idempotency key from the same trainee returns the
 * attempt already made (200); two submits racing each other make one row (the unique
 * (trainee_id, idempotency_key) constraint, insert … on conflict do nothing, then select).
 */
export async function createAttempt(
  knex: Knex,
  traineeId: string,
  sub: Submission,
  current: (slug: string) => Lesson | null,
): Promise<CreateOutcome> {
  // The key names the submission: a repeat must ask for the same grade of the same work.
  const hash = requestHash({
    lesson: sub.lesson,
    version: sub.version ?? null,
    answers: sub.answers,
    spec: sub.spec ?? null,
  });
  const existing = await findByKey(knex, traineeId, sub.idempotencyKey);
  if (existing) return repeatOf(existing, sub.idempotencyKey, hash);

  let lesson = current(sub.lesson);
  if (!lesson) return { status: 404, message: `There is no lesson "${sub.lesson}".` };
  if (sub.version && sub.version !== lesson.version) {
    lesson = await lessonVersion(knex, sub.lesson, sub.version);
    if (!lesson)
      return {
        status: 409,
        message: "This lesson has changed since the page was opened. Reload it; your answers are kept in the form.",
      };
  }
  const graded = gradeLesson(lesson, sub.answers, sub.spec);
  if ("ok" in graded)
    return {
      status: graded.status,
      message: graded.message,
      issues: graded.issues.map((i) => ({ ...i, path: `spec.${i.path}` })),
    };

  const inserted = await knex("attempts")
    .insert({
      trainee_id: traineeId,
      lesson_slug: lesson.slug,
      lesson_version: lesson.version,
      idempotency_key: sub.idempotencyKey,
      idempotency_hash: hash,
      spec: JSON.stringify(sub.spec),
      answers: JSON.stringify(sub.answers),
      results: JSON.stringify(graded),
      score: graded.score,
      passed: graded.passed,
      time_spent_s: Math.round(Math.min(sub.timeSpentSeconds, 2_000_000_000)),
    })
    .onConflict(["trainee_id", "idempotency_key"])
    .ignore()
    .returning("id");
  const found = await findByKey(knex, traineeId, sub.idempotencyKey);
  if (!found) throw new Error("attempt vanished after insert");
  return inserted.length ? { status: 201, attempt: found.attempt } : repeatOf(found, sub.idempotencyKey, hash);
}

function repeatOf(found: { attempt: AttemptView; hash: string | null }, key: string, hash: string): CreateOutcome {
  if (!sameRequest(found.hash, hash)) {
    return {
      status: 422,
      message: keyReusedMessage(key),
      issues: [{ path: "idempotencyKey", message: "was already used for a different submission" }],
    };
  }
  return { status: 200, attempt: found.attempt };
}

async function findByKey(
  knex: Knex,
  traineeId: string,
  key: string,
): Promise<{ attempt: AttemptView; hash: string | null } | null> {
  const row = await selectAttempts(knex)
    .select("a.idempotency_hash")
    .where({ "a.trainee_id": traineeId, "a.idempotency_key": key })
    .first();
  return row ? { attempt: view(row), hash: row.idempotency_hash ?? null } : null;
}

export async function listAttempts(
  knex: Knex,
  traineeId: string,
  opts: { lesson?: string; limit?: number } = {},
): Promise<AttemptView[]> {
  const q = selectAttempts(knex)
    .where("a.trainee_id", traineeId)
    .orderBy("a.submitted_at", "desc")
    .limit(opts.limit ?? 500);
  if (opts.lesson) q.andWhere("a.lesson_slug", opts.lesson);
  return (await q).map(view);
}

export async function getAttempt(knex: Knex, id: string): Promise<AttemptView | null> {
  if (!isUuid(id)) return null;
  const row = await selectAttempts(knex).where("a.id", id).first();
  return row ? view(row) : null;
}

export interface Progress {
  lesson: string;
  attempts: number;
  bestScore: number;
  passed: boolean;
  lastAt: string;
}

/**
 * Per lesson: number of attempts, best score, whether any attempt passed, each grade read by the
 * grading rule (grading-rule.ts, overrides included), so "best 100 · not passed" cannot appear.
 */
export async function progressOf(_knex: Knex, traineeId: string): Promise<Record<string, Progress>> {
  const out: Record<string, Progress> = {};
  for (const { lesson, cell } of await traineeGrades(traineeId)) {
    const p = (out[lesson] ??= { lesson, attempts: 0, bestScore: 0, passed: false, lastAt: cell.submittedAt });
    p.attempts += 1;
    // The best score among passing attempts if any passed, else the best of all.
    if (cell.passed && !p.passed) p.bestScore = cell.score;
    else if (cell.passed === p.passed) p.bestScore = Math.max(p.bestScore, cell.score);
    p.passed ||= cell.passed;
    if (cell.submittedAt > p.lastAt) p.lastAt = cell.submittedAt;
  }
  return out;
}

/** Who may see a trainee's attempts: the trainee, a trainer of one of their classes, an admin of their organisation. */
export async function maySeeTraineeAttempts(
  knex: Knex,
  viewer: { id: string; role: string; organisationId: string },
  traineeId: string,
): Promise<boolean> {
  if (viewer.id === traineeId) return true;
  if (!/^[0-9a-f-]{36}$/i.test(traineeId)) return false;
  if (viewer.role === "admin") {
    const u = await knex("users").where({ id: traineeId, organisation_id: viewer.organisationId }).first("id");
    return !!u;
  }
  if (viewer.role === "trainer") {
    const m = await knex("class_members as m")
      .join("classes as c", "c.id", "m.class_id")
      .where({ "m.user_id": traineeId, "c.trainer_id": viewer.id })
      .first("m.user_id");
    return !!m;
  }
  return false;
}
