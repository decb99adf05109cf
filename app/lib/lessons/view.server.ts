import type { RoofSpec } from "../../engine";
import { renderInline, renderMarkdown } from "./body";
import { figureFor } from "./figures.server";
import { criterionLabel } from "./grade";
import type { Lesson } from "./schema";
import type { LessonSummary, LessonView } from "./types";

export type { LessonSummary, LessonView };

export function lessonSummary(l: Lesson): LessonSummary {
  return {
    slug: l.slug,
    title: l.title,
    summary: l.summary,
    minutes: l.minutes,
    position: l.position,
    version: l.version,
    questions: l.quiz.length,
    criteria: l.task.criteria.length,
    passMark: l.passMark,
  };
}

// Neutral on purpose: an example number could give the answer away.
const PLACEHOLDER = { numeric: "a number with its unit", ratio: "1:N" } as const;

export function lessonView(l: Lesson): LessonView {
  let figure = 0;
  return {
    ...lessonSummary(l),
    objectives: l.objectives,
    blocks: l.blocks.map((b) =>
      b.type === "roof" ? { type: "roof" as const, figure: figureFor(l.version, figure++, b.figure) } : b,
    ),
    quiz: l.quiz.map((q) => ({
      id: q.id,
      kind: q.kind,
      promptHtml: renderInline(q.prompt),
      hintHtml: renderInline(q.hint),
      weight: q.weight,
      ...(q.kind === "choice"
        ? {
            options: q.options.map((o) => ({ id: o.id, html: renderInline(o.text) })),
            multiple: Array.isArray(q.correct),
          }
        : {
            placeholder:
              q.kind === "numeric" && q.bareUnit ? `a number in ${q.bareUnit}, or with its unit` : PLACEHOLDER[q.kind],
          }),
    })),
    task: {
      title: l.task.title,
      goalHtml: renderMarkdown(l.task.goal),
      start: l.task.start as RoofSpec,
      editable: l.task.editable,
      // Kind and limit too: the editor measures each criterion live (the server's grade still counts).
      criteria: l.task.criteria.map((c) => ({
        id: c.id,
        kind: c.kind,
        limit: c.limit,
        label: criterionLabel(c),
        weight: c.weight,
        required: c.required,
      })),
      hints: l.task.hints,
    },
  };
}
