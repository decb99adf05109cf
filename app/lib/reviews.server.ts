/**
 * Trainers' reviews of attempts: a comment, and optionally a grade override with a reason.
 * Each review is a new row in attempt_reviews (who, when); the attempt row itself is never
 * changed, so the automatic grade stays on record beside every override.
 */
import { z } from "zod";
import type { SessionUser } from "~/lib/auth.server";
import { db } from "~/lib/db.server";
import { formatScore, type AttemptReview } from "~/lib/gradebook";
import { getAttempt, maySeeTraineeAttempts } from "~/lib/lessons/attempts.server";
import { failedRequiredOf, type GradeResult } from "~/lib/lessons/grade";
import { readGrade, type GradeReading } from "~/lib/lessons/grading-rule";
import { sendNotice } from "~/lib/mail.server";
import { can } from "~/lib/permissions";
import { issueCertificatesAfterGrade } from "~/lib/certificates/certificates.server";

/** See AttemptReview in ~/lib/gradebook (shared with the pages that show reviews). */
export type ReviewView = AttemptReview;

/** Every review of an attempt, newest first. The lessons pages show these to the trainee. */
export async function reviewsForAttempt(attemptId: string): Promise<ReviewView[]> {
  const rows = await db()("attempt_reviews as r")
    .join("users as u", "u.id", "r.reviewer_id")
    .where("r.attempt_id", attemptId)
    .orderBy([
      { column: "r.at", order: "desc" },
      { column: "r.id", order: "desc" },
    ])
    .select("r.id", "u.name", "u.email", "r.comment", "r.override_score", "r.override_passed", "r.reason", "r.at");
  return rows.map((r) => ({
    id: String(r.id),
    reviewerName: r.name || r.email,
    comment: r.comment,
    overrideScore: r.override_score,
    overridePassed: r.override_passed,
    reason: r.reason,
    at: new Date(r.at).toISOString(),
  }));
}

export interface EffectiveGrade extends GradeReading {
  /** The review whose override is in force, if any. */
  override: ReviewView | null;
}

/** The grade that counts, read by the grading rule: the latest override (reviews newest first), else the automatic one. */
export function effectiveGrade(
  attempt: { score: number; passed: boolean; results: GradeResult },
  reviews: ReviewView[],
): EffectiveGrade {
  const override = reviews.find((r) => r.overrideScore !== null || r.overridePassed !== null) ?? null;
  const reading = readGrade({
    score: attempt.score,
    passed: attempt.passed,
    passMark: attempt.results.passMark,
    failedRequired: failedRequiredOf(attempt.results),
    override: override
      ? {
          score: override.overrideScore ?? attempt.score,
          passed: override.overridePassed ?? attempt.passed,
          reason: override.reason,
        }
      : null,
  });
  return { ...reading, override };
}

const ReviewForm = z
  .object({
    comment: z.string().trim().max(4000, "Keep the comment under 4,000 characters."),
    override: z.boolean(),
    score: z.string().trim(),
    passed: z.enum(["", "yes", "no"]),
    reason: z.string().trim().max(1000, "Keep the reason under 1,000 characters."),
  })
  .transform((f, ctx) => {
    let override: { score: number; passed: boolean; reason: string } | null = null;
    if (f.override) {
      const score = Number(f.score.replace(",", "."));
      if (!f.score || !Number.isFinite(score) || score < 0 || score > 100) {
        ctx.addIssue({ code: "custom", path: ["score"], message: "Give the new score as a number from 0 to 100." });
      }
      if (!f.passed) ctx.addIssue({ code: "custom", path: ["passed"], message: "Say whether the attempt passes." });
      if (f.reason.length < 3)
        ctx.addIssue({
          code: "custom",
          path: ["reason"],
          message: "Give a reason for changing the grade; the trainee will read it.",
        });
      override = { score: Math.round(score * 10) / 10, passed: f.passed === "yes", reason: f.reason };
    } else if (!f.comment) {
      ctx.addIssue({ code: "custom", path: ["comment"], message: "Write a comment, or change the grade." });
    }
    return { comment: f.comment, override };
  });

export type ReviewInput = z.output<typeof ReviewForm>;
export type ReviewFields = "comment" | "score" | "passed" | "reason";

export function parseReviewForm(
  form: FormData,
):
  | { ok: true; value: ReviewInput; raw: Record<string, string> }
  | { ok: false; errors: Partial<Record<ReviewFields, string>>; values: Record<string, string> } {
  const values = {
    comment: String(form.get("comment") ?? ""),
    override: form.get("override") === "on" ? "on" : "",
    score: String(form.get("score") ?? ""),
    passed: String(form.get("passed") ?? ""),
    reason: String(form.get("reason") ?? ""),
  };
  const parsed = ReviewForm.safeParse({
    ...values,
    override: values.override === "on",
    passed: ["yes", "no"].includes(values.passed) ? values.passed : "",
  });
  if (parsed.success) return { ok: true, value: parsed.data, raw: values };
  const errors: Partial<Record<ReviewFields, string>> = {};
  for (const issue of parsed.error.issues) errors[(issue.path[0] as ReviewFields) ?? "comment"] ??= issue.message;
  return { ok: false, errors, values };
}

export interface ReviewedAttempt {
  id: string;
  traineeEmail: string;
  lessonTitle: string;
  score: number;
  passed: boolean;
}

/** Records a review and tells the trainee by e-mail. Returns whether the e-mail went out. */
export async function addReview(o: {
  attempt: ReviewedAttempt;
  reviewer: SessionUser;
  input: ReviewInput;
  origin: string;
}): Promise<{ id: string; emailSent: boolean }> {
  const { attempt, reviewer, input } = o;
  const [row] = await db()("attempt_reviews")
    .insert({
      attempt_id: attempt.id,
      reviewer_id: reviewer.id,
      comment: input.comment,
      override_score: input.override?.score ?? null,
      override_passed: input.override?.passed ?? null,
      reason: input.override?.reason ?? null,
    })
    .returning("id");
  // An override that passes may complete a course; one that does not issues nothing (docs/product.md capability 10).
  if (input.override) {
    const a = await db()("attempts").where({ id: attempt.id }).first("trainee_id", "lesson_slug");
    if (a) await issueCertificatesAfterGrade(a.trainee_id, a.lesson_slug);
  }
  const who = reviewer.name || reviewer.email;
  const verdict = (passed: boolean) => (passed ? "passed" : "not passed");
  const paragraphs: string[] = [];
  if (input.comment) paragraphs.push(`${who} wrote: “${input.comment}”`);
  if (input.override) {
    paragraphs.push(
      `Your grade for this attempt is now ${formatScore(input.override.score)}/100, ${verdict(input.override.passed)} ` +
        `(the automatic grade was ${formatScore(attempt.score)}/100, ${verdict(attempt.passed)}). Reason: ${input.override.reason}`,
    );
  }
  let emailSent = true;
  try {
    await sendNotice({
      to: attempt.traineeEmail,
      subject: `Your attempt at "${attempt.lessonTitle}" was reviewed`,
      heading: `${who} reviewed your attempt`,
      paragraphs,
      action: { label: "Open your attempt", url: `${o.origin}/attempts/${attempt.id}` },
      footnote: "You get this message because a trainer of your class reviewed one of your lesson attempts.",
    });
  } catch (error) {
    emailSent = false;
    console.warn(
      `[mail] review notice for attempt ${attempt.id} not sent:`,
      error instanceof Error ? error.message : error,
    );
  }
  return { id: String(row.id), emailSent };
}

/**
 * The attempt if this user may see it: the trainee's own, a trainer's class member's, or any in
 * an admin's organisation. Null otherwise (the caller answers 404).
 */
export async function attemptFor(viewer: SessionUser, attemptId: string) {
  const attempt = await getAttempt(db(), attemptId);
  if (!attempt || !(await maySeeTraineeAttempts(db(), viewer, attempt.traineeId))) return null;
  const trainee = await db()("users").where({ id: attempt.traineeId }).first("name", "email");
  return { attempt, trainee: { name: (trainee?.name as string) || "", email: (trainee?.email as string) ?? "" } };
}

/**
 * Reviewing is for trainers and admins, and never of one's own attempt. A trainer reviews (and
 * overrides) only attempts at a lesson assigned in one of their own classes that the trainee
 * belongs to: an override must never reach a gradebook the trainer does not run. An admin may
 * review any attempt of their organisation (attemptFor has checked that).
 */
export async function mayReview(viewer: SessionUser, attempt: { traineeId: string; lesson: string }): Promise<boolean> {
  if (!can(viewer.role, "attempts:review") || viewer.id === attempt.traineeId) return false;
  if (viewer.role === "admin") return true;
  const row = await db()("classes as c")
    .join("class_members as m", "m.class_id", "c.id")
    .join("assignments as s", "s.class_id", "c.id")
    .where({ "c.trainer_id": viewer.id, "m.user_id": attempt.traineeId, "s.lesson_slug": attempt.lesson })
    .first("c.id");
  return !!row;
}
