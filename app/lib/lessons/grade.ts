/**
 * Grading, pure: quiz answers through mathjs units and tolerances; roof tasks by running the
 * engine again on the submitted spec. The browser's own figures are never trusted.
 */
import { analyse, formatRatio, parseSpec } from "../../engine";
import type { Analysis, RoofSpec } from "../../engine/types";
import { gradeAsBuiltTask } from "./as-built-task";
import { checkCriterion, CRITERION_KINDS, formatLimit } from "./criteria";
import { changedFixedKeys } from "./fixed-parts";
import { BLANK_QUIZ_LABEL, cappedScore } from "./grading-rule";
import { dimensionName, parseQuantity, parseRatio, quantityOf, sameDimension, valueIn } from "./quantity";
import type { Criterion, FrontMatter, Question, Task } from "./schema";

export { changedFixedKeys } from "./fixed-parts";
export { failedRequiredOf } from "./grading-rule";

/** One graded item: a quiz question or a task criterion. `score` is the points earned (0..weight). */
export interface ItemResult {
  id: string;
  section: "quiz" | "task";
  label: string;
  passed: boolean;
  score: number;
  weight: number;
  feedback: string;
  measured: string | null;
  required?: boolean;
}

export interface GradeResult {
  /** 0-100, rounded to one decimal: the score that counts (capped when a required check failed, see grading-rule.ts). */
  score: number;
  /** The points share before any cap (absent on attempts graded before the cap existed). */
  rawScore?: number;
  passed: boolean;
  passMark: number;
  quiz: ItemResult[];
  task: ItemResult[];
  /** Headline figures of the graded roof, for the attempt view. */
  roof: { highLevel: number; longestFallRatio: number | null; outlets: number } | null;
}

export type Answers = Record<string, string | string[]>;

// Ratios and levels from the engine carry float noise: a roof exactly at the limit passes.
const EPS = 1e-9;

/** "0.49 kN/m^2" as people write it: "0.49 kN/m²". */
const pretty = (text: string) => text.replace(/\^2\b/g, "²").replace(/\^3\b/g, "³");

export function gradeNumeric(
  q: Extract<Question, { kind: "numeric" }>,
  given: string | undefined,
): Omit<ItemResult, "section" | "label"> {
  const base = { id: q.id, weight: q.weight };
  const fail = (feedback: string, measured: string | null = given ?? null) => ({
    ...base,
    passed: false,
    score: 0,
    feedback,
    measured,
  });
  if (!given || !given.trim()) return fail("No answer given.", null);
  const expected = parseQuantity(q.answer);
  if (!expected.ok || expected.bare)
    return fail("This question cannot be marked (its answer is malformed); tell your trainer.");
  const read = parseQuantity(given);
  if (!read.ok) return fail(`"${given}" ${read.error}.`);
  let unit = read.bare ? null : read.unit;
  if (read.bare) {
    if (!q.bareUnit)
      return fail(`"${given}" has no unit. Give ${dimensionName(expected.unit)}, for example ${q.answer}.`);
    unit = quantityOf(read.number, q.bareUnit);
  }
  if (!unit || !sameDimension(unit, expected.unit)) {
    return fail(`"${given}" is ${dimensionName(unit!)}, but the question asks for ${dimensionName(expected.unit)}.`);
  }
  const want = expected.unit.toNumber(expected.unit.formatUnits());
  const got = valueIn(unit, expected.unit);
  let tol: number;
  if (q.tolerance) {
    const t = parseQuantity(q.tolerance);
    tol = t.ok && !t.bare ? Math.abs(valueIn(t.unit, expected.unit)) : 0;
  } else {
    tol = Math.abs(want) * (q.relativeTolerance ?? 0.01);
  }
  const ok = Math.abs(got - want) <= tol + EPS * Math.max(1, Math.abs(want));
  const shown = `${Number(got.toPrecision(6))} ${expected.unit.formatUnits()}`.replace("cm / m", "%");
  const answer = pretty(q.answer);
  if (ok)
    return {
      ...base,
      passed: true,
      score: q.weight,
      feedback: `Right: ${answer}.${q.explanation ? ` ${q.explanation}` : ""}`,
      measured: pretty(shown),
    };
  return fail(
    `Not quite: you gave ${given.trim()}; the answer is ${answer}.${q.explanation ? ` ${q.explanation}` : ""}`,
    pretty(shown),
  );
}

export function gradeRatio(
  q: Extract<Question, { kind: "ratio" }>,
  given: string | undefined,
): Omit<ItemResult, "section" | "label"> {
  const base = { id: q.id, weight: q.weight };
  const expected = parseRatio(q.answer);
  if (!given || !given.trim())
    return { ...base, passed: false, score: 0, feedback: "No answer given.", measured: null };
  const read = parseRatio(given);
  if (!expected.ok)
    return {
      ...base,
      passed: false,
      score: 0,
      feedback: "This question cannot be marked; tell your trainer.",
      measured: given,
    };
  if (!read.ok)
    return {
      ...base,
      passed: false,
      score: 0,
      feedback: `"${given}" ${read.error}, written like ${q.answer}.`,
      measured: given,
    };
  const tol = q.tolerance ?? expected.ratio * 0.01;
  const ok = Math.abs(read.ratio - expected.ratio) <= tol + EPS * expected.ratio;
  const shown = formatRatio(read.ratio);
  const why = q.explanation ? ` ${q.explanation}` : "";
  return ok
    ? { ...base, passed: true, score: q.weight, feedback: `Right: ${q.answer}.${why}`, measured: shown }
    : {
        ...base,
        passed: false,
        score: 0,
        feedback: `Not quite: you gave ${shown}; the answer is ${q.answer}.${why}`,
        measured: shown,
      };
}

export function gradeChoice(
  q: Extract<Question, { kind: "choice" }>,
  given: string | string[] | undefined,
): Omit<ItemResult, "section" | "label"> {
  const base = { id: q.id, weight: q.weight };
  const correct = new Set(Array.isArray(q.correct) ? q.correct : [q.correct]);
  const picked = new Set(
    (Array.isArray(given) ? given : given ? [given] : []).filter((g) => typeof g === "string" && g.trim() !== ""),
  );
  const textOf = (id: string) => q.options.find((o) => o.id === id)?.text ?? id;
  const why = q.explanation ? ` ${q.explanation}` : "";
  const measured = picked.size ? [...picked].map(textOf).join("; ") : null;
  if (!picked.size) return { ...base, passed: false, score: 0, feedback: "No answer picked.", measured };
  const ok = picked.size === correct.size && [...picked].every((p) => correct.has(p));
  if (ok) return { ...base, passed: true, score: q.weight, feedback: `Right.${why}`, measured };
  const right = [...correct].map(textOf).join("; ");
  return { ...base, passed: false, score: 0, feedback: `Not quite: the answer is "${right}".${why}`, measured };
}

export function gradeQuestion(q: Question, given: string | string[] | undefined): ItemResult {
  const label = q.prompt;
  if (q.kind === "choice") return { section: "quiz", label, ...gradeChoice(q, given) };
  const one = Array.isArray(given) ? given[0] : given;
  if (q.kind === "ratio") return { section: "quiz", label, ...gradeRatio(q, one) };
  return { section: "quiz", label, ...gradeNumeric(q, one) };
}

/** The label a criterion shows, generated from its kind and limit unless the author wrote one. */
export function criterionLabel(c: Criterion): string {
  const kind = CRITERION_KINDS[c.kind];
  return c.label ?? kind.label(formatLimit(kind.limit, c.limit));
}

export function gradeCriterion(c: Criterion, analysis: Analysis, spec: RoofSpec): ItemResult {
  const { passed, measured } = checkCriterion(c, analysis, spec);
  const label = criterionLabel(c);
  const feedback = passed
    ? `Measured: ${measured.text}.`
    : `Measured: ${measured.text}. Needed: ${label.charAt(0).toLowerCase()}${label.slice(1)}.${c.hint ? ` ${c.hint}` : ""}`;
  return {
    id: c.id,
    section: "task",
    label,
    passed,
    score: passed ? c.weight : 0,
    weight: c.weight,
    feedback,
    measured: measured.text,
    required: c.required || undefined,
  };
}

const KEY_WORDS: Record<string, string> = {
  baseFall: "base fall",
  highLevel: "high level",
  outline: "outline",
  edges: "edge kinds",
  joists: "joists",
  outlets: "outlets",
};

export type TaskGrade =
  | { ok: true; items: ItemResult[]; analysis: Analysis; spec: RoofSpec }
  | { ok: false; status: 400 | 422; message: string; issues: { path: string; message: string }[] };

/** Re-runs the engine on the submitted roof and measures every criterion. */
export function gradeTask(task: Task, submitted: unknown): TaskGrade {
  const parsed = parseSpec(submitted);
  if (!parsed.ok)
    return { ok: false, status: parsed.status, message: parsed.error.message, issues: parsed.error.issues };
  const start = parseSpec(task.start);
  if (!start.ok)
    return { ok: false, status: 422, message: "This task's starting roof is broken; tell your trainer.", issues: [] };
  const spec = parsed.spec;
  const analysis = analyse(spec);
  const items = task.criteria.map((c) => gradeCriterion(c, analysis, spec));
  const changed = changedFixedKeys(task, start.spec, spec);
  if (changed.length) {
    const words = changed.map((k) => KEY_WORDS[k] ?? k).join(", ");
    items.unshift({
      id: "fixed",
      section: "task",
      label: "Keep what the task fixes",
      passed: false,
      score: 0,
      weight: 0,
      required: true,
      feedback: `You changed the ${words}, which this task keeps as given. Reset the roof, then change only what the goal asks for.`,
      measured: words,
    });
  }
  return { ok: true, items, analysis, spec };
}

/** True when a question has an answer: text that is not blank, or at least one picked option. */
export function isAnswered(given: string | string[] | undefined): boolean {
  if (Array.isArray(given)) return given.some((g) => typeof g === "string" && g.trim() !== "");
  return typeof given === "string" && given.trim() !== "";
}

/** Grades a whole lesson attempt: every question and the roof task, by the rule in grading-rule.ts. */
export function gradeLesson(
  lesson: Pick<FrontMatter, "quiz" | "task" | "passMark">,
  answers: Answers,
  submitted: unknown,
): GradeResult | Extract<TaskGrade, { ok: false }> {
  // An as-built task is answered in the answers beside the quiz; the roof sent is not marked.
  const task =
    lesson.task.kind === "as-built" ? gradeAsBuiltTask(lesson.task, answers) : gradeTask(lesson.task, submitted);
  if (!task.ok) return task;
  const quiz = lesson.quiz.map((q) => gradeQuestion(q, answers[q.id]));
  const all = [...quiz, ...task.items];
  const weight = all.reduce((s, i) => s + i.weight, 0);
  const earned = all.reduce((s, i) => s + i.score, 0);
  const rawScore = weight > 0 ? Math.round((1000 * earned) / weight) / 10 : 0;
  // Rule 2 of grading-rule.ts: a blank quiz scores 0, whatever the roof earned (the task's
  // points alone once gave a blank quiz 55.6 of 100).
  const blankQuiz = lesson.quiz.length > 0 && lesson.quiz.every((q) => !isAnswered(answers[q.id]));
  if (blankQuiz)
    quiz.unshift({
      id: "quiz-answered",
      section: "quiz",
      label: BLANK_QUIZ_LABEL,
      passed: false,
      score: 0,
      weight: 0,
      required: true,
      feedback:
        "No question was answered. A blank quiz scores 0, whatever the roof earns: answer the quiz and submit again.",
      measured: null,
    });
  const requiredMet = !blankQuiz && all.every((i) => !i.required || i.passed);
  const score = blankQuiz ? 0 : requiredMet ? rawScore : cappedScore(rawScore, lesson.passMark);
  return {
    score,
    rawScore,
    passed: requiredMet && score >= lesson.passMark,
    passMark: lesson.passMark,
    quiz,
    task: task.items,
    roof:
      "analysis" in task
        ? {
            highLevel: task.analysis.shaped.highLevel,
            longestFallRatio: task.analysis.shaped.longestFallLine?.ratio ?? null,
            outlets: task.spec.outlets.length,
          }
        : null,
  };
}
