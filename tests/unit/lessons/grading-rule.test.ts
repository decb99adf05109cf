import { describe, expect, it } from "vitest";
import path from "node:path";
import { failedRequiredOf, gradeLesson } from "~/lib/lessons/grade";
import {
  BLANK_QUIZ_LABEL,
  cappedScore,
  GRADING_RULE_LINES,
  overrideProblem,
  readGrade,
} from "~/lib/lessons/grading-rule";
import { loadLessons } from "~/lib/lessons/load.server";
import { questionSchema, roofTaskOf, roofTaskSchema as taskSchema } from "~/lib/lessons/schema";

// Issue 16, item 1: one grading rule, read the same everywhere. One test per rule.
const taskInput = {
  title: "Move the outlet",
  goal: "Move it.",
  start: {
    outline: [
      [0, 0],
      [18, 0],
      [18, 9],
      [0, 9],
    ],
    outlets: [{ at: [0, 0] }],
    baseFall: "1:60",
    joists: { direction: [0, 1] },
  },
  reference: {
    outline: [
      [0, 0],
      [18, 0],
      [18, 9],
      [0, 9],
    ],
    outlets: [{ at: [9, 0] }],
    baseFall: "1:60",
    joists: { direction: [0, 1] },
  },
  editable: ["outlets"],
  // The fixed-parts check ("Keep what the task fixes") is required and weighs 0 points.
  criteria: [{ id: "fall", kind: "longestFallRatioAtMost", value: "1:100", weight: 3 } as Record<string, unknown>],
  hints: ["Middle of the front edge."],
};
const task = taskSchema.parse(taskInput);
const lesson = {
  passMark: 70,
  quiz: [questionSchema.parse({ id: "q1", kind: "numeric", prompt: "?", answer: "150 mm", tolerance: "1 mm" })],
  task,
};

describe("the grading rule", () => {
  it("a required check that fails means Not passed, with the score capped below the pass mark (no 100 / 100 Not passed)", () => {
    // The reported case: every point earned, but the outline (fixed by the task) was moved.
    const moved = {
      ...(task.reference as object),
      outline: [
        [0, 0],
        [18, 0],
        [18, 10],
        [0, 10],
      ],
    };
    const r = gradeLesson(lesson, { q1: "150 mm" }, moved);
    if ("ok" in r) throw new Error(r.message);
    expect(r).toMatchObject({ rawScore: 100, score: 69, passed: false });
    expect(failedRequiredOf(r)).toEqual(["Keep what the task fixes"]);
    const read = readGrade({ score: r.score, passed: r.passed, passMark: 70, failedRequired: failedRequiredOf(r) });
    expect(read).toMatchObject({ score: 69, passed: false, why: "required" });
    expect(read.reason).toMatch(/^A required check was not met: “Keep what the task fixes”/);
    // An attempt stored before the cap (100, not passed) reads the same way.
    expect(
      readGrade({ score: 100, passed: false, passMark: 70, failedRequired: ["Keep what the task fixes"] }),
    ).toMatchObject({ score: 69, passed: false });
    expect(cappedScore(40, 70)).toBe(40);
    expect(cappedScore(100, 0)).toBe(0);
  });

  it("a failed criterion marked required caps the same way, whatever the pass mark", () => {
    const oneOutlet = taskSchema.parse({
      ...taskInput,
      criteria: [...taskInput.criteria, { id: "one", kind: "maxOutlets", value: 1, required: true }],
    });
    const twoOutlets = { ...(task.reference as object), outlets: [{ at: [6, 0] }, { at: [12, 0] }] };
    // Quiz right (1) + fall line met (3) + one outlet failed (0 of 1): 4 of 5 = 80, over a pass mark of 50.
    const r = gradeLesson({ ...lesson, passMark: 50, task: oneOutlet }, { q1: "150 mm" }, twoOutlets);
    if ("ok" in r) throw new Error(r.message);
    expect(r).toMatchObject({ rawScore: 80, score: 49, passed: false });
  });

  it("below the pass mark is Not passed; at the pass mark is Passed", () => {
    expect(readGrade({ score: 69.9, passed: false, passMark: 70, failedRequired: [] })).toMatchObject({
      passed: false,
      why: "below-pass-mark",
      reason: "Below the pass mark of 70.",
    });
    expect(readGrade({ score: 70, passed: true, passMark: 70, failedRequired: [] })).toMatchObject({
      passed: true,
      why: null,
      reason: null,
    });
    // A stored "passed" beside a score below the mark can never read as a pass.
    expect(readGrade({ score: 60, passed: true, passMark: 70, failedRequired: [] }).passed).toBe(false);
    // gradeLesson's totals below and at the mark: grade.test.ts.
  });

  it("an override replaces score and result together, and its result must follow the pass mark", () => {
    const read = readGrade({
      score: 69,
      passed: false,
      passMark: 70,
      failedRequired: ["Keep what the task fixes"],
      override: { score: 80, passed: true, reason: "Outline moved by a tool fault" },
    });
    expect(read).toMatchObject({ score: 80, passed: true, overridden: true, reason: null });
    const down = readGrade({
      score: 90,
      passed: true,
      passMark: 70,
      failedRequired: [],
      override: { score: 50, passed: false, reason: "Copied" },
    });
    expect(down).toMatchObject({
      score: 50,
      passed: false,
      why: "trainer",
      reason: "Not passed by the trainer's decision: Copied.",
    });
    expect(overrideProblem({ score: 100, passed: false }, 70)).toMatch(/70 or more passes/);
    expect(overrideProblem({ score: 50, passed: true }, 70)).toMatch(/at least 70/);
    expect(overrideProblem({ score: 70, passed: true }, 70)).toBeNull();
    expect(overrideProblem({ score: 69.9, passed: false }, 70)).toBeNull();
  });

  it("a blank quiz scores 0 and is Not passed, even beside a roof that meets every criterion (was 55.6 of 100)", () => {
    // The reported case: lesson 3 (outlets and overflows) with its reference roof and no answer.
    const outlets = loadLessons(path.resolve("lessons")).find((l) => l.slug === "outlets-and-overflows")!;
    for (const blank of [{}, Object.fromEntries(outlets.quiz.map((q) => [q.id, q.kind === "choice" ? [] : "  "]))]) {
      const r = gradeLesson(outlets, blank, roofTaskOf(outlets).reference);
      if ("ok" in r) throw new Error(r.message);
      expect(r.task.every((i) => i.passed)).toBe(true);
      expect(r.quiz.filter((i) => i.score > 0)).toEqual([]);
      expect(r).toMatchObject({ score: 0, passed: false });
      expect(r.rawScore).toBeGreaterThan(0);
      const failed = failedRequiredOf(r);
      expect(failed).toEqual([BLANK_QUIZ_LABEL]);
      const read = readGrade({ score: r.score, passed: r.passed, passMark: r.passMark, failedRequired: failed });
      expect(read).toMatchObject({ score: 0, passed: false, why: "required" });
      expect(read.reason).toMatch(/^No quiz question was answered/);
    }
    // One answer (even a wrong one) makes it a quiz attempt again: the task's points count.
    const one = gradeLesson(outlets, { [outlets.quiz[0].id]: "1 mm" }, roofTaskOf(outlets).reference);
    if ("ok" in one) throw new Error(one.message);
    expect(one.score).toBeGreaterThan(0);
    expect(one.quiz.some((i) => i.id === "quiz-answered")).toBe(false);
  });

  it("is stated in words with the lesson's own pass mark and cap", () => {
    const lines = GRADING_RULE_LINES(80).join(" ");
    expect(lines).toContain("You pass at 80 or more");
    expect(lines).toContain("capped at 79");
    expect(lines).toContain("a quiz left wholly blank scores 0");
  });
});
