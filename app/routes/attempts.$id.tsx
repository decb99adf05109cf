import { When } from "~/components/dates";
import { data, Link } from "react-router";
import type { Route } from "./+types/attempts.$id";
import type { RoofSpec } from "~/engine";
import { requirePermission } from "~/lib/auth.server";
import { db } from "~/lib/db.server";
import { getAttempt, maySeeTraineeAttempts } from "~/lib/lessons/attempts.server";
import { versionNumberOf } from "~/lib/lessons/access.server";
import { effectiveGrade, reviewsForAttempt } from "~/lib/reviews.server";
import { formatScore } from "~/lib/gradebook";
import { Caution } from "~/components/caution";
import { GeneralErrorBoundary } from "~/components/error-boundary";
import { PassMark, ResultsTable, ScoreSummary } from "~/components/lessons/results";
import { SandboxWorkspace } from "~/components/sandbox/workspace";

export const meta: Route.MetaFunction = ({ data }) => [
  { title: `Attempt: ${data?.attempt.lessonTitle ?? "lesson"} · Fallwright` },
];

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requirePermission(request, "lessons:take");
  const attempt = await getAttempt(db(), params.id);
  // Someone else's attempt answers the same as a missing one.
  if (!attempt || !(await maySeeTraineeAttempts(db(), user, attempt.traineeId)))
    throw data("No attempt with that id that you may see.", { status: 404 });
  const reviews = await reviewsForAttempt(attempt.id);
  const current = await db()("lessons").where({ slug: attempt.lesson }).first("version");
  const versionNumber = await versionNumberOf(db(), attempt.lesson, attempt.lessonVersion);
  const grade = effectiveGrade(attempt, reviews);
  return {
    attempt,
    grade: {
      score: grade.score,
      passed: grade.passed,
      overridden: grade.overridden,
      reason: grade.reason,
      why: grade.why,
    },
    mine: attempt.traineeId === user.id,
    outdated: !!current && current.version !== attempt.lessonVersion,
    versionNumber,
    reviews: reviews.map((r) => ({
      id: r.id,
      reviewerName: r.reviewerName,
      comment: r.comment,
      overrideScore: r.overrideScore,
      overridePassed: r.overridePassed,
      reason: r.reason,
      at: r.at,
    })),
  };
}

export default function AttemptPage({ loaderData }: Route.ComponentProps) {
  const { attempt, grade, mine, outdated, reviews, versionNumber } = loaderData;
  const r = attempt.results;
  return (
    <div className="grid gap-6">
      <header className="grid gap-2">
        <p className="text-sm">
          <Link to="/attempts" className="underline">
            My attempts
          </Link>{" "}
          <span className="text-ink-soft">/</span>{" "}
          <Link to={`/lessons/${attempt.lesson}`} className="underline">
            {attempt.lessonTitle}
          </Link>
        </p>
        <h1 className="text-display font-bold tracking-tight">{attempt.lessonTitle}</h1>
        <p className="text-sm text-ink-soft">
          Submitted <When iso={attempt.submittedAt} /> · time on the page {Math.round(attempt.timeSpentSeconds / 60)}{" "}
          min (measured in the browser, for information)
          {" · "}
          <span data-testid="attempt-version">
            graded on {versionNumber ? `v${versionNumber}` : "a version"} of this lesson
            {outdated ? " (an earlier version; the lesson has changed since)" : ""}
          </span>
        </p>
      </header>
      {grade.overridden ? (
        <div
          className={`rounded border-2 px-4 py-3 ${grade.passed ? "border-ok bg-ok/5" : "border-bad bg-bad/5"}`}
          role="status"
          data-testid="grade-that-counts"
        >
          <p className="text-xs font-medium uppercase tracking-wide text-ink-soft">
            The grade that counts (changed by your trainer)
          </p>
          {grade.reason ? <p className="mt-1 font-medium text-bad">{grade.reason}</p> : null}
          <p className="mt-1 flex flex-wrap items-baseline gap-x-4">
            <span className="text-3xl font-bold tabular-nums">
              {formatScore(grade.score)}
              <span className="text-base font-normal text-ink-soft"> / 100</span>
            </span>
            <PassMark passed={grade.passed} />
          </p>
        </div>
      ) : null}
      <ScoreSummary
        result={r}
        heading={
          grade.overridden ? "Automatic grade (changed by your trainer, see above)" : mine ? "Your result" : "Result"
        }
      />
      {reviews.length > 0 && (
        <section className="card grid gap-3" aria-labelledby="reviews-heading">
          <h2 id="reviews-heading" className="text-lg font-bold">
            From your trainer
          </h2>
          {reviews.map((v) => (
            <div key={v.id} className="border-l-4 border-accent pl-3">
              <p className="text-xs text-ink-soft">
                {v.reviewerName} · <When iso={v.at} />
              </p>
              {v.comment && <p className="whitespace-pre-wrap">{v.comment}</p>}
              {(v.overrideScore !== null || v.overridePassed !== null) && (
                <p className="text-sm">
                  Grade changed to <strong>{v.overrideScore ?? "—"}</strong>
                  {v.overridePassed !== null ? (v.overridePassed ? ", passed" : ", not passed") : ""}
                  {v.reason ? ` — ${v.reason}` : ""}
                </p>
              )}
            </div>
          ))}
        </section>
      )}
      <section className="card overflow-x-auto" aria-labelledby="breakdown-heading">
        <h2 id="breakdown-heading" className="mb-2 text-lg font-bold">
          Every answer and criterion
        </h2>
        <ResultsTable result={r} />
      </section>
      <section aria-labelledby="roof-heading" className="grid gap-3">
        <h2 id="roof-heading" className="text-lg font-bold">
          The roof as submitted
        </h2>
        {attempt.spec ? (
          <SandboxWorkspace initialSpec={attempt.spec as RoofSpec} readOnly />
        ) : (
          <p className="text-ink-soft">No roof was stored with this attempt.</p>
        )}
      </section>
      <Caution />
    </div>
  );
}

export function ErrorBoundary() {
  return <GeneralErrorBoundary />;
}
