import { When } from "~/components/dates";
import { data, Form, Link } from "react-router";
import { useState } from "react";
import type { Route } from "./+types/attempts.$id.review";
import { requirePermission, requireUser } from "~/lib/auth.server";
import { getClassFor } from "~/lib/classes.server";
import { formatScore } from "~/lib/gradebook";
import { appOrigin } from "~/lib/app-url";
import {
  addReview,
  attemptFor,
  effectiveGrade,
  mayReview,
  parseReviewForm,
  reviewsForAttempt,
  type ReviewFields,
} from "~/lib/reviews.server";
import { overrideProblem, readGrade } from "~/lib/lessons/grading-rule";
import { failedRequiredOf, type GradeResult } from "~/lib/lessons/grade";
import { Caution } from "~/components/caution";
import { GeneralErrorBoundary } from "~/components/error-boundary";
import { AttemptReviews } from "~/components/classes/attempt-reviews";
import { GradeMark } from "~/components/classes/grade-mark";
import { ResultsTable, ScoreSummary } from "~/components/lessons/results";
import { ReadOnlyRoof } from "~/components/classes/live-roof";
import { FormError, FormNotice, SubmitButton } from "~/components/form-field";

export const meta: Route.MetaFunction = ({ data }) => [
  { title: `Review: ${data?.attempt.lessonTitle ?? "attempt"} · Fallwright` },
];

const NOT_FOUND = "No attempt with that id that you may see.";

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const found = await attemptFor(user, params.id);
  if (!found) throw data(NOT_FOUND, { status: 404 });
  const { attempt, trainee } = found;
  const reviews = await reviewsForAttempt(attempt.id);
  const classId = new URL(request.url).searchParams.get("class");
  const cls = classId ? await getClassFor(user, classId, "manage") : null;
  return {
    attempt: { ...attempt, answers: undefined },
    trainee,
    reviews,
    grade: effectiveGrade(attempt, reviews),
    canReview: await mayReview(user, attempt),
    back: cls ? { id: cls.id, name: cls.name } : null,
  };
}

export async function action({ request, params }: Route.ActionArgs) {
  const user = await requirePermission(request, "attempts:review");
  const found = await attemptFor(user, params.id);
  if (!found) throw data(NOT_FOUND, { status: 404 });
  if (!(await mayReview(user, found.attempt))) {
    const why =
      user.id === found.attempt.traineeId
        ? "You cannot review your own attempt."
        : "You can review attempts only at lessons assigned in your own classes.";
    throw data(why, { status: 403 });
  }
  const parsed = parseReviewForm(await request.formData());
  if (!parsed.ok) return data({ errors: parsed.errors, values: parsed.values, notice: null }, { status: 400 });
  // The grading rule (grading-rule.ts): an override's result follows its score and the pass mark.
  const problem = parsed.value.override ? overrideProblem(parsed.value.override, found.attempt.results.passMark) : null;
  if (problem)
    return data(
      { errors: { passed: problem } as Partial<Record<ReviewFields, string>>, values: parsed.raw, notice: null },
      { status: 400 },
    );
  const { emailSent } = await addReview({
    attempt: {
      id: found.attempt.id,
      traineeEmail: found.trainee.email,
      lessonTitle: found.attempt.lessonTitle,
      ...automaticGrade(found.attempt),
    },
    reviewer: user,
    input: parsed.value,
    origin: appOrigin(),
  });
  const who = found.trainee.name || found.trainee.email;
  return {
    errors: null,
    values: null,
    notice: emailSent ? `Saved. ${who} has been told by e-mail.` : `Saved, but the e-mail to ${who} could not be sent.`,
  };
}

/** The automatic grade as the rule reads it (grading-rule.ts). */
function automaticGrade(attempt: { score: number; passed: boolean; results: GradeResult }) {
  const g = readGrade({
    score: attempt.score,
    passed: attempt.passed,
    passMark: attempt.results.passMark,
    failedRequired: failedRequiredOf(attempt.results),
  });
  return { score: g.score, passed: g.passed };
}

export default function AttemptReview({ loaderData, actionData }: Route.ComponentProps) {
  const { attempt, trainee, reviews, grade, canReview, back } = loaderData;
  const result = actionData;
  const auto = { ...automaticGrade(attempt), passMark: attempt.results.passMark };
  return (
    <div className="grid gap-6">
      <header>
        <p className="text-sm">
          {back ? (
            <>
              <Link className="underline" to={`/classes/${back.id}`}>
                {back.name}
              </Link>{" "}
              /{" "}
              <Link className="underline" to={`/classes/${back.id}/gradebook`}>
                Gradebook
              </Link>
            </>
          ) : (
            <Link className="underline" to={canReview ? "/gradebook" : "/classes"}>
              {canReview ? "Gradebook" : "Classes"}
            </Link>
          )}
        </p>
        <h1 className="text-display font-bold tracking-tight">{attempt.lessonTitle}</h1>
        <p className="mt-2 flex flex-wrap items-center gap-x-5 gap-y-1">
          <span>
            <span className="text-ink-soft">Trainee:</span> <strong>{trainee.name || trainee.email}</strong>
          </span>
          <span className="text-ink-soft">
            Submitted <When iso={attempt.submittedAt} />
          </span>
          <span className="inline-flex items-center gap-2">
            <span className="text-ink-soft">Grade:</span>
            <GradeMark
              cell={{
                attemptId: attempt.id,
                score: grade.score,
                passed: grade.passed,
                overridden: grade.overridden,
                reason: grade.reason,
                why: grade.why,
                attempts: 1,
                submittedAt: attempt.submittedAt,
              }}
            />
          </span>
          {grade.override ? (
            <span className="text-sm text-ink-soft">
              (automatic: {formatScore(auto.score)}, {auto.passed ? "passed" : "not passed"})
            </span>
          ) : null}
          {attempt.spec ? (
            <a className="text-sm underline" href="#roof">
              See the roof in 3D
            </a>
          ) : null}
        </p>
      </header>

      <div className="grid items-start gap-6 lg:grid-cols-2">
        <section aria-labelledby="breakdown" className="card grid content-start gap-3">
          <h2 id="breakdown" className="text-lg font-bold">
            Automatic grading
          </h2>
          <ScoreSummary
            result={attempt.results}
            heading={grade.override ? "Automatic grade (overridden below)" : "Automatic grade"}
          />
          <p className="text-sm text-ink-soft">
            Graded on the server on lesson version <code className="text-xs">{attempt.lessonVersion.slice(0, 8)}</code>.
          </p>
          <ResultsTable result={attempt.results} />
        </section>
        <section aria-labelledby="reviews" className="card grid content-start gap-4">
          <h2 id="reviews" className="text-lg font-bold">
            Trainer's comments
          </h2>
          <AttemptReviews reviews={reviews} automatic={auto} />
          {canReview ? <ReviewForm result={result} auto={auto} /> : null}
        </section>
      </div>

      <section id="roof" aria-labelledby="roof-heading" className="grid gap-2">
        <h2 id="roof-heading" className="text-lg font-bold">
          The submitted roof
        </h2>
        {attempt.spec ? (
          <ReadOnlyRoof spec={attempt.spec} />
        ) : (
          <p className="card text-ink-soft">This attempt has no roof (quiz only).</p>
        )}
      </section>
      <Caution />
    </div>
  );
}

type ActionResult = Route.ComponentProps["actionData"];

function ReviewForm({
  result,
  auto,
}: {
  result: ActionResult;
  auto: { score: number; passed: boolean; passMark: number };
}) {
  const values = result?.values;
  const errors = result?.errors;
  const [override, setOverride] = useState(values?.override === "on");
  return (
    <Form method="post" className="grid gap-3 border-t border-rule pt-4" noValidate key={result?.notice ?? "form"}>
      <h3 className="font-bold">Add a comment or change the grade</h3>
      <FormNotice message={result?.notice} />
      <div>
        <label className="label" htmlFor="comment">
          Comment to the trainee
        </label>
        <textarea
          id="comment"
          name="comment"
          rows={3}
          maxLength={4000}
          className="field"
          defaultValue={values?.comment ?? ""}
          aria-invalid={errors?.comment ? true : undefined}
          aria-describedby={errors?.comment ? "comment-error" : undefined}
        />
        {errors?.comment ? (
          <p id="comment-error" className="field-error">
            {errors.comment}
          </p>
        ) : null}
      </div>
      <label className="inline-flex items-center gap-2 text-sm font-medium">
        <input
          type="checkbox"
          name="override"
          checked={override}
          onChange={(e) => setOverride(e.target.checked)}
          className="h-4 w-4"
        />
        Change the grade (the automatic grade, {formatScore(auto.score)}/100, stays on record)
      </label>
      {override ? (
        <fieldset className="grid gap-3 rounded border border-rule p-3 sm:grid-cols-[10rem_1fr]">
          <legend className="px-1 text-sm font-medium">New grade</legend>
          <div>
            <label className="label" htmlFor="score">
              Score (0-100)
            </label>
            <input
              id="score"
              name="score"
              inputMode="decimal"
              className="field"
              defaultValue={values?.score ?? formatScore(auto.score)}
              aria-invalid={errors?.score ? true : undefined}
            />
            {errors?.score ? <p className="field-error">{errors.score}</p> : null}
          </div>
          <div role="radiogroup" aria-labelledby="passed-label">
            <p id="passed-label" className="label">
              Result (passes at {auto.passMark} or more)
            </p>
            <div className="flex gap-4 py-1.5 text-sm">
              <label className="inline-flex items-center gap-1">
                <input
                  type="radio"
                  name="passed"
                  value="yes"
                  defaultChecked={values ? values.passed === "yes" : auto.passed}
                />{" "}
                Passed
              </label>
              <label className="inline-flex items-center gap-1">
                <input
                  type="radio"
                  name="passed"
                  value="no"
                  defaultChecked={values ? values.passed === "no" : !auto.passed}
                />{" "}
                Not passed
              </label>
            </div>
            {errors?.passed ? <p className="field-error">{errors.passed}</p> : null}
          </div>
          <div className="sm:col-span-2">
            <label className="label" htmlFor="reason">
              Reason for the change
            </label>
            <input
              id="reason"
              name="reason"
              maxLength={1000}
              className="field"
              defaultValue={values?.reason ?? ""}
              aria-invalid={errors?.reason ? true : undefined}
            />
            {errors?.reason ? <p className="field-error">{errors.reason}</p> : null}
          </div>
        </fieldset>
      ) : null}
      {errors ? <FormError message="Check the highlighted fields; nothing was saved." /> : null}
      <div>
        <SubmitButton pendingText="Saving…">{override ? "Save comment and grade" : "Save comment"}</SubmitButton>
      </div>
    </Form>
  );
}

export function ErrorBoundary() {
  return <GeneralErrorBoundary />;
}
