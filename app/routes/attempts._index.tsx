import { useLocale, When } from "~/components/dates";
import { Link } from "react-router";
import type { Route } from "./+types/attempts._index";
import { requirePermission } from "~/lib/auth.server";
import { db } from "~/lib/db.server";
import { listAttempts } from "~/lib/lessons/attempts.server";
import { gradesOfAttempts } from "~/lib/grades.server";
import { WHY_SHORT } from "~/lib/lessons/grading-rule";
import { formatWhen } from "~/lib/when";
import { GeneralErrorBoundary } from "~/components/error-boundary";
import { PassMark } from "~/components/lessons/results";
import { formatScore } from "~/lib/gradebook";
import { certificatesOf } from "~/lib/certificates/certificates.server";
import { MyCertificates } from "~/components/courses/my-certificates";

export const meta: Route.MetaFunction = () => [{ title: "My attempts · Fallwright" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requirePermission(request, "lessons:take");
  const attempts = await listAttempts(db(), user.id);
  const grades = await gradesOfAttempts(attempts.map((a) => a.id));
  const certificates = await certificatesOf(user.id);
  return {
    certificates,
    attempts: attempts.map((a) => ({
      grade: grades.get(a.id) ?? null,
      id: a.id,
      lesson: a.lesson,
      lessonTitle: a.lessonTitle,
      submittedAt: a.submittedAt,
      score: a.score,
      passed: a.passed,
      timeSpentSeconds: a.timeSpentSeconds,
      missedQuestions: a.results.quiz.flatMap((q, i) => (q.passed ? [] : [i + 1])),
      missedCriteria: a.results.task.filter((i) => !i.passed).map((i) => i.label),
    })),
  };
}

const minutes = (s: number) => (s < 60 ? `${s} s` : `${Math.round(s / 60)} min`);

export default function MyAttempts({ loaderData }: Route.ComponentProps) {
  const locale = useLocale();
  const { attempts, certificates } = loaderData;
  return (
    <div className="grid gap-6">
      <header>
        <p className="text-sm">
          <Link to="/lessons" className="underline">
            Lessons
          </Link>
        </p>
        <h1 className="text-display font-bold tracking-tight">My attempts</h1>
        <p className="mt-2 max-w-prose text-ink-soft">
          Every attempt you submitted, newest first, graded on the server. Open one to see each answer and criterion and
          to turn your roof in 3D.
        </p>
      </header>
      <MyCertificates certificates={certificates} />
      {attempts.length === 0 ? (
        <div className="card">
          <p>No attempts yet. Pick a lesson, answer its questions, shape its roof and submit.</p>
          <Link className="btn-primary mt-3" to="/lessons">
            Go to the lessons
          </Link>
        </div>
      ) : (
        <div className="card min-w-0 overflow-x-auto p-0 max-sm:p-2">
          <table className="data-table card-table w-full" data-testid="attempts-table">
            <caption className="sr-only">My attempts</caption>
            <thead>
              <tr>
                <th scope="col">Lesson</th>
                <th scope="col">Submitted</th>
                <th scope="col" className="text-right">
                  Score
                </th>
                <th scope="col">Result</th>
                <th scope="col">Not met</th>
                <th scope="col" className="text-right">
                  Time
                </th>
                <th scope="col">
                  <span className="sr-only">Open</span>
                </th>
              </tr>
            </thead>
            <tbody>
              {attempts.map((a) => (
                <tr key={a.id} className="align-top">
                  <td className="card-wide">
                    <Link className="font-medium underline" to={`/lessons/${a.lesson}`}>
                      {a.lessonTitle}
                    </Link>
                  </td>
                  <td className="whitespace-nowrap" data-label="Submitted">
                    <When iso={a.submittedAt} />
                  </td>
                  <td className="text-right font-medium" data-label="Score" data-testid="attempt-score">
                    {formatScore(a.grade?.score ?? a.score)}
                  </td>
                  <td data-label="Result" data-testid="attempt-result">
                    <span className="whitespace-nowrap">
                      <PassMark passed={a.grade?.passed ?? a.passed} />
                    </span>
                    {a.grade?.overridden ? (
                      <span className="ml-1 text-xs text-ink-soft">(changed by your trainer)</span>
                    ) : null}
                    {a.grade && !a.grade.passed && a.grade.why ? (
                      <div className="text-xs text-bad" title={a.grade.reason ?? undefined}>
                        {WHY_SHORT[a.grade.why]}
                      </div>
                    ) : null}
                  </td>
                  <td className="max-w-sm text-xs text-ink-soft" data-label="Not met">
                    {!a.missedQuestions.length && !a.missedCriteria.length ? "nothing" : null}
                    {a.missedQuestions.length > 0 && (
                      <div>
                        {a.missedQuestions.length === 1 ? "question" : "questions"} {a.missedQuestions.join(", ")}
                      </div>
                    )}
                    {a.missedCriteria.map((c) => (
                      <div key={c}>{c}</div>
                    ))}
                  </td>
                  <td
                    className="whitespace-nowrap text-right"
                    data-label="Time"
                    title="Measured in your browser; for information only"
                  >
                    {minutes(a.timeSpentSeconds)}
                  </td>
                  <td className="card-wide">
                    <Link
                      className="btn whitespace-nowrap"
                      to={`/attempts/${a.id}`}
                      aria-label={`Open the attempt at ${a.lessonTitle}, ${formatWhen(a.submittedAt, locale)}`}
                    >
                      Open
                    </Link>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}

export function ErrorBoundary() {
  return <GeneralErrorBoundary />;
}
