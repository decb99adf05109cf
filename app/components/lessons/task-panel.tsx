import { useMemo } from "react";
import { RotateCcw } from "lucide-react";
import { changedFixedKeys } from "~/lib/lessons/fixed-parts";
import type { Locks } from "~/components/sandbox/state/store";
import { LiveCriteria } from "./live-criteria";
import type { RoofSpec } from "~/engine";
import type { ItemResult } from "~/lib/lessons/grade";
import type { RoofTaskView } from "~/lib/lessons/types";
import { ResetRoofButton } from "~/components/sandbox/inputs/reset-roof-button";
import { SandboxWorkspace } from "~/components/sandbox/workspace";
import { ItemFeedback } from "./results";
import { PROSE } from "./prose";

const EDITABLE_WORDS: Record<string, string> = {
  outlets: "the outlets (move, add, remove)",
  outletLevels: "outlet levels",
  baseFall: "the base fall",
  edges: "the edge kinds (parapet or open)",
  joists: "the joists (direction and spacing)",
  highLevel: "the high level",
  outline: "the outline",
};

/** The parts of a roof a task may leave open (lessons/README.md, `editable`). */
const PARTS = ["outline", "edges", "outlets", "outletLevels", "baseFall", "joists", "highLevel"];

/** What the task fixes, for the editor to lock: any edit that would change one of them is refused. */
function taskLocks(task: RoofTaskView): Locks {
  const allowed = task.editable.map((e) => EDITABLE_WORDS[e] ?? e).join(", ");
  return {
    parts: PARTS.filter((p) => !task.editable.includes(p)),
    why: `This task asks you to change only ${allowed}; the rest is the roof as given.`,
    check(before, after) {
      const already = new Set(changedFixedKeys(task, task.start, before));
      return changedFixedKeys(task, task.start, after).filter((k) => !already.has(k));
    },
  };
}

function ResetRoof({ start }: { start: RoofSpec }) {
  return (
    <ResetRoofButton spec={start} notice="Back to the task's starting roof (Undo returns yours).">
      <RotateCcw aria-hidden="true" className="h-4 w-4" /> Starting roof
    </ResetRoofButton>
  );
}

/** The hands-on roof task: goal, what will be checked, hints, and the sandbox to do it in. */
export function TaskPanel({
  slug,
  version,
  task,
  results,
  onSpecChange,
  submitBar,
}: {
  slug: string;
  version: string;
  task: RoofTaskView;
  results: ItemResult[] | null;
  onSpecChange: (spec: RoofSpec) => void;
  /** Shown between the goal and the sandbox, so the submit button is near the roof being shaped. */
  submitBar: React.ReactNode;
}) {
  const byId = new Map((results ?? []).map((r) => [r.id, r]));
  const fixed = byId.get("fixed");
  const locks = useMemo(() => taskLocks(task), [task]);
  return (
    <section aria-labelledby="task-heading" className="grid gap-4">
      <div>
        <p className="text-xs font-medium uppercase tracking-widest text-accent">Roof task</p>
        <h2 id="task-heading" className="text-2xl font-bold tracking-tight">
          {task.title}
        </h2>
      </div>
      <div className="grid items-start gap-4 lg:grid-cols-[3fr_2fr]">
        <div className={`card ${PROSE}`} dangerouslySetInnerHTML={{ __html: task.goalHtml }} />
        <div className="card grid content-start gap-3">
          <div>
            <h3 className="font-bold">What will be checked</h3>
            <ul className="mt-2 grid gap-2">
              {task.criteria.map((c) => (
                <li key={c.id} data-testid={`criterion-${c.id}`}>
                  <span className="font-medium">{c.label}</span>
                  <span className="ml-1 text-xs text-ink-soft">
                    ({c.weight} {c.weight === 1 ? "point" : "points"}
                    {c.required ? ", required" : ""})
                  </span>
                  {byId.get(c.id) && <ItemFeedback item={byId.get(c.id)!} />}
                </li>
              ))}
            </ul>
            {fixed && <ItemFeedback item={fixed} />}
          </div>
          <p className="text-sm text-ink-soft">
            You may change {task.editable.map((e) => EDITABLE_WORDS[e] ?? e).join(", ")}. Everything else must stay as
            the task gives it.
          </p>
          <details className="text-sm">
            <summary className="cursor-pointer font-medium">Hints ({task.hints.length})</summary>
            <ol className="mt-2 list-decimal space-y-1 pl-5">
              {task.hints.map((h, i) => (
                <li key={i}>{h}</li>
              ))}
            </ol>
          </details>
        </div>
      </div>
      {submitBar}
      <SandboxWorkspace
        initialSpec={task.start}
        onSpecChange={onSpecChange}
        restoreKey={`fallwright:lesson:${slug}:${version.slice(0, 12)}`}
        toolbarExtra={<ResetRoof start={task.start} />}
        locks={locks}
        panel={<LiveCriteria task={task} />}
      />
    </section>
  );
}
