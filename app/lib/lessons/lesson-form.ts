/**
 * The lesson editor's form (docs/authoring.md): what the page's fields hold, read from a posted
 * form, and turned into a lesson file's front matter. The form never validates a lesson itself:
 * the server writes the lesson file and reads it back with the start-up loader's own parser, so
 * the editor, import and the `lessons/` folder share one schema and one set of messages.
 */

export const QUESTION_KINDS = [
  { id: "numeric", label: "Number with a unit" },
  { id: "ratio", label: "Fall as a ratio 1:N" },
  { id: "single", label: "Choice, one right option" },
  { id: "multiple", label: "Choice, several right options" },
] as const;
export type QuestionFormKind = (typeof QUESTION_KINDS)[number]["id"];

export interface QuestionForm {
  kind: QuestionFormKind;
  id: string;
  prompt: string;
  /** numeric: "150 mm"; ratio: "1:80". */
  answer: string;
  /** numeric: "2 mm"; ratio: on N, "0.5". Empty: the loader's default. */
  tolerance: string;
  /** Choice: one option a line; a line starting with "*" is a right one. */
  options: string;
  explanation: string;
  hint: string;
  weight: string;
}

export interface CriterionForm {
  kind: string;
  value: string;
  weight: string;
  required: boolean;
  hint: string;
}

export interface LessonForm {
  title: string;
  summary: string;
  minutes: string;
  /** One a line. */
  objectives: string;
  passMark: string;
  body: string;
  quiz: QuestionForm[];
  task: {
    title: string;
    goal: string;
    /** Roof specs as JSON text. */
    start: string;
    reference: string;
    editable: string[];
    criteria: CriterionForm[];
    /** One a line. */
    hints: string;
  };
}

/** What the trainee may change in a roof task; the rest is locked (the loader's EDITABLE_KEYS). */
export const LOCKABLE = [
  { id: "outlets", label: "Outlets" },
  { id: "outletLevels", label: "Outlet levels" },
  { id: "baseFall", label: "Base fall" },
  { id: "edges", label: "Edges (parapet or eaves)" },
  { id: "joists", label: "Joist direction" },
  { id: "highLevel", label: "High level" },
  { id: "outline", label: "Outline" },
  { id: "openings", label: "Openings" },
] as const;

export const MAX_QUESTIONS = 30;
export const MAX_CRITERIA = 20;

export function blankQuestion(i: number): QuestionForm {
  return {
    kind: "numeric",
    id: `q${i + 1}`,
    prompt: "",
    answer: "",
    tolerance: "",
    options: "",
    explanation: "",
    hint: "",
    weight: "1",
  };
}

export function blankCriterion(): CriterionForm {
  return { kind: "noPonding", value: "", weight: "1", required: false, hint: "" };
}

const str = (form: FormData, name: string, max = 20_000) => String(form.get(name) ?? "").slice(0, max);

/** Reads the editor's fields (`title`, `quiz.0.prompt`, `task.criteria.1.kind`, ...) back into a form. */
export function readLessonForm(form: FormData): LessonForm {
  const quiz: QuestionForm[] = [];
  for (let i = 0; i < MAX_QUESTIONS && form.has(`quiz.${i}.kind`); i++) {
    const p = `quiz.${i}.`;
    const kind = str(form, `${p}kind`);
    quiz.push({
      kind: (QUESTION_KINDS.some((k) => k.id === kind) ? kind : "numeric") as QuestionFormKind,
      id: str(form, `${p}id`, 40) || `q${i + 1}`,
      prompt: str(form, `${p}prompt`, 2000),
      answer: str(form, `${p}answer`, 200),
      tolerance: str(form, `${p}tolerance`, 200),
      options: str(form, `${p}options`, 4000),
      explanation: str(form, `${p}explanation`, 4000),
      hint: str(form, `${p}hint`, 2000),
      weight: str(form, `${p}weight`, 20),
    });
  }
  const criteria: CriterionForm[] = [];
  for (let i = 0; i < MAX_CRITERIA && form.has(`task.criteria.${i}.kind`); i++) {
    const p = `task.criteria.${i}.`;
    criteria.push({
      kind: str(form, `${p}kind`, 60),
      value: str(form, `${p}value`, 60),
      weight: str(form, `${p}weight`, 20),
      required: form.get(`${p}required`) === "on",
      hint: str(form, `${p}hint`, 2000),
    });
  }
  return {
    title: str(form, "title", 300),
    summary: str(form, "summary", 1000),
    minutes: str(form, "minutes", 20),
    objectives: str(form, "objectives", 4000),
    passMark: str(form, "passMark", 20),
    body: str(form, "body", 200_000),
    quiz,
    task: {
      title: str(form, "task.title", 300),
      goal: str(form, "task.goal", 4000),
      start: str(form, "task.start", 100_000),
      reference: str(form, "task.reference", 100_000),
      editable: form
        .getAll("task.editable")
        .map(String)
        .filter((k) => LOCKABLE.some((l) => l.id === k)),
      criteria,
      hints: str(form, "task.hints", 4000),
    },
  };
}

const lines = (s: string) =>
  s
    .split(/\r?\n/)
    .map((l) => l.trim())
    .filter(Boolean);

/** "12" → 12; anything else stays text, so the schema names the field ("must be ... a number"). */
const num = (s: string): number | string | undefined => {
  const t = s.trim();
  if (!t) return undefined;
  return /^-?\d+(\.\d+)?$/.test(t) ? Number(t) : t;
};

/** Limit kinds whose value is a number in the lesson file (counts and percentages). */
const NUMBER_LIMITS = new Set(["maxOutlets", "minOutlets", "minEavesEdges", "flatShareAtMost"]);

/** One criterion of the engine's catalogue, as the editor offers it. */
export interface CatalogueEntry {
  id: string;
  label: string;
  limit: string;
  example: string;
}

export interface FormIssue {
  path: string;
  message: string;
}

/**
 * The front matter a form stands for, plus problems only the form can have (JSON that does not
 * parse, a single-choice question with two right options). Everything else is for the schema.
 */
export function frontMatterFromForm(f: LessonForm): { data: Record<string, unknown>; issues: FormIssue[] } {
  const issues: FormIssue[] = [];
  const json = (path: string, text: string): unknown => {
    if (!text.trim()) return undefined;
    try {
      return JSON.parse(text);
    } catch (e) {
      issues.push({ path, message: `is not valid JSON: ${(e as Error).message}` });
      return undefined;
    }
  };
  const quiz = f.quiz.map((q, i) => {
    const common = {
      id: q.id,
      prompt: q.prompt,
      weight: num(q.weight),
      explanation: q.explanation.trim() || undefined,
      hint: q.hint,
    };
    if (q.kind === "numeric")
      return { ...common, kind: "numeric", answer: q.answer, tolerance: q.tolerance.trim() || undefined };
    if (q.kind === "ratio") return { ...common, kind: "ratio", answer: q.answer, tolerance: num(q.tolerance) };
    const opts = lines(q.options).map((l, j) => ({
      id: String.fromCharCode(97 + j),
      text: l.replace(/^\*\s*/, ""),
      right: l.startsWith("*"),
    }));
    const right = opts.filter((o) => o.right).map((o) => o.id);
    if (!right.length)
      issues.push({ path: `quiz.${i}.options`, message: "mark the right option with * at the start of its line" });
    else if (q.kind === "single" && right.length > 1)
      issues.push({
        path: `quiz.${i}.options`,
        message: `mark exactly one right option (${right.length} are marked), or make it "several right options"`,
      });
    return {
      ...common,
      kind: "choice",
      options: opts.map(({ id, text }) => ({ id, text })),
      correct: q.kind === "multiple" ? right : right[0],
    };
  });
  const data = {
    title: f.title,
    summary: f.summary,
    minutes: num(f.minutes),
    objectives: lines(f.objectives),
    passMark: num(f.passMark),
    quiz,
    task: {
      title: f.task.title,
      goal: f.task.goal,
      start: json("task.start", f.task.start),
      reference: json("task.reference", f.task.reference),
      editable: f.task.editable,
      criteria: f.task.criteria.map((c, i) => ({
        id: `c${i + 1}`,
        kind: c.kind,
        value: NUMBER_LIMITS.has(c.kind) ? num(c.value) : c.value.trim() || undefined,
        weight: num(c.weight),
        required: c.required || undefined,
        hint: c.hint.trim() || undefined,
      })),
      hints: lines(f.task.hints),
    },
  };
  // YAML cannot write `undefined`: drop those keys, as the loader would never see them.
  return { data: JSON.parse(JSON.stringify(data)) as Record<string, unknown>, issues };
}

/** The form field an issue's path belongs to (`quiz.0.options.1.text` → `quiz.0.options`). */
export function fieldOf(path: string): string {
  const parts = path.split(".");
  if (parts[0] === "quiz") return parts.slice(0, 3).join(".");
  if (parts[0] === "task" && parts[1] === "criteria") return parts.slice(0, 4).join(".");
  if (parts[0] === "task") return parts.slice(0, 2).join(".");
  if (path.startsWith("body")) return "body";
  return parts[0];
}

/** One message per field (the first), for the page to show beside it. */
export function fieldErrors(issues: FormIssue[]): Record<string, string> {
  const out: Record<string, string> = {};
  for (const i of issues) out[fieldOf(i.path)] ??= i.message;
  return out;
}

/**
 * A ```roof figure block for a lesson body (YAML: caption, view, spec), drawn by the app from the
 * roof: the block a new lesson starts with, and the one "Add a figure from a saved roof" appends.
 */
export function roofFigureBlock(caption: string, spec: unknown): string {
  return ["```roof", `caption: ${JSON.stringify(caption)}`, "view: plan", `spec: ${JSON.stringify(spec)}`, "```"].join(
    "\n",
  );
}
