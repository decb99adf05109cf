import { Check, X } from "lucide-react";
import { failedRequiredOf, type GradeResult, type ItemResult } from "~/lib/lessons/grade";
import { readGrade } from "~/lib/lessons/grading-rule";

const fmt = (n: number) => (Number.isInteger(Math.round(n * 10) / 10) ? String(Math.round(n)) : n.toFixed(1));

/** Pass or fail said with an icon and a word, never by colour alone. */
export function PassMark({ passed, label }: { passed: boolean; label?: string }) {
  return passed ? (
    <span className="inline-flex items-center gap-1 font-medium text-ok">
      <Check aria-hidden="true" className="h-4 w-4" strokeWidth={3} />
      {label ?? "Passed"}
    </span>
  ) : (
    <span className="inline-flex items-center gap-1 font-medium text-bad">
      <X aria-hidden="true" className="h-4 w-4" strokeWidth={3} />
      {label ?? "Not passed"}
    </span>
  );
}

/** One graded question or criterion: mark, feedback, what was measured. */
export function ItemFeedback({ item }: { item: ItemResult }) {
  return (
    <div
      className={`mt-2 rounded border px-3 py-2 text-sm ${item.passed ? "border-ok/40 bg-ok/5" : "border-bad/40 bg-bad/5"}`}
      data-testid={`feedback-${item.section}-${item.id}`}
    >
      <div className="flex flex-wrap items-center justify-between gap-2">
        <PassMark
          passed={item.passed}
          label={
            item.passed
              ? item.section === "quiz"
                ? "Right"
                : "Met"
              : item.section === "quiz"
                ? "Not right"
                : "Not met"
          }
        />
        <span className="text-xs tabular-nums text-ink-soft">
          {fmt(item.score)} / {fmt(item.weight)} {item.weight === 1 ? "point" : "points"}
          {item.required ? " · required" : ""}
        </span>
      </div>
      <p className="mt-1">{item.feedback}</p>
    </div>
  );
}

/** The headline of a graded attempt: total score against the pass mark, and each part's share. */
export function ScoreSummary({ result, heading = "Your result" }: { result: GradeResult; heading?: string }) {
  const part = (items: ItemResult[]) => `${items.filter((i) => i.passed).length} of ${items.length}`;
  const grade = readGrade({
    score: result.score,
    passed: result.passed,
    passMark: result.passMark,
    failedRequired: failedRequiredOf(result),
  });
  const points = result.rawScore ?? result.score;
  return (
    <div
      className={`rounded border-2 px-4 py-3 ${grade.passed ? "border-ok bg-ok/5" : "border-bad bg-bad/5"}`}
      role="status"
      data-testid="score-summary"
    >
      <p className="text-xs font-medium uppercase tracking-wide text-ink-soft">{heading}</p>
      {grade.reason ? (
        <p className="mt-1 font-medium text-bad" data-testid="grade-reason">
          {grade.reason}
        </p>
      ) : null}
      <p className="mt-1 flex flex-wrap items-baseline gap-x-4 gap-y-1">
        <span className="text-3xl font-bold tabular-nums" data-testid="grade-score">
          {fmt(grade.score)}
          <span className="text-base font-normal text-ink-soft"> / 100</span>
        </span>
        <PassMark passed={grade.passed} label={grade.passed ? "Passed" : `Not passed (pass mark ${result.passMark})`} />
      </p>
      <p className="mt-1 text-sm text-ink-soft">
        Quiz: {part(result.quiz)} right · {/* An as-built task grades no roof (docs/grading.md). */}
        {result.roof === null
          ? `Survey check: ${part(result.task)} findings right`
          : `Roof task: ${part(result.task)} criteria met`}
        {grade.why === "required" && points !== grade.score
          ? ` · points earned ${fmt(points)}, capped at ${fmt(grade.score)}`
          : ""}
      </p>
    </div>
  );
}

/** Every graded item of an attempt, quiz and task, as a table (used on the attempt page). */
export function ResultsTable({ result }: { result: GradeResult }) {
  const rows = [...result.task, ...result.quiz];
  return (
    <table className="data-table w-full">
      <caption className="sr-only">Graded items of this attempt</caption>
      <thead>
        <tr>
          <th scope="col">Part</th>
          <th scope="col">Item</th>
          <th scope="col">Result</th>
          <th scope="col" className="text-right">
            Points
          </th>
        </tr>
      </thead>
      <tbody>
        {rows.map((i) => (
          <tr key={`${i.section}-${i.id}`} className="align-top">
            <td className="whitespace-nowrap">
              {i.section === "quiz" ? "Quiz" : result.roof === null ? "Survey check" : "Roof task"}
            </td>
            <td>
              <div className="font-medium">
                {i.label}
                {i.required ? <span className="ml-1 text-xs text-ink-soft">(required)</span> : null}
              </div>
              <div className="text-xs text-ink-soft">{i.feedback}</div>
            </td>
            <td className="whitespace-nowrap">
              <PassMark passed={i.passed} label={i.passed ? "Met" : "Not met"} />
            </td>
            <td className="whitespace-nowrap text-right">
              {fmt(i.score)} / {fmt(i.weight)}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
