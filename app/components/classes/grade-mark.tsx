import { Check, Minus, PenLine, X } from "lucide-react";
import { cellStatus, formatScore, STATUS_LABELS, type GradeCell } from "~/lib/gradebook";
import { WHY_SHORT } from "~/lib/lessons/grading-rule";

/** Score and pass/fail told by an icon and a word, not by colour alone. */
export function GradeMark({ cell, compact = false }: { cell: GradeCell | null | undefined; compact?: boolean }) {
  const status = cellStatus(cell);
  const Icon = status === "passed" ? Check : status === "failed" ? X : Minus;
  const tone = status === "passed" ? "text-ok" : status === "failed" ? "text-bad" : "text-ink-soft";
  return (
    <span className="inline-flex items-center gap-1.5 whitespace-nowrap">
      <Icon aria-hidden="true" className={`h-4 w-4 shrink-0 ${tone}`} strokeWidth={3} />
      {cell ? <span className="font-medium tabular-nums">{formatScore(cell.score)}</span> : null}
      <span className={compact ? "sr-only" : `text-xs ${tone}`} title={cell?.reason ?? undefined}>
        {STATUS_LABELS[status]}
        {cell && !cell.passed && cell.why ? `: ${WHY_SHORT[cell.why]}` : null}
      </span>
      {cell?.overridden ? (
        <span
          className="inline-flex items-center gap-0.5 rounded border border-ink-soft px-1 text-[10px] uppercase tracking-wide text-ink-soft"
          title="The trainer changed this grade"
        >
          <PenLine aria-hidden="true" className="h-3 w-3" />
          override
        </span>
      ) : null}
    </span>
  );
}
