import path from "node:path";
import { describe, expect, it } from "vitest";
import { asBuiltTaskSchema, gradeAsBuiltTask, readChange, rightFindings } from "~/lib/lessons/as-built-task";
import { gradeLesson } from "~/lib/lessons/grade";
import { readGrade, failedRequiredOf } from "~/lib/lessons/grading-rule";
import { loadLessons, parseLessonFile } from "~/lib/lessons/load.server";
import { lessonView } from "~/lib/lessons/view.server";

// The 4 m x 2 m roof of tests/unit/engine/as-built.test.ts (one outlet at (2, 0), 1:40, joists
// 0.4 m apart): by the level-rim rule the front edge is at |x - 2| / 40 and the back edge at the
// high level 50 mm. The survey is the joist ends at their design levels, with J4 start (1.2, 0),
// designed at 0.8 / 40 = 20 mm, built 15 mm low at 5 mm: it is the worst point, water stands
// over it to the level of J5 start (1.6, 0) at 10 mm, 5 mm deep, and it is packed up 15 mm.
const design = {
  outline: [
    [0, 0],
    [4, 0],
    [4, 2],
    [0, 2],
  ],
  outlets: [{ at: [2, 0] }],
  baseFall: "1:40",
  joists: { spacing: 0.4 },
};
const survey = Array.from({ length: 11 }, (_, k) => {
  const x = Math.round(k * 0.4 * 10) / 10;
  return [
    { label: `J${k + 1} start`, at: [x, 0], level: Math.abs(x - 2) / 40 - (k === 3 ? 0.015 : 0) },
    { label: `J${k + 1} end`, at: [x, 2], level: 0.05 },
  ];
}).flat();
const findings = [
  { id: "worst-end", kind: "worstEnd" },
  { id: "worst-fix", kind: "worstFix" },
  { id: "pond-at", kind: "pondAt" },
  { id: "pond-depth", kind: "pondDepth" },
  { id: "verdict", kind: "verdict", required: true },
];
const task = asBuiltTaskSchema.parse({
  kind: "as-built",
  title: "Check the deck",
  goal: "Find what is wrong.",
  design,
  survey,
  // A 4 mm water limit, so the 5 mm pond fails it (docs/as-built.md: deeper than the limit fails).
  tolerance: { deviation: "10 mm", pondDepth: "4 mm" },
  findings,
  hints: ["Subtract design from measured."],
});
const RIGHT = {
  "worst-end": "J4 start",
  "worst-fix": "+15 mm",
  "pond-at": "J4 start",
  "pond-depth": "5 mm",
  verdict: "reject",
};

function graded(answers: Record<string, string>) {
  const g = gradeAsBuiltTask(task, answers);
  if (!g.ok) throw new Error(g.message);
  return new Map(g.items.map((i) => [i.id, i]));
}

describe("as-built task grading (answers from the engine's as-built check)", () => {
  it("the engine's facts are the hand figures", () => {
    expect(rightFindings(task)).toEqual({
      "worst-end": "J4 start",
      "worst-fix": "+15 mm",
      "pond-at": "J4 start",
      "pond-depth": "5 mm",
      verdict: "reject",
    });
  });

  it("the right answers pass every finding, in any of their written forms", () => {
    for (const fix of ["+15 mm", "15 mm up", "pack up 15 mm", "pack up 0.015 m", "+1.5 cm", "+14"]) {
      const items = graded({ ...RIGHT, "worst-fix": fix });
      for (const i of items.values()) expect(i.passed, `${fix}: ${i.id}: ${i.feedback}`).toBe(true);
    }
    expect(graded(RIGHT).get("verdict")!.feedback).toMatch(/^Right: reject/);
  });

  it("each wrong answer fails with a clear reason", () => {
    const wrong = (id: string, answer: string) => graded({ ...RIGHT, [id]: answer }).get(id)!;
    const end = wrong("worst-end", "J5 start");
    expect(end.passed).toBe(false);
    expect(end.feedback).toContain("J5 start is on its design level");
    expect(end.feedback).toContain("The furthest out is J4 start is 15 mm low");

    const sign = wrong("worst-fix", "plane down 15 mm");
    expect(sign.passed).toBe(false);
    expect(sign.feedback).toMatch(/^Wrong way: J4 start is 15 mm low, so it is packed up/);
    const amount = wrong("worst-fix", "+10 mm");
    expect(amount.passed).toBe(false);
    expect(amount.feedback).toMatch(/^Right way, wrong amount: you gave \+10 mm/);
    const noWay = wrong("worst-fix", "15 mm");
    expect(noWay.passed).toBe(false);
    expect(noWay.feedback).toMatch(/does not say which way/);

    const pond = wrong("pond-at", "none");
    expect(pond.passed).toBe(false);
    expect(pond.feedback).toMatch(/^You said no water stands; water stands deepest at J4 start, 5 mm below/);
    const pondElsewhere = wrong("pond-at", "J9 end");
    expect(pondElsewhere.feedback).toMatch(/^J9 end is on its design level, but water runs off it/);

    const depth = wrong("pond-depth", "15 mm");
    expect(depth.passed).toBe(false);
    expect(depth.feedback).toMatch(/the water stands 5 mm deep/);

    const verdict = wrong("verdict", "accept");
    expect(verdict.passed).toBe(false);
    expect(verdict.feedback).toMatch(/^This deck must be rejected: J4 start at \(1\.20, 0\.00\) is 15 mm low/);

    for (const id of Object.keys(RIGHT)) {
      const blank = wrong(id, "  ");
      expect(blank).toMatchObject({ passed: false, score: 0, feedback: "No answer given." });
    }
    expect(wrong("worst-end", "J99 start").feedback).toMatch(/is not a point of this survey/);
  });

  it("a deck built as designed is accepted, and rejecting it fails", () => {
    const good = asBuiltTaskSchema.parse({
      ...task,
      survey: survey.map((p) => (p.label === "J4 start" ? { ...p, level: 0.02 - 0.004 } : p)),
      findings: [
        { id: "pond-at", kind: "pondAt" },
        { id: "verdict", kind: "verdict" },
      ],
    });
    expect(rightFindings(good)).toEqual({ "pond-at": "none", verdict: "accept" });
    const g = gradeAsBuiltTask(good, { "pond-at": "none", verdict: "reject" });
    if (!g.ok) throw new Error(g.message);
    expect(g.items[0].passed).toBe(true);
    expect(g.items[1]).toMatchObject({ passed: false });
    expect(g.items[1].feedback).toMatch(/^This deck passes: every point is within ±10 mm/);
  });

  it("reads a change with its way, refusing one without", () => {
    expect(readChange("+15 mm")).toEqual({ ok: true, metres: 0.015 });
    expect(readChange("plane down 12")).toEqual({ ok: true, metres: -0.012 });
    expect(readChange("−8 mm")).toEqual({ ok: true, metres: -0.008 });
    expect(readChange("-8 mm up")).toMatchObject({ ok: false });
    expect(readChange("12 mm")).toMatchObject({ ok: false });
    expect(readChange("up")).toMatchObject({ ok: false });
  });

  it("refuses a task whose worst point is not clear, or whose survey leaves the roof", () => {
    const tie = asBuiltTaskSchema.safeParse({
      ...task,
      survey: survey.map((p) => (p.label === "J10 start" ? { ...p, level: p.level + 0.015 } : p)),
    });
    expect(tie.success).toBe(false);
    expect(tie.error!.issues[0].message).toMatch(/within 1 mm of each other/);
    const outside = asBuiltTaskSchema.safeParse({ ...task, survey: [...survey, { label: "X", at: [9, 9], level: 0 }] });
    expect(outside.success).toBe(false);
    expect(outside.error!.issues[0].message).toMatch(/outside the roof outline/);
  });
});

describe("the as-built lesson in lessons/", () => {
  const lesson = loadLessons(path.resolve("lessons")).find((l) => l.task.kind === "as-built")!;

  it("loads, with a survey, findings and hints, and its view carries no answer", () => {
    expect(lesson.slug).toBe("checking-the-built-deck");
    if (lesson.task.kind !== "as-built") throw new Error("kind");
    expect(lesson.task.survey.length).toBeGreaterThan(20);
    const view = lessonView(lesson);
    if (view.task.kind !== "as-built") throw new Error("view kind");
    expect(view.task.findings.map((f) => f.kind)).toEqual(["worstEnd", "worstFix", "pondAt", "pondDepth", "verdict"]);
    expect(view.task.survey[0]).toMatchObject({ label: "J1 start", level: 0.05 });
    expect(view.task.tolerance).toEqual({ deviation: 0.01, pondDepth: 0.005 });
    const text = JSON.stringify(view.task);
    expect(text).not.toMatch(/"(correct|answer|reference|explanation)"/);
    // The hints teach the method without naming the faulty point.
    for (const h of view.task.hints) expect(h).not.toMatch(/J4/);
  });

  it("is graded into the same results as a roof lesson: right findings pass, a wrong verdict caps the score", () => {
    if (lesson.task.kind !== "as-built") throw new Error("kind");
    const quiz = Object.fromEntries(lesson.quiz.map((q) => [q.id, q.kind === "choice" ? q.correct : q.answer]));
    const right = rightFindings(lesson.task);
    expect(right).toEqual({
      "worst-end": "J4 start",
      "worst-fix": "+16 mm",
      "pond-at": "J4 start",
      "pond-depth": "8 mm",
      verdict: "reject",
    });
    const pass = gradeLesson(lesson, { ...quiz, ...right }, null);
    if ("ok" in pass) throw new Error(pass.message);
    expect(pass).toMatchObject({ score: 100, passed: true, roof: null });
    const accepted = gradeLesson(lesson, { ...quiz, ...right, verdict: "accept" }, null);
    if ("ok" in accepted) throw new Error(accepted.message);
    expect(accepted.passed).toBe(false);
    const failed = failedRequiredOf(accepted);
    expect(failed).toEqual(["Accept or reject the deck"]);
    // The gradebook, its CSV and the lesson page read a grade through readGrade.
    const read = readGrade({
      score: accepted.score,
      passed: accepted.passed,
      passMark: accepted.passMark,
      failedRequired: failed,
    });
    expect(read).toMatchObject({ passed: false, why: "required", score: lesson.passMark - 1 });
  });

  it("a lesson file whose finding reuses a question's id is refused, naming the field", () => {
    const source = `---
title: T
summary: S
minutes: 5
objectives: [o]
passMark: 50
quiz:
  - { id: verdict, kind: choice, prompt: P, options: [{ id: a, text: A }, { id: b, text: B }], correct: a, hint: H }
task:
  kind: as-built
  title: T
  goal: G
  design: ${JSON.stringify(design)}
  survey: ${JSON.stringify(survey)}
  findings: [{ id: verdict, kind: verdict }]
  hints: [h]
---
\`\`\`roof
caption: c
spec: ${JSON.stringify(design)}
\`\`\`
`;
    const r = parseLessonFile("99-t.md", source);
    expect(r.lesson).toBeNull();
    expect(r.issues).toContainEqual(
      expect.objectContaining({ path: "task.findings.0.id", message: '"verdict" is also a question\'s id' }),
    );
  });
});
