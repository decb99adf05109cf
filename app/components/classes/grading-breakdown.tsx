import { Check, X } from "lucide-react";
import { formatScore } from "~/lib/gradebook";

export interface BreakdownItem {
  id: string;
  section?: string;
  label?: string;
  passed: boolean;
  score: number;
  weight: number;
  feedback: string;
  measured: string | null;
  required?: boolean;
}

/** Reads the attempt's results: quiz and task items (older or partial shapes tolerated). */
export function breakdownItems(results: unknown): { quiz: BreakdownItem[]; task: BreakdownItem[] } {
  const r = (results ?? {}) as { quiz?: unknown; task?: unknown; criteria?: unknown };
  const list = (v: unknown) => (Array.isArray(v) ? (v.filter((i) => i && typeof i === "object" && "id" in i) as BreakdownItem[]) : []);
  if (Array.isArray(results)) return { quiz: [], task: list(results) };
  return { quiz: list(r.quiz), task: list(r.task ?? r.criteria) };
}

function Items({ title, items }: { title: string; items: BreakdownItem[] }) {
  if (!items.length) return null;
  return (
    <table className="data-table w-full">
      <caption className="py-1 text-left text-sm font-bold">{title}</caption>
      <thead>
        <tr>
          <th scope="col">Item</th>
          <th scope="col">Result</th>
          <th scope="col" className="text-right">Points</th>
          <th scope="col">Measured</th>
        </tr>
      </thead>
      <tbody>
        {items.map((i) => (
          <tr key={`${i.section ?? title}-${i.id}`} className="align-top">
            <td>
              <div className="font-medium">{i.label || i.id}{i.required ? <span className="ml-1 text-xs text-ink-soft">(required)</span> : null}</div>
              {i.feedback ? <div className="text-xs text-ink-soft">{i.feedback}</div> : null}
            </td>
            <td className="whitespace-nowrap">
              {i.passed ? (
                <span className="inline-flex items-center gap-1 text-ok"><Check aria-hidden="true" className="h-4 w-4" strokeWidth={3} />Met</span>
              ) : (
                <span className="inline-flex items-center gap-1 text-bad"><X aria-hidden="true" className="h-4 w-4" strokeWidth={3} />Not met</span>
              )}
            </td>
            <td className="whitespace-nowrap text-right">{formatScore(i.score)} / {formatScore(i.weight)}</td>
            <td>{i.measured ?? <span className="text-ink-soft">—</span>}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/** The per-criterion grading of an attempt, as the automatic grader recorded it. */
export function GradingBreakdown({ results }: { results: unknown }) {
  const { quiz, task } = breakdownItems(results);
  if (!quiz.length && !task.length) return <p className="text-sm text-ink-soft">No per-item results were recorded for this attempt.</p>;
  return (
    <div className="grid gap-4">
      <Items title="Roof task" items={task} />
      <Items title="Quiz" items={quiz} />
    </div>
  );
}
