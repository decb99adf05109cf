import type { ItemResult } from "~/lib/lessons/grade";
import type { AsBuiltTaskView } from "~/lib/lessons/types";
import { PROSE } from "./prose";
import { ItemFeedback } from "./results";
import { RoofFigure } from "./roof-figure";

const mm = (m: number) => (Number.isFinite(m) ? `${Math.round(m * 1000)}` : "–");

/**
 * The as-built task: the design, the survey read against it (a plan of the points and a table of
 * their levels), and the findings asked for, as form fields `q:<id>` of the attempt form. The
 * answers are marked on the server against the engine's own as-built check.
 */
export function AsBuiltTaskPanel({ task, results }: { task: AsBuiltTaskView; results: ItemResult[] | null }) {
  const byId = new Map((results ?? []).map((r) => [r.id, r]));
  const f = task.figure;
  // The figure's SVG space is plan metres with y flipped; the points go on the same plan.
  const unit = f.unit || 1;
  return (
    <section aria-labelledby="task-heading" className="grid gap-4" data-testid="as-built-task">
      <div>
        <p className="text-xs font-medium uppercase tracking-widest text-accent">As-built task</p>
        <h2 id="task-heading" className="text-2xl font-bold tracking-tight">
          {task.title}
        </h2>
      </div>
      <div className={PROSE} dangerouslySetInnerHTML={{ __html: task.goalHtml }} />
      <div className="grid gap-4 lg:grid-cols-2">
        <RoofFigure f={f} />
        <figure className="card">
          <svg
            viewBox={f.viewBox}
            role="img"
            aria-label={`Plan of the ${task.survey.length} surveyed points`}
            className="h-auto w-full"
          >
            <path d={f.outline} fill="none" stroke="currentColor" strokeWidth={unit * 0.6} />
            {task.survey.map((p) => (
              <g key={p.label}>
                <circle cx={p.at[0]} cy={-p.at[1]} r={unit * 1.6} fill="currentColor" />
                <text x={p.at[0] + unit * 2} y={-p.at[1] - unit * 2} fontSize={unit * 6}>
                  {p.label}
                </text>
              </g>
            ))}
          </svg>
          <figcaption className="mt-2 text-sm text-ink-soft">Where the levels were taken.</figcaption>
        </figure>
      </div>
      <div className="card overflow-x-auto" tabIndex={0} aria-label="Survey table">
        <table className="w-full text-sm tabular-nums" data-testid="survey-table">
          <caption className="mb-2 text-left text-ink-soft">
            The survey: levels in mm above the outlet's level. Tolerance ±{mm(task.tolerance.deviation)} mm from the
            design; standing water allowed up to {mm(task.tolerance.pondDepth)} mm deep.
          </caption>
          <thead>
            <tr className="text-left">
              <th scope="col">Point</th>
              <th scope="col">x (m)</th>
              <th scope="col">y (m)</th>
              <th scope="col">Design (mm)</th>
              <th scope="col">Measured (mm)</th>
            </tr>
          </thead>
          <tbody>
            {task.survey.map((p) => (
              <tr key={p.label} className="border-t border-line">
                <th scope="row" className="text-left font-medium">
                  {p.label}
                </th>
                <td>{p.at[0]}</td>
                <td>{p.at[1]}</td>
                <td>{mm(p.design)}</td>
                <td>{mm(p.level)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <ol className="grid gap-3">
        {task.findings.map((q, i) => {
          const name = `q:${q.id}`;
          const result = byId.get(q.id);
          return (
            <li key={q.id} className="card" data-testid={`finding-${q.id}`}>
              <label htmlFor={`finding-${q.id}`} className="font-medium">
                <span className="mr-2 text-ink-soft">{i + 1}.</span>
                {q.label}
                {q.required && <span className="ml-2 text-xs text-ink-soft">(required)</span>}
              </label>
              {q.options ? (
                <select
                  id={`finding-${q.id}`}
                  name={name}
                  form="attempt-form"
                  className="field mt-2 block max-w-sm"
                  defaultValue=""
                >
                  <option value="">Choose…</option>
                  {q.options.map((o) => (
                    <option key={o.id} value={o.id}>
                      {o.text}
                    </option>
                  ))}
                </select>
              ) : (
                <input
                  id={`finding-${q.id}`}
                  name={name}
                  form="attempt-form"
                  className="field mt-2 block w-full max-w-sm"
                  placeholder={q.placeholder}
                  autoComplete="off"
                />
              )}
              {result && <ItemFeedback item={result} />}
            </li>
          );
        })}
      </ol>
      <details className="card">
        <summary className="cursor-pointer font-medium">Hints ({task.hints.length})</summary>
        <ol className="mt-2 list-decimal space-y-1 pl-5">
          {task.hints.map((h, i) => (
            <li key={i}>{h}</li>
          ))}
        </ol>
      </details>
    </section>
  );
}
