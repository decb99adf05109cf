import { z } from "zod";
import { parseSpec } from "../../engine/parse-spec";
import { CRITERION_KINDS, CRITERION_KIND_IDS, type LimitKind } from "./criteria";
import { asBuiltTaskSchema } from "./as-built-task";
import { authorQuantity, parseQuantity, parseRatio, quantityOf, sameDimension } from "./quantity";

const id = z
  .string({ error: "must be a short id such as q1" })
  .regex(/^[a-z0-9][a-z0-9-]{0,39}$/, "must be a short id of lower-case letters, digits and dashes, such as q1");
const text = (what: string) =>
  z
    .string({ error: `must be ${what}` })
    .trim()
    .min(1, `must not be empty (${what})`);

/** A roof spec inside a lesson: checked by the engine's own parser, so it must build. */
const roofSpec = z.unknown().superRefine((value, ctx) => {
  if (value == null) {
    ctx.addIssue({ code: "custom", message: "is missing: give a roof spec (outline, outlets, baseFall...)" });
    return;
  }
  // YAML 1.1 reads an unquoted 1:40 as the base-60 number 100, which the engine would take as 1:100.
  const v = value as { baseFall?: unknown; minFall?: unknown; gutter?: { fall?: unknown } };
  for (const [key, fall] of [
    ["baseFall", v.baseFall],
    ["minFall", v.minFall],
    ["gutter.fall", v.gutter?.fall],
  ] as const) {
    if (typeof fall === "number") {
      ctx.addIssue({
        code: "custom",
        message: `roof spec ${key}: write the fall as text in quotes, e.g. "1:40" (YAML reads 1:40 unquoted as the number 100)`,
      });
    }
  }
  const parsed = parseSpec(value);
  if (!parsed.ok) {
    for (const issue of parsed.error.issues.slice(0, 5)) {
      ctx.addIssue({ code: "custom", message: `roof spec ${issue.path}: ${issue.message}` });
    }
  }
});

const numericQuestion = z
  .object({
    id,
    kind: z.literal("numeric"),
    prompt: text("the question"),
    /** The right answer with its unit, as a person would write it: "250 mm", "2.5 %", "3.1 L/s". */
    answer: z.union([text("the answer with its unit, such as 250 mm"), z.number().transform(String)], {
      error: "must be the answer with its unit, such as 250 mm",
    }),
    /** Absolute tolerance in a unit of the same kind, e.g. "5 mm". */
    tolerance: z.string().optional(),
    /** Relative tolerance as a fraction, e.g. 0.02 for ±2 %. Default 0.01 when no tolerance is given. */
    relativeTolerance: z.number().min(0).max(0.5).optional(),
    /** A number typed without a unit is read in this unit (else the trainee is asked for a unit). */
    bareUnit: z.string().optional(),
    weight: z.number().positive().max(100).default(1),
    explanation: z.string().default(""),
    /** Said on request before answering: teaches the way to the answer without giving it. Every lesson question has one. */
    hint: z.string().trim().default(""),
  })
  .superRefine((q, ctx) => {
    const answer = parseQuantity(q.answer);
    if (!answer.ok) {
      ctx.addIssue({ code: "custom", path: ["answer"], message: `"${q.answer}" ${answer.error}` });
      return;
    }
    if (answer.bare) {
      ctx.addIssue({ code: "custom", path: ["answer"], message: `"${q.answer}" needs a unit (e.g. mm, m, %, °, L/s)` });
      return;
    }
    if (q.tolerance !== undefined) {
      const tol = parseQuantity(q.tolerance);
      if (!tol.ok || tol.bare || !sameDimension(tol.unit, answer.unit)) {
        ctx.addIssue({
          code: "custom",
          path: ["tolerance"],
          message: `"${q.tolerance}" must be a quantity of the same kind as the answer "${q.answer}"`,
        });
      }
    }
    if (q.bareUnit !== undefined) {
      let ok = false;
      try {
        ok = sameDimension(quantityOf(1, q.bareUnit), answer.unit);
      } catch {
        ok = false;
      }
      if (!ok)
        ctx.addIssue({
          code: "custom",
          path: ["bareUnit"],
          message: `"${q.bareUnit}" must be a unit of the same kind as the answer "${q.answer}"`,
        });
    }
  });

const ratioQuestion = z
  .object({
    id,
    kind: z.literal("ratio"),
    prompt: text("the question"),
    // A number here is YAML reading an unquoted 1:40 in base 60: refused below with a clear message.
    answer: z.union([text("the answer as a ratio such as 1:40"), z.number()], {
      error: 'must be the answer as a ratio in quotes, such as "1:40"',
    }),
    /** Tolerance on N (1:N). Default: 1 % of N. */
    tolerance: z.number().min(0).optional(),
    weight: z.number().positive().max(100).default(1),
    explanation: z.string().default(""),
    /** Said on request before answering: teaches the way to the answer without giving it. Every lesson question has one. */
    hint: z.string().trim().default(""),
  })
  .superRefine((q, ctx) => {
    if (typeof q.answer === "number") {
      ctx.addIssue({
        code: "custom",
        path: ["answer"],
        message: 'write the ratio in quotes, e.g. "1:40" (YAML reads 1:40 unquoted as the number 100)',
      });
      return;
    }
    const r = parseRatio(q.answer);
    if (!r.ok) ctx.addIssue({ code: "custom", path: ["answer"], message: `"${q.answer}" ${r.error}` });
  })
  .transform((q) => ({ ...q, answer: String(q.answer) }));

const choiceQuestion = z
  .object({
    id,
    kind: z.literal("choice"),
    prompt: text("the question"),
    options: z
      .array(z.object({ id, text: text("the option's text") }), { error: "must be a list of {id, text}" })
      .min(2, "needs at least two options")
      .max(8),
    /** One option id, or a list when several options are right (all must be picked). */
    correct: z.union([id, z.array(id).min(1)], { error: "must be an option id or a list of option ids" }),
    weight: z.number().positive().max(100).default(1),
    explanation: z.string().default(""),
    /** Said on request before answering: teaches the way to the answer without giving it. Every lesson question has one. */
    hint: z.string().trim().default(""),
  })
  .superRefine((q, ctx) => {
    const ids = q.options.map((o) => o.id);
    if (new Set(ids).size !== ids.length)
      ctx.addIssue({ code: "custom", path: ["options"], message: "option ids must be unique" });
    for (const c of Array.isArray(q.correct) ? q.correct : [q.correct]) {
      if (!ids.includes(c))
        ctx.addIssue({
          code: "custom",
          path: ["correct"],
          message: `"${c}" is not one of the option ids (${ids.join(", ")})`,
        });
    }
  });

export const questionSchema = z.discriminatedUnion("kind", [numericQuestion, ratioQuestion, choiceQuestion], {
  error: 'kind must be "numeric", "ratio" or "choice"',
});

const LIMIT_UNITS: Record<LimitKind, string> = {
  ratio: "",
  length: "m",
  area: "m^2",
  flow: "L/s",
  count: "",
  percent: "",
  none: "",
};

/** Reads an author's limit into the kind's base unit; null when it cannot. */
export function readLimit(kind: LimitKind, value: unknown): number | null {
  if (kind === "none") return 0;
  if (kind === "count") return typeof value === "number" && Number.isInteger(value) && value >= 0 ? value : null;
  if (kind === "percent") return typeof value === "number" && value >= 0 && value <= 100 ? value : null;
  if (kind === "ratio") {
    // Text only: YAML reads an unquoted 1:40 as the base-60 number 100.
    if (typeof value !== "string") return null;
    const r = parseRatio(value);
    return r.ok ? r.ratio : null;
  }
  if (typeof value !== "number" && typeof value !== "string") return null;
  const q = authorQuantity(value, LIMIT_UNITS[kind]);
  if (!q || !sameDimension(q, quantityOf(1, LIMIT_UNITS[kind]))) return null;
  const n = q.toNumber(LIMIT_UNITS[kind]);
  return Number.isFinite(n) && n >= 0 ? n : null;
}

const LIMIT_EXAMPLES: Record<LimitKind, string> = {
  ratio: 'a ratio in quotes such as "1:100" (unquoted, YAML reads 1:40 as the number 100)',
  length: 'a length such as "0.2 m" or "150 mm" (a bare number is metres)',
  area: 'an area such as "4 m^2" (a bare number is m²)',
  flow: 'a flow such as "2.5 L/s" (a bare number is L/s)',
  count: "a whole number",
  percent: "a percentage between 0 and 100 (a number)",
  none: "nothing",
};

export const criterionSchema = z
  .object({
    id,
    kind: z.enum(CRITERION_KIND_IDS, { error: `must be one of ${CRITERION_KIND_IDS.join(", ")}` }),
    value: z.union([z.string(), z.number()]).optional(),
    weight: z.number().positive().max(100).default(1),
    /** A required criterion must pass for the attempt to pass, whatever the total. */
    required: z.boolean().default(false),
    /** Overrides the generated label. */
    label: z.string().optional(),
    /** Said to the trainee when this criterion fails. */
    hint: z.string().optional(),
  })
  .transform((c, ctx) => {
    const kind = CRITERION_KINDS[c.kind];
    const limit = readLimit(kind.limit, c.value);
    if (limit == null) {
      ctx.addIssue({
        code: "custom",
        path: ["value"],
        message: `${c.kind} needs ${LIMIT_EXAMPLES[kind.limit]}; got ${JSON.stringify(c.value)}`,
      });
      return z.NEVER;
    }
    return { ...c, limit };
  });

/** Spec keys a trainee may change in a task; everything else must stay as the starting roof gives it. */
export const EDITABLE_KEYS = [
  "outlets",
  "outletLevels",
  "baseFall",
  "edges",
  "joists",
  "highLevel",
  "outline",
  "openings",
] as const;

export const roofTaskSchema = z.object({
  kind: z.literal("roof").default("roof"),
  id: id.default("task"),
  title: text("the task's title"),
  /** What the trainee is asked to do (Markdown). */
  goal: text("the goal stated to the trainee"),
  start: roofSpec,
  /** A roof that passes: kept so tests prove every task can be passed. */
  reference: roofSpec,
  editable: z
    .array(z.enum(EDITABLE_KEYS, { error: `must be one of ${EDITABLE_KEYS.join(", ")}` }))
    .default(["outlets", "baseFall"]),
  criteria: z.array(criterionSchema, { error: "must be a list of criteria" }).min(1, "needs at least one criterion"),
  hints: z.array(text("a hint"), { error: "must be a list of hints" }).min(1, "needs at least one hint"),
});

/**
 * The lesson's one hands-on task: a roof to shape (the default kind, `roof`), or an as-built
 * survey to read (`as-built`, app/lib/lessons/as-built-task.ts).
 */
export const taskSchema = z.preprocess(
  (v) => (v && typeof v === "object" && !Array.isArray(v) && !("kind" in v) ? { ...v, kind: "roof" } : v),
  z.discriminatedUnion("kind", [roofTaskSchema, asBuiltTaskSchema], {
    error: 'kind must be "roof" (the default) or "as-built"',
  }),
);

export const frontMatterSchema = z
  .object({
    title: text("the lesson's title"),
    summary: text("a one-line summary"),
    minutes: z.number({ error: "must be the expected minutes, a number" }).int().min(1).max(240),
    objectives: z
      .array(text("an objective"), { error: "must be a list of objectives" })
      .min(1, "needs at least one objective"),
    /** Total score (0-100) needed to pass the lesson. */
    passMark: z.number({ error: "must be a number from 0 to 100" }).min(0).max(100),
    quiz: z.array(questionSchema, { error: "must be a list of questions" }).min(1, "needs at least one question"),
    task: taskSchema,
  })
  .strict()
  .superRefine((l, ctx) => {
    const qids = l.quiz.map((q) => q.id);
    l.quiz.forEach((q, i) => {
      if (!q.hint)
        ctx.addIssue({
          code: "custom",
          path: ["quiz", i, "hint"],
          message: "every question needs a hint that teaches the way to the answer without giving it away",
        });
    });
    qids.forEach((q, i) => {
      if (qids.indexOf(q) !== i)
        ctx.addIssue({ code: "custom", path: ["quiz", i, "id"], message: `"${q}" is used twice` });
    });
    if (l.task.kind === "as-built") {
      // Findings are answered beside the quiz, in the same answers: their ids must differ.
      l.task.findings.forEach((f, i) => {
        if (qids.includes(f.id))
          ctx.addIssue({
            code: "custom",
            path: ["task", "findings", i, "id"],
            message: `"${f.id}" is also a question's id`,
          });
      });
      return;
    }
    const cids = l.task.criteria.map((c) => c.id);
    cids.forEach((c, i) => {
      if (cids.indexOf(c) !== i)
        ctx.addIssue({ code: "custom", path: ["task", "criteria", i, "id"], message: `"${c}" is used twice` });
      if (c === "fixed")
        ctx.addIssue({ code: "custom", path: ["task", "criteria", i, "id"], message: `"fixed" is reserved` });
    });
  });

export type FrontMatter = z.output<typeof frontMatterSchema>;
export type Question = z.output<typeof questionSchema>;
export type Criterion = z.output<typeof criterionSchema>;
/** A roof task (the default kind). */
export type Task = z.output<typeof roofTaskSchema>;
export type AnyTask = z.output<typeof taskSchema>;

/** A figure the app draws from a roof spec: the fenced ```roof block of a lesson body. */
export const FIGURE_VIEWS = ["plan", "catchments", "3d", "schedule", "compare", "figures"] as const;
export const figureSchema = z
  .object({
    caption: text("a caption"),
    view: z.enum(FIGURE_VIEWS, { error: `must be one of ${FIGURE_VIEWS.join(", ")}` }).default("plan"),
    spec: roofSpec,
  })
  .strict();
export type Figure = z.output<typeof figureSchema>;

/** A piece of the lesson body, ready to render. */
export type Block =
  { type: "html"; html: string } | { type: "roof"; figure: Figure } | { type: "caution"; html: string };

/** A lesson as the app keeps it: validated front matter, rendered body, version hash. */
export interface Lesson extends FrontMatter {
  slug: string;
  position: number;
  version: string;
  file: string;
  blocks: Block[];
}

/** The lesson's roof task; throws for a lesson whose task is of another kind (for code that needs a roof). */
export function roofTaskOf(l: { task: AnyTask; file?: string }): Task {
  if (l.task.kind !== "roof") throw new Error(`${l.file ?? "this lesson"} has an ${l.task.kind} task, not a roof task`);
  return l.task;
}
