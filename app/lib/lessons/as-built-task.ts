/**
 * The as-built lesson task (docs/grading.md, "As-built tasks"): the trainee reads a survey of a
 * built deck against its design and says what is wrong. Nothing is marked against an author's
 * answer: the right answers come from the engine's own as-built check (docs/as-built.md) on the
 * task's design and survey, so the grade and the check on a real roof cannot disagree.
 */
import { z } from "zod";
import { asBuilt, type AsBuiltResult, type Point, type RoofSpec, type SurveyPoint } from "../../engine";
import { parseSpec } from "../../engine/parse-spec";
import { authorQuantity, quantityOf, sameDimension } from "./quantity";

/** What a trainee is asked to find, one kind per question of the task. */
export const FINDING_KINDS = {
  worstEnd: { answer: "choice", label: "Which point is furthest from the design" },
  worstFix: { answer: "change", label: "What to do at that point, and by how much" },
  pondAt: { answer: "choice", label: "Where water stands deepest" },
  pondDepth: { answer: "length", label: "How deep the deepest water stands" },
  verdict: { answer: "choice", label: "Accept or reject the deck" },
} as const;
export type FindingKind = keyof typeof FINDING_KINDS;
const FINDING_KIND_IDS = Object.keys(FINDING_KINDS) as [FindingKind, ...FindingKind[]];

/** A reading of a level is good to about ±2 mm on site: the default margin on an amount (common practice, no source). */
export const DEFAULT_FINDING_TOLERANCE = 0.002;

const id = z
  .string({ error: "must be a short id such as worst-end" })
  .regex(/^[a-z0-9][a-z0-9-]{0,39}$/, "must be a short id of lower-case letters, digits and dashes");
const text = (what: string) =>
  z
    .string({ error: `must be ${what}` })
    .trim()
    .min(1, `must not be empty (${what})`);

/** A length written by an author ("10 mm", "0.01 m", or a bare number in metres), in metres. */
const length = (what: string) =>
  z.union([z.string(), z.number()]).transform((v, ctx) => {
    const q = authorQuantity(v, "m");
    const m = q && sameDimension(q, quantityOf(1, "m")) ? q.toNumber("m") : NaN;
    if (!Number.isFinite(m) || m < 0) {
      ctx.addIssue({ code: "custom", message: `must be ${what}, a length such as "10 mm"; got ${JSON.stringify(v)}` });
      return z.NEVER;
    }
    return m;
  });

const findingSchema = z.object({
  id,
  kind: z.enum(FINDING_KIND_IDS, { error: `must be one of ${FINDING_KIND_IDS.join(", ")}` }),
  /** Overrides the kind's question. */
  label: z.string().trim().min(1).optional(),
  /** For worstFix and pondDepth: how far off an amount may be. Default 2 mm. */
  tolerance: length("the margin on the amount").optional(),
  weight: z.number().positive().max(100).default(1),
  required: z.boolean().default(false),
});
export type Finding = z.output<typeof findingSchema>;

const surveyPointSchema = z.object({
  label: text("the point's label, e.g. J3 start"),
  at: z.tuple([z.number(), z.number()], { error: "must be a plan point [x, y] in metres" }),
  level: z.number({ error: "must be the measured level in metres" }),
});

export const asBuiltTaskSchema = z
  .object({
    kind: z.literal("as-built"),
    id: id.default("task"),
    title: text("the task's title"),
    goal: text("the goal stated to the trainee"),
    /** The roof as designed (a roof spec): the survey is read against it. */
    design: z.unknown(),
    /** The measured dataset: levels on site at labelled plan points, metres on the design's datum. */
    survey: z.array(surveyPointSchema, { error: "must be a list of { label, at: [x, y], level }" }).min(3).max(400),
    tolerance: z
      .object({
        deviation: length("the deviation allowed").optional(),
        pondDepth: length("the depth of standing water allowed").optional(),
      })
      .strict()
      .default({}),
    findings: z.array(findingSchema, { error: "must be a list of findings" }).min(1, "needs at least one finding"),
    hints: z.array(text("a hint"), { error: "must be a list of hints" }).min(1, "needs at least one hint"),
  })
  .strict()
  .superRefine((t, ctx) => {
    const spec = parseSpec(t.design);
    if (!spec.ok) {
      for (const issue of spec.error.issues.slice(0, 5))
        ctx.addIssue({ code: "custom", path: ["design"], message: `roof spec ${issue.path}: ${issue.message}` });
      return;
    }
    const labels = t.survey.map((p) => p.label);
    labels.forEach((l, i) => {
      if (labels.indexOf(l) !== i)
        ctx.addIssue({ code: "custom", path: ["survey", i, "label"], message: `"${l}" is used twice` });
    });
    const fids = t.findings.map((f) => f.id);
    fids.forEach((f, i) => {
      if (fids.indexOf(f) !== i)
        ctx.addIssue({ code: "custom", path: ["findings", i, "id"], message: `"${f}" is used twice` });
    });
    const facts = asBuiltFacts({ ...t, design: spec.spec });
    if (!facts.ok) {
      ctx.addIssue({ code: "custom", path: ["survey"], message: facts.message });
      return;
    }
    // An answer must be one: two points equally far out cannot be told apart.
    if (t.findings.some((f) => f.kind === "worstEnd" || f.kind === "worstFix")) {
      const sorted = [...facts.result.deviations].sort((a, b) => Math.abs(b.delta) - Math.abs(a.delta));
      if (sorted.length > 1 && Math.abs(sorted[0].delta) - Math.abs(sorted[1].delta) < 0.001)
        ctx.addIssue({
          code: "custom",
          path: ["survey"],
          message: `the two points furthest out (${sorted[0].label}, ${sorted[1].label}) are within 1 mm of each other; make one clearly worst`,
        });
    }
  });
export type AsBuiltTask = z.output<typeof asBuiltTaskSchema>;

export interface AsBuiltFacts {
  ok: true;
  result: AsBuiltResult;
  /** The point furthest from the design, its deviation (measured − design) and the change that puts it right. */
  worst: { label: string; delta: number; change: number };
  /** The deepest pond past the tolerance, at its labelled point; null when none. */
  pond: { label: string; depth: number } | null;
  accept: boolean;
}

const surveyOf = (t: Pick<AsBuiltTask, "survey">): SurveyPoint[] =>
  t.survey.map((p) => ({ at: [p.at[0], p.at[1]] as Point, level: p.level, label: p.label }));

/** Runs the engine's as-built check on a task: the answers every finding is marked against. */
export function asBuiltFacts(
  t: Pick<AsBuiltTask, "survey" | "tolerance"> & { design: unknown },
): AsBuiltFacts | { ok: false; message: string } {
  const spec = parseSpec(t.design);
  if (!spec.ok) return { ok: false, message: "the design roof cannot be built" };
  const checked = asBuilt(spec.spec, surveyOf(t), {
    ...(t.tolerance.deviation !== undefined ? { deviation: t.tolerance.deviation } : {}),
    ...(t.tolerance.pondDepth !== undefined ? { pondDepth: t.tolerance.pondDepth } : {}),
  });
  if (!checked.ok) return { ok: false, message: checked.issues.map((i) => `${i.path}: ${i.message}`).join("; ") };
  const r = checked.result;
  const worst = r.deviations.reduce((a, b) => (Math.abs(b.delta) > Math.abs(a.delta) ? b : a));
  const deep = r.surface.ponds
    .filter((p) => p.depth > r.tolerance.pondDepth + 1e-9)
    .reduce<AsBuiltResult["surface"]["ponds"][number] | null>((a, b) => (!a || b.depth > a.depth ? b : a), null);
  const nearest = (at: Point) =>
    r.deviations.reduce((a, b) =>
      Math.hypot(b.at[0] - at[0], b.at[1] - at[1]) < Math.hypot(a.at[0] - at[0], a.at[1] - at[1]) ? b : a,
    );
  return {
    ok: true,
    result: r,
    worst: { label: worst.label ?? "", delta: worst.delta, change: -worst.delta },
    pond: deep ? { label: nearest(deep.at).label ?? "", depth: deep.depth } : null,
    accept: r.verdict.passed,
  };
}

/** The options a choice finding offers: every labelled point (and "no water stands"), or accept / reject. */
export function findingOptions(
  t: Pick<AsBuiltTask, "survey">,
  f: Pick<Finding, "kind">,
): { id: string; text: string }[] {
  if (f.kind === "verdict")
    return [
      { id: "accept", text: "Accept: the membrane can go down" },
      { id: "reject", text: "Reject: put the deck right first" },
    ];
  const points = t.survey.map((p) => ({ id: p.label, text: p.label }));
  return f.kind === "pondAt" ? [{ id: "none", text: "Nowhere: no water stands past the limit" }, ...points] : points;
}

export const findingLabel = (f: Pick<Finding, "kind" | "label">) => f.label ?? FINDING_KINDS[f.kind].label;

const mm = (m: number) => `${Math.round(Math.abs(m) * 1000)} mm`;
const signedMm = (m: number) => `${m > 0 ? "+" : m < 0 ? "−" : ""}${mm(m)}`;
const way = (change: number) => (change > 0 ? "packed up" : "planed down");

/**
 * Reads a change at a joist end: "+15 mm", "-12", "pack up 15 mm", "plane down 0.012 m". A bare
 * number is millimetres. The direction must be said: a sign, or pack/raise/up, plane/lower/down.
 */
export function readChange(given: string): { ok: true; metres: number } | { ok: false; error: string } {
  const t = given
    .trim()
    .toLowerCase()
    .replace(/\u2212/g, "-");
  const m = /([+-]?)\s*(\d+(?:[.,]\d+)?)\s*(mm|cm|m)?\b/.exec(t);
  if (!m) return { ok: false, error: `"${given.trim()}" has no amount: write it like +5 mm or plane down 5 mm` };
  const rest = t.replace(m[0], " ");
  if (/\d/.test(rest)) return { ok: false, error: `"${given.trim()}" has more than one number: give one change` };
  const up = /\b(pack|packing|packed|raise|up)\b/.test(rest);
  const down = /\b(plane|planing|planed|lower|down|grind)\b/.test(rest);
  let sign = m[1] === "+" ? 1 : m[1] === "-" ? -1 : 0;
  if (up && down) return { ok: false, error: `"${given.trim()}" says both up and down` };
  if (up || down) {
    const said = up ? 1 : -1;
    if (sign !== 0 && sign !== said) return { ok: false, error: `"${given.trim()}": the sign and the words disagree` };
    sign = said;
  }
  const n = Number(m[2].replace(",", "."));
  if (sign === 0 && n !== 0)
    return {
      ok: false,
      error: `"${given.trim()}" does not say which way: + (or pack up) raises the point, − (or plane down) lowers it`,
    };
  const unit = m[3] ?? "mm";
  const metres = (sign || 1) * n * (unit === "mm" ? 0.001 : unit === "cm" ? 0.01 : 1);
  return { ok: true, metres };
}

/** A length answer ("7 mm", "0.007 m", a bare number in mm), in metres. */
function readLength(given: string): { ok: true; metres: number } | { ok: false; error: string } {
  const t = given.trim().toLowerCase();
  const m = /^(\d+(?:[.,]\d+)?)\s*(mm|cm|m)?$/.exec(t);
  if (!m) return { ok: false, error: `"${given.trim()}" is not a depth: write it like 4 mm` };
  const unit = m[2] ?? "mm";
  return { ok: true, metres: Number(m[1].replace(",", ".")) * (unit === "mm" ? 0.001 : unit === "cm" ? 0.01 : 1) };
}

export interface FindingResult {
  passed: boolean;
  feedback: string;
  measured: string | null;
}

/** Marks one finding against the engine's facts; every failure says why. */
export function gradeFinding(
  t: Pick<AsBuiltTask, "survey">,
  f: Finding,
  facts: AsBuiltFacts,
  given: string | string[] | undefined,
): FindingResult {
  const one = (Array.isArray(given) ? given[0] : given)?.trim() ?? "";
  if (!one) return { passed: false, feedback: "No answer given.", measured: null };
  const r = facts.result;
  const tol = r.tolerance;
  const devOf = (label: string) => r.deviations.find((d) => d.label === label);
  const describe = (label: string) => {
    const d = devOf(label);
    if (!d) return label;
    return Math.abs(d.delta) < 0.0005
      ? `${label} is on its design level`
      : `${label} is ${mm(d.delta)} ${d.delta < 0 ? "low" : "high"}`;
  };
  const w = facts.worst;
  switch (f.kind) {
    case "worstEnd": {
      if (!devOf(one)) return { passed: false, feedback: `"${one}" is not a point of this survey.`, measured: one };
      if (one === w.label)
        return { passed: true, feedback: `Right: ${describe(w.label)}, the furthest from the design.`, measured: one };
      return {
        passed: false,
        feedback: `Not this one: ${describe(one)}. The furthest out is ${describe(w.label)}. Compare measured with design at every point, then take the largest difference whichever its sign.`,
        measured: one,
      };
    }
    case "worstFix": {
      const read = readChange(one);
      if (!read.ok) return { passed: false, feedback: `${read.error}.`, measured: one };
      const margin = f.tolerance ?? DEFAULT_FINDING_TOLERANCE;
      const shown = signedMm(read.metres);
      if (Math.sign(read.metres) !== Math.sign(w.change))
        return {
          passed: false,
          feedback: `Wrong way: ${describe(w.label)}, so it is ${way(w.change)}, not ${read.metres > 0 ? "packed up" : "planed down"}: ${signedMm(w.change)}.`,
          measured: shown,
        };
      if (Math.abs(read.metres - w.change) > margin + 1e-9)
        return {
          passed: false,
          feedback: `Right way, wrong amount: you gave ${shown}; ${describe(w.label)}, so it is ${way(w.change)} ${mm(w.change)} (${signedMm(w.change)}, within ±${mm(margin)}).`,
          measured: shown,
        };
      return {
        passed: true,
        feedback: `Right: ${describe(w.label)}, so it is ${way(w.change)} ${mm(w.change)}.`,
        measured: shown,
      };
    }
    case "pondAt": {
      const want = facts.pond?.label ?? "none";
      const options = findingOptions(t, f).map((o) => o.id);
      if (!options.includes(one))
        return { passed: false, feedback: `"${one}" is not one of the choices.`, measured: one };
      const pondWords = facts.pond
        ? `water stands deepest at ${facts.pond.label}, ${mm(facts.pond.depth)} below the level where it spills out`
        : `no water stands deeper than the ${mm(tol.pondDepth)} allowed`;
      if (one === want) return { passed: true, feedback: `Right: ${pondWords}.`, measured: one };
      const picked = one === "none" ? "You said no water stands" : `${describe(one)}, but water runs off it`;
      return {
        passed: false,
        feedback: `${picked}; ${pondWords}. Look for a point lower than every point around it.`,
        measured: one,
      };
    }
    case "pondDepth": {
      const read = readLength(one);
      if (!read.ok) return { passed: false, feedback: `${read.error}.`, measured: one };
      const want = facts.pond?.depth ?? 0;
      const margin = f.tolerance ?? DEFAULT_FINDING_TOLERANCE;
      const shown = `${Math.round(read.metres * 10000) / 10} mm`;
      if (Math.abs(read.metres - want) <= margin + 1e-9)
        return { passed: true, feedback: `Right: ${mm(want)} deep.`, measured: shown };
      return {
        passed: false,
        feedback: `You gave ${shown}; the water stands ${mm(want)} deep (within ±${mm(margin)}): the lowest point round the pond that water can leave by, less the pond's lowest point.`,
        measured: shown,
      };
    }
    case "verdict": {
      if (one !== "accept" && one !== "reject")
        return { passed: false, feedback: `"${one}" is not one of the choices.`, measured: one };
      const why = facts.accept
        ? `every point is within ±${mm(tol.deviation)} of the design and no water stands past ${mm(tol.pondDepth)}`
        : r.verdict.failures
            .slice(0, 2)
            .map((x) => x.message)
            .join(" ");
      const right = facts.accept ? "accept" : "reject";
      if (one === right) return { passed: true, feedback: `Right: ${right} — ${why}`, measured: one };
      return {
        passed: false,
        feedback: facts.accept
          ? `This deck passes: ${why}. Rejecting it would hold up the roof for nothing.`
          : `This deck must be rejected: ${why}`,
        measured: one,
      };
    }
  }
}

/** The task's items, marked: one per finding, in the task section of the grade. */
export function gradeAsBuiltTask(
  t: AsBuiltTask,
  answers: Record<string, string | string[]>,
): { ok: true; items: FindingItem[]; spec: RoofSpec } | { ok: false; status: 422; message: string; issues: [] } {
  const facts = asBuiltFacts(t);
  const spec = parseSpec(t.design);
  if (!facts.ok || !spec.ok)
    return { ok: false, status: 422, message: "This task's survey cannot be checked; tell your trainer.", issues: [] };
  const items = t.findings.map((f) => {
    const g = gradeFinding(t, f, facts, answers[f.id]);
    return {
      id: f.id,
      section: "task" as const,
      label: findingLabel(f),
      passed: g.passed,
      score: g.passed ? f.weight : 0,
      weight: f.weight,
      feedback: g.feedback,
      measured: g.measured,
      ...(f.required ? { required: true } : {}),
    };
  });
  return { ok: true, items, spec: spec.spec };
}

export interface FindingItem {
  id: string;
  section: "task";
  label: string;
  passed: boolean;
  score: number;
  weight: number;
  feedback: string;
  measured: string | null;
  required?: boolean;
}

/** Right answers, as a trainee would give them: for the lesson tests, never sent to a browser. */
export function rightFindings(t: AsBuiltTask): Record<string, string> {
  const facts = asBuiltFacts(t);
  if (!facts.ok) return {};
  const out: Record<string, string> = {};
  for (const f of t.findings) {
    out[f.id] =
      f.kind === "worstEnd"
        ? facts.worst.label
        : f.kind === "worstFix"
          ? signedMm(facts.worst.change).replace("−", "-")
          : f.kind === "pondAt"
            ? (facts.pond?.label ?? "none")
            : f.kind === "pondDepth"
              ? `${Math.round((facts.pond?.depth ?? 0) * 10000) / 10} mm`
              : facts.accept
                ? "accept"
                : "reject";
  }
  return out;
}
