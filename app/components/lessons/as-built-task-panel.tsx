import type { ItemResult } from "~/lib/lessons/grade";
import type { AsBuiltTaskView } from "~/lib/lessons/types";
import { PROSE } from "./prose";
import { ItemFeedback } from "./results";
import { RoofFigure } from "./roof-figure";

const mm = (m: number) => (Number.isFinite(m) ? `${Math.round(m * 1000)}` : "–");

/** Rough width of a label in the SVG's units: a character is about 0.6 of the font size. */
const labelWidth = (text: string, font: number) => text.length * font * 0.6;

/**
 * The surveyed points on the roof's plan (the figure's SVG space: plan metres, y flipped). The
 * labels are sized to the closest two points, so on a dense survey (a joist end every 600 mm)
 * they do not run into each other: level when they fit between neighbours, else turned upright
 * and set outside the roof, the lower half's below it and the upper half's above.
 */
function SurveyPlan({ task }: { task: AsBuiltTaskView }) {
  const f = task.figure;
  const unit = f.unit || 1;
  const pts = task.survey;
  let closest = Infinity;
  for (let i = 0; i < pts.length; i++)
    for (let j = i + 1; j < pts.length; j++) {
      const d = Math.hypot(pts[i].at[0] - pts[j].at[0], pts[i].at[1] - pts[j].at[1]);
      if (d > 1e-9) closest = Math.min(closest, d);
    }
  if (!Number.isFinite(closest)) closest = unit * 20;
  const font = Math.min(unit * 4, closest * 0.5);
  const r = Math.min(unit * 1.6, closest * 0.2);
  const longest = Math.max(0, ...pts.map((p) => labelWidth(p.label, font)));
  const upright = longest > closest * 0.9;
  const [vx, vy, vw, vh] = f.viewBox.split(" ").map(Number);
  const ys = pts.map((p) => p.at[1]);
  const mid = (Math.min(...ys) + Math.max(...ys)) / 2;
  const gap = r * 1.5;
  // Room above and below the plan for upright labels.
  const room = upright ? longest + gap + r : font * 1.5;
  const viewBox = `${vx} ${vy - room} ${vw} ${vh + 2 * room}`;
  return (
    <svg
      viewBox={viewBox}
      role="img"
      aria-label={`Plan of the ${pts.length} surveyed points`}
      className="h-auto w-full"
    >
      {/* The figure's outline is a list of points (as the roof figure's polygon), not path data. */}
      <polygon points={f.outline} fill="none" stroke="currentColor" strokeWidth={unit * 0.6} />
      {pts.map((p) => {
        const [x, y] = [p.at[0], -p.at[1]];
        const below = p.at[1] <= mid;
        return (
          <g key={p.label}>
            <title>{p.label}</title>
            <circle cx={x} cy={y} r={r} fill="currentColor" />
            {upright ? (
              <text
                fontSize={font}
                textAnchor={below ? "end" : "start"}
                dominantBaseline="central"
                transform={`translate(${x} ${below ? y + r + gap : y - r - gap}) rotate(-90)`}
              >
                {p.label}
              </text>
            ) : (
              <text x={x} y={below ? y + r + font : y - r - font * 0.4} fontSize={font} textAnchor="middle">
                {p.label}
              </text>
            )}
          </g>
        );
      })}
    </svg>
  );
}

/**
 * The as-built task: the design, the survey read against it (a plan of the points and a table of
 * their levels), and the findings asked for, as form fields `q:<id>` of the attempt form. The
 * answers are marked on the server against the engine's own as-built check.
 */
export function AsBuiltTaskPanel({ task, results }: { task: AsBuiltTaskView; results: ItemResult[] | null }) {
  const byId = new Map((results ?? []).map((r) => [r.id, r]));
  const f = task.figure;
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
          <SurveyPlan task={task} />
          <figcaption className="mt-2 text-sm text-ink-soft">Where the levels were taken.</figcaption>
        </figure>
      </div>
      <div className="card overflow-x-auto" tabIndex={0} aria-label="Survey table">
        <table className="data-table w-full tabular-nums" data-testid="survey-table">
          <caption className="mb-2 text-left text-sm text-ink-soft">
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
              <tr key={p.label}>
                <th scope="row" className="whitespace-nowrap">
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
                  className="field mt-2 block w-full max-w-lg"
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
