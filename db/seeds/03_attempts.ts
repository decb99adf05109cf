/**
 * A few graded attempts for the demo trainees, so the gradebook and "my attempts" have something
 * to show. Graded by the real grader (the roof engine runs on each roof), stored through the same
 * code as the API. Idempotent: each demo attempt has a fixed idempotency key.
 */
import type { Knex } from "knex";
import { createAttempt } from "../../app/lib/lessons/attempts.server.ts";
import type { Answers } from "../../app/lib/lessons/grade.ts";
import { loadLessons } from "../../app/lib/lessons/load.server.ts";
import type { Lesson } from "../../app/lib/lessons/schema.ts";
import { courseDir } from "./02_lessons.ts";

type Plan = {
  key: string;
  trainee: string;
  lesson: string;
  answers: "right" | "half";
  roof: "start" | "reference";
  at: string;
  minutes: number;
};

// Invented history: Tess passes lesson 1 and needs two goes at lesson 2; Marco and Priya have started.
const PLANS: Plan[] = [
  {
    key: "demo-tess-01-a",
    trainee: "trainee@tidemark.example",
    lesson: "reading-falls",
    answers: "right",
    roof: "reference",
    at: "2027-03-01T10:20:00Z",
    minutes: 18,
  },
  {
    key: "demo-tess-02-a",
    trainee: "trainee@tidemark.example",
    lesson: "why-water-stands",
    answers: "half",
    roof: "start",
    at: "2027-03-02T09:40:00Z",
    minutes: 12,
  },
  {
    key: "demo-tess-02-b",
    trainee: "trainee@tidemark.example",
    lesson: "why-water-stands",
    answers: "right",
    roof: "reference",
    at: "2027-03-02T10:05:00Z",
    minutes: 9,
  },
  {
    key: "demo-marco-01-a",
    trainee: "trainee2@tidemark.example",
    lesson: "reading-falls",
    answers: "half",
    roof: "start",
    at: "2027-03-01T11:02:00Z",
    minutes: 22,
  },
  {
    key: "demo-marco-03-a",
    trainee: "trainee2@tidemark.example",
    lesson: "outlets-and-overflows",
    answers: "right",
    roof: "reference",
    at: "2027-03-03T14:15:00Z",
    minutes: 26,
  },
  {
    key: "demo-priya-05-a",
    trainee: "trainee3@tidemark.example",
    lesson: "shaping-to-an-outlet",
    answers: "right",
    roof: "reference",
    at: "2027-03-04T13:30:00Z",
    minutes: 31,
  },
];

/** The author's answers, or every other one left blank. */
function answersFor(lesson: Lesson, how: Plan["answers"]): Answers {
  const out: Answers = {};
  lesson.quiz.forEach((q, i) => {
    if (how === "half" && i % 2 === 1) return;
    out[q.id] = q.kind === "choice" ? q.correct : q.answer;
  });
  return out;
}

export async function seed(knex: Knex): Promise<void> {
  const lessons = new Map(loadLessons(courseDir()).map((l) => [l.slug, l]));
  for (const p of PLANS) {
    const lesson = lessons.get(p.lesson);
    const user = await knex("users").whereRaw("lower(email) = ?", [p.trainee]).first("id");
    // Demo attempts are on roof tasks only.
    if (!lesson || lesson.task.kind !== "roof" || !user) continue;
    // Seeded once: a database made before the lessons last changed keeps its demo attempts (their
    // request would now differ, which the idempotency check rightly refuses).
    if (await knex("attempts").where({ trainee_id: user.id, idempotency_key: p.key }).first("id")) continue;
    const outcome = await createAttempt(
      knex,
      user.id,
      {
        lesson: lesson.slug,
        answers: answersFor(lesson, p.answers),
        spec: structuredClone(lesson.task[p.roof]),
        idempotencyKey: p.key,
        timeSpentSeconds: p.minutes * 60,
      },
      (slug) => lessons.get(slug) ?? null,
    );
    if (!("attempt" in outcome)) throw new Error(`demo attempt ${p.key}: ${outcome.message}`);
    if (outcome.status === 201) await knex("attempts").where({ id: outcome.attempt.id }).update({ submitted_at: p.at });
  }
}
