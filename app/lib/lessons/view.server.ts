import type { RoofSpec } from "../../engine";
import { parseSpec } from "../../engine/parse-spec";
import { asBuiltFacts, findingLabel, findingOptions, FINDING_KINDS } from "./as-built-task";
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
    criteria: l.task.kind === "as-built" ? l.task.findings.length : l.task.criteria.length,
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
    task: taskView(l),
  };
}

function taskView(l: Lesson): LessonView["task"] {
  const t = l.task;
  if (t.kind === "as-built") {
    const design = parseSpec(t.design);
    const facts = asBuiltFacts(t);
    const spec = (design.ok ? design.spec : t.design) as RoofSpec;
    return {
      kind: "as-built",
      title: t.title,
      goalHtml: renderMarkdown(t.goal),
      design: spec,
      // Index past any body figure: the cache keys figures by lesson version and place.
      figure: figureFor(l.version, 1000, { caption: "The design: falls and outlets", view: "plan", spec: t.design }),
      survey: t.survey.map((p, i) => ({
        label: p.label,
        at: p.at,
        level: p.level,
        design: facts.ok ? facts.result.deviations[i].design : Number.NaN,
      })),
      tolerance: {
        deviation: facts.ok ? facts.result.tolerance.deviation : Number.NaN,
        pondDepth: facts.ok ? facts.result.tolerance.pondDepth : Number.NaN,
      },
      findings: t.findings.map((f) => ({
        id: f.id,
        kind: f.kind,
        label: findingLabel(f),
        weight: f.weight,
        required: f.required,
        ...(FINDING_KINDS[f.kind].answer === "choice"
          ? { options: findingOptions(t, f) }
          : {
              placeholder:
                f.kind === "worstFix" ? "a change with its way: + packs up, − planes down (mm)" : "a depth in mm",
            }),
      })),
      hints: t.hints,
    };
  }
  return {
    kind: "roof",
    title: t.title,
    goalHtml: renderMarkdown(t.goal),
    start: t.start as RoofSpec,
    editable: t.editable,
    // Kind and limit too: the editor measures each criterion live (the server's grade still counts).
    criteria: t.criteria.map((c) => ({
      id: c.id,
      kind: c.kind,
      limit: c.limit,
      label: criterionLabel(c),
      weight: c.weight,
      required: c.required,
    })),
    hints: t.hints,
  };
}
