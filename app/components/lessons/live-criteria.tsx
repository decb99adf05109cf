import { Check, Circle, X } from "lucide-react";
import type { RoofSpec } from "~/engine";
import { checkCriterion } from "~/lib/lessons/criteria";
import { changedFixedKeys } from "~/lib/lessons/fixed-parts";
import type { RoofTaskView } from "~/lib/lessons/types";
import { useSandbox } from "~/components/sandbox/state/store";

type TaskView = RoofTaskView;

/**
 * Each criterion measured live on the roof being shaped, by the engine running in the browser.
 * A guide only: the grade that counts is the server's, made when the attempt is submitted.
 */
export function LiveCriteria({ task }: { task: TaskView }) {
  const analysis = useSandbox((s) => s.analysis);
  const spec = useSandbox((s) => s.analysedSpec);
  const current = useSandbox((s) => s.spec);
  const computing = useSandbox((s) => s.computing || s.analysedSpec !== s.spec);
  const changed = changedFixedKeys(task, task.start, current as RoofSpec);
  return (
    <section className="card mb-4" aria-labelledby="live-criteria-heading" data-testid="live-criteria">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h3 id="live-criteria-heading" className="font-bold">
          Checks while you work
        </h3>
        <span className="text-xs text-ink-soft">
          {computing ? "measuring…" : "measured in your browser; the grade comes from the server when you submit"}
        </span>
      </div>
      <ul className="mt-2 grid gap-1 text-sm" aria-live="polite">
        {task.criteria.map((c) => {
          const result = analysis && spec ? checkCriterion(c, analysis, spec) : null;
          const state = result == null ? "unknown" : result.passed ? "met" : "not-met";
          return (
            <li key={c.id} className="flex items-start gap-2" data-testid={`live-${c.id}`} data-state={state}>
              {state === "met" ? (
                <Check aria-hidden="true" className="mt-0.5 h-4 w-4 shrink-0 text-ok" strokeWidth={3} />
              ) : state === "not-met" ? (
                <X aria-hidden="true" className="mt-0.5 h-4 w-4 shrink-0 text-bad" strokeWidth={3} />
              ) : (
                <Circle aria-hidden="true" className="mt-0.5 h-4 w-4 shrink-0 text-ink-soft" />
              )}
              <span>
                <span className="font-medium">
                  {state === "met" ? "Met" : state === "not-met" ? "Not met" : "Not measured yet"}:
                </span>{" "}
                {c.label}
                {result ? <span className="text-ink-soft"> · {result.measured.text}</span> : null}
                {c.required ? <span className="text-xs text-ink-soft"> (required)</span> : null}
              </span>
            </li>
          );
        })}
        <li className="flex items-start gap-2" data-testid="live-fixed" data-state={changed.length ? "not-met" : "met"}>
          {changed.length ? (
            <X aria-hidden="true" className="mt-0.5 h-4 w-4 shrink-0 text-bad" strokeWidth={3} />
          ) : (
            <Check aria-hidden="true" className="mt-0.5 h-4 w-4 shrink-0 text-ok" strokeWidth={3} />
          )}
          <span>
            <span className="font-medium">{changed.length ? "Not met" : "Met"}:</span> Keep what the task fixes
            {changed.length ? <span className="text-ink-soft"> · changed: {changed.join(", ")}</span> : null}
            <span className="text-xs text-ink-soft"> (required)</span>
          </span>
        </li>
      </ul>
    </section>
  );
}
