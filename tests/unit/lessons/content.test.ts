/**
 * Issue 16, "Lesson content": the course's words are held to its own roofs.
 * - No quiz answer (a correct option's text, or the accepted answer) is printed in the lesson's body.
 * - Every roof task: the reference passes, the starting roof fails (lessons.test.ts), and the
 *   starting roof cannot pass the lesson even with every answer right (here).
 * - Each example input named in a goal or hint does what the text says. The examples are listed in
 *   EXAMPLES below with the lesson and the words they come from; the test finds those words in the
 *   file (so an edit that drops or changes them fails here) and reports their line.
 */
import fs from "node:fs";
import path from "node:path";
import matter from "gray-matter";
import { describe, expect, it } from "vitest";
import { analyse, parseSpec, type Analysis, type RoofSpec } from "~/engine";
import { gradeLesson, gradeTask } from "~/lib/lessons/grade";
import { loadLessons } from "~/lib/lessons/load.server";
import { rightFindings } from "~/lib/lessons/as-built-task";
import { roofTaskOf, type Lesson, type Question } from "~/lib/lessons/schema";

const dir = path.resolve("lessons");
const lessons = loadLessons(dir);
const lessonOf = (n: string) => lessons.find((l) => l.file.startsWith(`${n}-`))!;
const source = (l: Lesson) => fs.readFileSync(path.join(dir, l.file), "utf8");

/** The body as a reader sees it: lower case, one space between words, plain dashes and minus signs. */
const norm = (t: string) =>
  t
    .toLowerCase()
    .replace(/[‐-―−]/g, "-")
    .replace(/\*\*|`/g, "")
    .replace(/\s+/g, " ")
    .trim();

const escape = (t: string) => t.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");

/** Patterns that find a question's answer printed in a text. */
function answerPatterns(q: Question): { shown: string; re: RegExp }[] {
  if (q.kind === "choice") {
    const ids = Array.isArray(q.correct) ? q.correct : [q.correct];
    return ids.map((id) => {
      const text = norm(q.options.find((o) => o.id === id)!.text).replace(/[.]$/, "");
      return { shown: text, re: new RegExp(escape(text)) };
    });
  }
  if (q.kind === "ratio") {
    const [rise, run] = q.answer.split(":").map((s) => s.trim());
    return [{ shown: q.answer, re: new RegExp(`(?<![\\d.])${escape(rise)}\\s*:\\s*${escape(run)}(?![\\d])`) }];
  }
  // "90 mm", "0.64 kN/m^2": the number with its unit (written with a space or not, ² or ^2).
  const m = /^([\d.]+)\s*(.+)$/.exec(q.answer.trim())!;
  const unit = escape(m[2].toLowerCase()).replace("\\^2", "(?:\\^2|²)");
  return [{ shown: q.answer, re: new RegExp(`(?<![\\d.,])${escape(m[1])}\\s*${unit}(?![a-z])`) }];
}

describe("no quiz answer is printed in its lesson's body", () => {
  it.each(lessons.map((l) => [l.file, l] as const))("%s", (_f, l) => {
    const body = norm(matter(source(l)).content);
    for (const q of l.quiz) {
      for (const p of answerPatterns(q)) expect(body, `${q.id}: "${p.shown}" is in the body`).not.toMatch(p.re);
    }
  });

  it("the check finds an answer that is there (a test that can fail)", () => {
    const q = lessonOf("01").quiz.find((x) => x.kind === "numeric")!;
    const [p] = answerPatterns(q);
    expect(norm(`The drop is ${q.answer} here.`)).toMatch(p.re);
    expect(norm(`The drop is 1${q.answer} here.`)).not.toMatch(p.re);
    const choice = lessonOf("01").quiz.find((x) => x.kind === "choice")!;
    const [c] = answerPatterns(choice);
    expect(norm(`Remember: ${c.shown}.`)).toMatch(c.re);
  });
});

describe("every question has a hint of its own", () => {
  it.each(lessons.map((l) => [l.file, l] as const))("%s", (_f, l) => {
    for (const q of l.quiz) {
      expect(q.hint.length, q.id).toBeGreaterThan(20);
      for (const p of answerPatterns(q)) expect(norm(q.hint), `${q.id}: the hint gives the answer`).not.toMatch(p.re);
    }
  });
});

describe("a starting roof cannot pass its lesson, even with every answer right", () => {
  it.each(lessons.map((l) => [l.file, l] as const))("%s", (_f, l) => {
    const right = Object.fromEntries(l.quiz.map((q) => [q.id, q.kind === "choice" ? q.correct : q.answer]));
    if (l.task.kind === "as-built") {
      // Nothing found yet is the as-built task's "starting roof"; the engine's own findings pass.
      const blank = gradeLesson(l, right, null);
      if ("ok" in blank) throw new Error(blank.message);
      expect(blank.passed).toBe(false);
      const found = gradeLesson(l, { ...right, ...rightFindings(l.task) }, null);
      if ("ok" in found) throw new Error(found.message);
      expect(found).toMatchObject({ passed: true, score: 100 });
      return;
    }
    const start = gradeLesson(l, right, l.task.start);
    if ("ok" in start) throw new Error(start.message);
    expect(start.passed).toBe(false);
    const ref = gradeLesson(l, right, l.task.reference);
    if ("ok" in ref) throw new Error(ref.message);
    expect(ref).toMatchObject({ passed: true, score: 100 });
  });
});

type Spec = Record<string, unknown>;
interface Example {
  lesson: string;
  /** Words of the lesson file the example comes from (found in the file, line reported). */
  quote: string;
  /** The roof the words describe, from the task's starting roof. */
  roof: (start: Spec) => Spec;
  /** Criteria of the task that must pass, and that must fail, on that roof. */
  passes?: string[];
  fails?: string[];
  /** Figures the words state, measured on that roof. */
  measure?: (a: Analysis) => void;
}

const close = (got: number | undefined | null, want: number, tol: number, what: string) =>
  expect(Math.abs((got ?? NaN) - want), `${what}: ${got} against ${want} ± ${tol}`).toBeLessThanOrEqual(tol);
const fall = (baseFall: string) => (s: Spec) => ({ ...s, baseFall });
const outletsAt =
  (...xs: [number, number][]) =>
  (s: Spec) => ({ ...s, outlets: xs.map((at) => ({ at })) });
const all = (l: string) => gradeTaskIds(lessonOf(l));
function gradeTaskIds(l: Lesson): string[] {
  return roofTaskOf(l).criteria.map((c) => c.id);
}

const EXAMPLES: Example[] = [
  // 01: the four forms in the goal all pass; the window the goal names is where it says.
  ...["1:69", "0.83°", "1.45%", "14.5 mm/m"].map((f) => ({
    lesson: "01",
    quote: `\`${f}\``,
    roof: fall(f),
    passes: all("01"),
  })),
  { lesson: "01", quote: "from about 1:66.7 to about 1:70.7", roof: fall("1:66.9"), passes: all("01") },
  { lesson: "01", quote: "from about 1:66.7 to about 1:70.7", roof: fall("1:70.5"), passes: all("01") },
  { lesson: "01", quote: "from about 1:66.7 to about 1:70.7", roof: fall("1:66.4"), fails: ["height"] },
  { lesson: "01", quote: "from about 1:66.7 to about 1:70.7", roof: fall("1:71"), fails: ["fall-line"] },
  {
    lesson: "01",
    quote: "the longest fall line runs at about 1:212",
    roof: (s) => s,
    measure: (a) => close(a.shaped.longestFallLine?.ratio, 212, 2, "1:N"),
  },
  {
    lesson: "01",
    quote: "runs from a back corner to the outlet, about 8.5 m",
    roof: fall("1:68"),
    measure: (a) => close(a.shaped.longestFallLine?.length, 8.5, 0.2, "length"),
  },
  // 02: an outlet half-way along a parapet the joists run to (left or right) drains the roof.
  {
    lesson: "02",
    quote: "Put the outlet on one of those parapets, half-way along it.",
    roof: outletsAt([0, 3]),
    passes: all("02"),
  },
  {
    lesson: "02",
    quote: "Put the outlet on one of those parapets, half-way along it.",
    roof: outletsAt([12, 3]),
    passes: all("02"),
  },
  // 03: the outlet anywhere from about 6 m to 12 m along the front passes; the high level stays 150 mm.
  ...[6.2, 9, 11.8].map((x) => ({
    lesson: "03",
    quote: "Anywhere from about 6 m to 12 m along the front edge",
    roof: outletsAt([x, 0]),
    passes: all("03"),
  })),
  ...[4.5, 13.5].map((x) => ({
    lesson: "03",
    quote: "Anywhere from about 6 m to 12 m along the front edge",
    roof: outletsAt([x, 0]),
    fails: ["fall-line"],
  })),
  ...[0, 4.5, 13.5].map((x) => ({
    lesson: "03",
    quote: "The high level stays 150 mm wherever the outlet sits on the front edge.",
    roof: outletsAt([x, 0]),
    measure: (a: Analysis) => close(a.shaped.highLevel, 0.15, 1e-6, "H"),
  })),
  {
    lesson: "03",
    quote: "a fall line over 20 m long - flatter than 1:134",
    roof: (s) => s,
    measure: (a) => {
      expect(a.shaped.longestFallLine!.length).toBeGreaterThan(20);
      expect(a.shaped.longestFallLine!.ratio).toBeGreaterThan(134);
    },
  },
  // 04: two outlets at the quarter points pass; a third outlet costs the saving (the criterion can fail).
  {
    lesson: "04",
    quote: "a quarter of the way in from each end",
    roof: outletsAt([6, 0], [18, 0]),
    passes: all("04"),
  },
  {
    lesson: "04",
    quote: "A third outlet shortens the fall lines further, but it also shortens the gutter's runs",
    roof: outletsAt([4, 0], [12, 0], [20, 0]),
    passes: ["fall-line", "outlets"],
    fails: ["saving"],
  },
  // 05: outlet mid-way along a long parapet, joists across to the opposite one.
  {
    lesson: "05",
    quote: "Then turn the joists so they run from that parapet to the opposite one (8 m).",
    roof: (s) => ({ ...s, outlets: [{ at: [8, 0] }], joists: { spacing: 0.4, direction: [0, 1] } }),
    passes: all("05"),
  },
  {
    lesson: "05",
    quote: "The high level is over 260 mm",
    roof: (s) => s,
    measure: (a) => expect(a.shaped.highLevel).toBeGreaterThan(0.26),
  },
  // 06: a second outlet 4 m in, under the left wing; its joist spans 16 m, about 267 mm at 1:60.
  {
    lesson: "06",
    quote: "Half-way across the wing (4 m from the left corner)",
    roof: outletsAt([4, 0], [16, 0]),
    passes: all("06"),
  },
  {
    lesson: "06",
    quote: "spans 16 m; at 1:60 that is about 267 mm",
    roof: outletsAt([4, 0], [16, 0]),
    measure: (a) => close(a.shaped.highLevel, 16 / 60, 0.002, "H"),
  },
  {
    lesson: "06",
    quote: "a fall line over 22 m long, flatter than 1:160",
    roof: (s) => s,
    measure: (a) => {
      expect(a.shaped.longestFallLine!.length).toBeGreaterThan(22);
      expect(a.shaped.longestFallLine!.ratio).toBeGreaterThan(160);
    },
  },
  // 07: 1:62.5 keeps the drop within 120 mm, 1:62 does not; one outlet ~14 m, two under 10 m.
  { lesson: "07", quote: "120 mm over 7.5 m is 1:62.5", roof: fall("1:62.5"), passes: ["deepest-drop"] },
  { lesson: "07", quote: "Any base fall that flat or flatter", roof: fall("1:62"), fails: ["deepest-drop"] },
  {
    lesson: "07",
    quote: "With one outlet the longest fall line is 14 m",
    roof: (s) => s,
    measure: (a) => close(a.shaped.longestFallLine?.length, 14, 0.5, "length"),
  },
  {
    lesson: "07",
    quote: "with two it is under 10 m",
    roof: outletsAt([6, 0], [18, 0]),
    measure: (a) => expect(a.shaped.longestFallLine!.length).toBeLessThan(10),
  },
  {
    lesson: "07",
    quote: "the deepest drop is 125 mm",
    roof: (s) => s,
    measure: (a) => close(a.shaped.highLevel, 0.125, 1e-6, "H"),
  },
  // 08: two outlets take about 3.75 L/s each; three equal catchments 2.5 L/s each.
  {
    lesson: "08",
    quote: "With two outlets, each takes about 3.75 L/s",
    roof: (s) => s,
    measure: (a) => a.shaped.catchments.forEach((c) => close(c.flow, 3.75, 0.05, c.label)),
  },
  {
    lesson: "08",
    quote: "Three equal catchments take 2.5 L/s each.",
    roof: outletsAt([4, 0], [12, 0], [20, 0]),
    passes: all("08"),
    measure: (a) => a.shaped.catchments.forEach((c) => close(c.flow, 2.5, 0.05, c.label)),
  },
  // 09: the front edge (6, 5)-(0, 5) opened and the back-left outlet (0, 0) taken away.
  {
    lesson: "09",
    quote: "back-left corner, at (0, 0)",
    roof: (s) => s,
    measure: () => expect(roofTaskOf(lessonOf("09")).start).toMatchObject({ outlets: [{ at: [0, 0] }] }),
  },
  {
    lesson: "09",
    quote: "change the edge from (6, 5) to (0, 5) from parapet to eaves",
    roof: (s) => ({ ...s, edges: ["parapet", "parapet", "eaves", "parapet"], outlets: [] }),
    passes: all("09"),
  },
  // 10: 1:80 over 16 m is 200 mm; the longest fall line then about 16.5 m.
  {
    lesson: "10",
    quote: "At 1:80 the longest fall line is about 16.5 m with a 200 mm drop",
    roof: fall("1:80"),
    passes: all("10"),
    measure: (a) => {
      close(a.shaped.highLevel, 0.2, 1e-6, "H");
      close(a.shaped.longestFallLine?.length, 16.5, 0.5, "length");
    },
  },
  {
    lesson: "10",
    quote: "the shaped roof needs about 267 mm",
    roof: (s) => s,
    measure: (a) => close(a.shaped.highLevel, 0.267, 0.002, "H"),
  },
  // 11: joists along x (0°) drain the plant room; as set, the flattest line is about 1:300.
  {
    lesson: "11",
    quote: "Joists at 0° run along x, toward the left wall.",
    roof: (s) => ({ ...s, joists: { spacing: 0.4, direction: [1, 0] } }),
    passes: all("11"),
  },
  {
    lesson: "11",
    quote: "the\n    flattest fall line is about 1:300",
    roof: (s) => s,
    measure: (a) => expect(a.shaped.worstFallRatio ?? Infinity).toBeGreaterThan(200),
  },
  // 12: outlets at 3 m and 9 m leave no standing water behind the plant base.
  { lesson: "12", quote: "Try outlets at 3 m and 9 m", roof: outletsAt([3, 0], [9, 0]), passes: all("12") },
];

describe("each example named in a goal or hint does what the text says", () => {
  it.each(EXAMPLES.map((e, i) => [`${e.lesson} #${i}: ${e.quote.replace(/\s+/g, " ")}`, e] as const))(
    "%s",
    (_name, e) => {
      const l = lessonOf(e.lesson);
      const text = source(l);
      const at = text.indexOf(e.quote);
      expect(at, `"${e.quote}" is no longer in ${l.file}`).toBeGreaterThanOrEqual(0);
      const line = text.slice(0, at).split("\n").length;
      const task = roofTaskOf(l);
      const roof = e.roof(structuredClone(task.start) as Spec);
      const graded = gradeTask(task, roof);
      if (!graded.ok) throw new Error(`${l.file}:${line}: ${graded.message}`);
      const by = new Map(graded.items.map((i) => [i.id, i]));
      expect(by.has("fixed"), `${l.file}:${line}: the example changes what the task fixes`).toBe(false);
      for (const id of e.passes ?? [])
        expect(by.get(id)?.passed, `${l.file}:${line}: ${id}: ${by.get(id)?.feedback}`).toBe(true);
      for (const id of e.fails ?? [])
        expect(by.get(id)?.passed, `${l.file}:${line}: ${id}: ${by.get(id)?.feedback}`).toBe(false);
      if (e.measure) {
        const parsed = parseSpec(structuredClone(roof));
        if (!parsed.ok) throw new Error("spec");
        e.measure(analyse(parsed.spec as RoofSpec));
      }
    },
  );
});
