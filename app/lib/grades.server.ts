import { db } from "~/lib/db.server";
import type { GradeCell } from "~/lib/gradebook";
import { readGrade } from "~/lib/lessons/grading-rule";

interface AttemptGradeRow {
  id: string;
  trainee_id: string;
  lesson_slug: string;
  score: number;
  passed: boolean;
  submitted_at: Date;
  override_score: number | null;
  override_passed: boolean | null;
  override_reason: string | null;
  pass_mark: number | null;
  failed_required: string[] | null;
  version_number: number | null;
}

/** Whose overrides count in a class's figures: the class's trainer and its organisation's admins. */
export interface OverrideScope {
  trainerId: string;
  organisationId: string;
}

/**
 * Every attempt with its effective grade: the latest override recorded for it, or else the
 * automatic grade. The attempt row itself is never changed by a review. With a scope, only
 * overrides by the people who run that class count, so an override by someone outside a class
 * never shows in its gradebook.
 */
export function attemptsWithEffectiveGrade(scope?: OverrideScope) {
  const scoped = scope
    ? `and exists (select 1 from users ru where ru.id = r.reviewer_id
         and (ru.id = :trainerId or (ru.role = 'admin' and ru.organisation_id = :organisationId)))`
    : "";
  return db()
    .from("attempts as a")
    .joinRaw(
      `left join lateral (
         select r.override_score, r.override_passed, r.reason from attempt_reviews r
         where r.attempt_id = a.id and (r.override_score is not null or r.override_passed is not null) ${scoped}
         order by r.at desc, r.id desc limit 1
       ) o on true`,
      scope ? { trainerId: scope.trainerId, organisationId: scope.organisationId } : [],
    )
    .select(
      "a.id",
      "a.trainee_id",
      "a.lesson_slug",
      "a.score",
      "a.passed",
      "a.submitted_at",
      "o.override_score",
      "o.override_passed",
      "o.reason as override_reason",
    )
    .select(
      db().raw(`(a.results->>'passMark')::float8 as pass_mark`),
      // The readable version the attempt was graded on (v1, v2: docs/authoring.md, "Versions").
      db().raw(
        `(select v.number from lesson_versions v where v.slug = a.lesson_slug and v.version = a.lesson_version) as version_number`,
      ),
      // The labels of required items not met: the grading rule reads them (grading-rule.ts).
      db().raw(
        `(select coalesce(jsonb_agg(i->>'label'), '[]'::jsonb)
            from jsonb_array_elements(coalesce(a.results->'task', '[]'::jsonb) || coalesce(a.results->'quiz', '[]'::jsonb)) i
           where i->>'required' = 'true' and i->>'passed' = 'false') as failed_required`,
      ),
    );
}

function toCell(r: AttemptGradeRow): GradeCell {
  const overridden = r.override_score !== null || r.override_passed !== null;
  const reading = readGrade({
    score: r.score,
    passed: r.passed,
    passMark: r.pass_mark ?? 0,
    failedRequired: r.failed_required ?? [],
    override: overridden
      ? { score: r.override_score ?? r.score, passed: r.override_passed ?? r.passed, reason: r.override_reason }
      : null,
  });
  return {
    attemptId: r.id,
    score: reading.score,
    passed: reading.passed,
    reason: reading.reason,
    why: reading.why,
    overridden,
    attempts: 1,
    submittedAt: new Date(r.submitted_at).toISOString(),
    versionNumber: r.version_number ?? null,
  };
}

/** Best first: a pass beats a fail, then the higher score, then the later attempt. */
function better(a: GradeCell, b: GradeCell): boolean {
  if (a.passed !== b.passed) return a.passed;
  if (a.score !== b.score) return a.score > b.score;
  return a.submittedAt > b.submittedAt;
}

export const cellKey = (traineeId: string, slug: string) => `${traineeId}|${slug}`;

/** The best effective grade for each (trainee, lesson) pair that has attempts. */
export async function bestGrades(
  traineeIds: string[],
  slugs: string[],
  scope?: OverrideScope,
): Promise<Map<string, GradeCell>> {
  const out = new Map<string, GradeCell>();
  if (!traineeIds.length || !slugs.length) return out;
  const rows: AttemptGradeRow[] = await attemptsWithEffectiveGrade(scope)
    .whereIn("a.trainee_id", traineeIds)
    .whereIn("a.lesson_slug", slugs);
  for (const r of rows) {
    const key = cellKey(r.trainee_id, r.lesson_slug);
    const cell = toCell(r);
    const held = out.get(key);
    if (!held) out.set(key, cell);
    else if (better(cell, held)) out.set(key, { ...cell, attempts: held.attempts + 1 });
    else held.attempts += 1;
  }
  return out;
}

/** Each attempt's grade as the rule reads it, override included (the trainee's own pages). */
export async function gradesOfAttempts(attemptIds: string[]): Promise<Map<string, GradeCell>> {
  if (!attemptIds.length) return new Map();
  const rows: AttemptGradeRow[] = await attemptsWithEffectiveGrade().whereIn("a.id", attemptIds);
  return new Map(rows.map((r) => [r.id, toCell(r)]));
}

/** Every attempt of one trainee with its lesson and its grade as the rule reads it. */
export async function traineeGrades(traineeId: string): Promise<{ lesson: string; cell: GradeCell }[]> {
  const rows: AttemptGradeRow[] = await attemptsWithEffectiveGrade().where("a.trainee_id", traineeId);
  return rows.map((r) => ({ lesson: r.lesson_slug, cell: toCell(r) }));
}
