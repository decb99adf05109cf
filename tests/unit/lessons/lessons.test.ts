import { createHash } from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { parseSpec, type RoofSpec } from "~/engine";
import { changedFixedKeys, gradeLesson, gradeQuestion, gradeTask } from "~/lib/lessons/grade";
import { LessonValidationError, loadLessons, parseLessonFile } from "~/lib/lessons/load.server";
import { roofTaskOf, type Lesson, type Question } from "~/lib/lessons/schema";

const lessons = loadLessons(path.resolve("lessons"));

/** What a trainee who knows the answer would type, from the answer the author wrote. */
function rightAnswer(q: Question): string | string[] {
  if (q.kind === "choice") return q.correct;
  return q.answer;
}

describe("the course in lessons/", () => {
  it("has at least ten lessons, each with objectives, a quiz, a task and a figure the app draws", () => {
    expect(lessons.length).toBeGreaterThanOrEqual(10);
    for (const l of lessons) {
      expect(l.objectives.length, l.file).toBeGreaterThan(0);
      expect(l.quiz.length, l.file).toBeGreaterThan(0);
      expect(l.task.kind === "roof" ? l.task.criteria.length : l.task.findings.length, l.file).toBeGreaterThan(0);
      expect(l.task.hints.length, l.file).toBeGreaterThan(0);
      expect(
        l.blocks.some((b) => b.type === "roof"),
        l.file,
      ).toBe(true);
      expect(l.version, l.file).toMatch(/^[0-9a-f]{64}$/);
    }
  });

  it("covers the topics of the course", () => {
    const slugs = lessons.map((l) => l.slug).join(" ");
    for (const topic of [
      "falls",
      "water-stands",
      "outlets",
      "gutters",
      "shaping",
      "fall-line",
      "drop-schedules",
      "catchments",
      "open-edge",
      "height-budget",
    ]) {
      expect(slugs).toContain(topic);
    }
  });

  it("uses numeric, ratio and multiple-choice questions across the course", () => {
    const kinds = new Set(lessons.flatMap((l) => l.quiz.map((q) => q.kind)));
    expect([...kinds].sort()).toEqual(["choice", "numeric", "ratio"]);
  });

  it("warns where the work can hurt someone: every lesson has a caution", () => {
    for (const l of lessons)
      expect(
        l.blocks.some((b) => b.type === "caution"),
        l.file,
      ).toBe(true);
  });

  it("versions a lesson by the SHA-256 of its file", () => {
    const l = lessons[0];
    const source = fs.readFileSync(path.resolve("lessons", l.file), "utf8");
    expect(l.version).toBe(createHash("sha256").update(source).digest("hex"));
    const edited = parseLessonFile(l.file, source + "\n");
    expect(edited.lesson!.version).not.toBe(l.version);
  });

  describe.each(lessons.map((l) => [l.file, l] as const))("%s", (_file, l: Lesson) => {
    it("accepts its own answers to every question", () => {
      for (const q of l.quiz) {
        const r = gradeQuestion(q, rightAnswer(q));
        expect(r.passed, `${q.id}: ${r.feedback}`).toBe(true);
      }
    });

    // Roof tasks only; an as-built task's findings are checked in as-built-task.test.ts and content.test.ts.
    if (l.task.kind !== "roof") return;
    it("starts from a roof that builds and fails the task", () => {
      const task = roofTaskOf(l);
      expect(parseSpec(structuredClone(task.start)).ok).toBe(true);
      const r = gradeTask(task, task.start);
      if (!r.ok) throw new Error(r.message);
      expect(r.items.some((i) => !i.passed)).toBe(true);
      expect(r.items.some((i) => i.id === "fixed")).toBe(false);
    });

    it("is passable: the stored reference roof meets every criterion, changing only what is editable", () => {
      const task = roofTaskOf(l);
      const r = gradeTask(task, task.reference);
      if (!r.ok) throw new Error(r.message);
      for (const i of r.items) expect(i.passed, `${i.id}: ${i.feedback}`).toBe(true);
      const start = parseSpec(structuredClone(task.start));
      const ref = parseSpec(structuredClone(task.reference));
      if (!start.ok || !ref.ok) throw new Error("spec");
      expect(changedFixedKeys(task, start.spec, ref.spec as RoofSpec)).toEqual([]);
      const all = gradeLesson(l, Object.fromEntries(l.quiz.map((q) => [q.id, rightAnswer(q)])), task.reference);
      expect(all).toMatchObject({ score: 100, passed: true });
    });
  });
});

describe("a broken lesson file names the file and the field", () => {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "fallwright-lessons-"));
  afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));
  const good = fs.readFileSync(path.resolve("lessons", lessons[0].file), "utf8");

  function problems(name: string, source: string): string {
    const file = path.join(dir, name);
    fs.writeFileSync(file, source);
    try {
      loadLessons(dir);
      return "";
    } catch (e) {
      expect(e).toBeInstanceOf(LessonValidationError);
      return (e as Error).message;
    } finally {
      fs.rmSync(file);
    }
  }

  it("loads a good copy", () => {
    expect(problems("01-good.md", good)).toBe("");
  });

  it("names a missing pass mark", () => {
    expect(problems("01-bad.md", good.replace(/^passMark: 70\n/m, ""))).toMatch(/01-bad\.md: passMark: /);
  });

  it("names a numeric answer without a unit", () => {
    expect(problems("02-bad.md", good.replace("answer: 90 mm", "answer: 90"))).toMatch(
      /02-bad\.md: quiz\.0\.answer: "90" needs a unit/,
    );
  });

  it("names a tolerance of the wrong kind", () => {
    expect(problems("02-bad.md", good.replace("tolerance: 1 mm", "tolerance: 1 kg"))).toMatch(
      /02-bad\.md: quiz\.0\.tolerance: /,
    );
  });

  it("names an unquoted ratio that YAML turned into a number", () => {
    const msg = problems("03-bad.md", good.replace('value: "1:100"', "value: 1:40"));
    expect(msg).toMatch(/03-bad\.md: task\.criteria\.0\.value: .*quotes/);
    const spec = problems("03-bad.md", good.replace('baseFall: "1:150"', "baseFall: 1:40"));
    expect(spec).toMatch(/03-bad\.md: task\.start: roof spec baseFall: write the fall as text in quotes/);
    const quiz = problems("03-bad.md", good.replace('answer: "1:62.5"', "answer: 1:40"));
    expect(quiz).toMatch(/03-bad\.md: quiz\.1\.answer: write the ratio in quotes/);
  });

  it("names a starting roof the engine cannot build", () => {
    const msg = problems(
      "04-bad.md",
      good.replace(
        'outlets: [{ at: [6, 0] }]\n    baseFall: "1:150"',
        'outlets: [{ at: [60, 60] }]\n    baseFall: "1:150"',
      ),
    );
    expect(msg).toMatch(/04-bad\.md: task\.start: roof spec outlets\.0/);
  });

  it("names an unknown criterion kind and a choice pointing at no option", () => {
    expect(problems("05-bad.md", good.replace("kind: highLevelAtMost", "kind: highLevelBelow"))).toMatch(
      /05-bad\.md: task\.criteria\.1\.kind: must be one of/,
    );
    expect(problems("05-bad.md", good.replace("correct: b\n", "correct: z\n"))).toMatch(
      /05-bad\.md: quiz\.4\.correct: "z" is not one of the option ids/,
    );
  });

  it("names a question without a hint", () => {
    expect(problems("05-bad.md", good.replace(/^ {4}hint: "1:N means.*\n/m, ""))).toMatch(
      /05-bad\.md: quiz\.0\.hint: every question needs a hint/,
    );
  });

  it("names a broken figure by its line in the body", () => {
    const msg = problems("06-bad.md", good.replace("view: plan", "view: elevation"));
    expect(msg).toMatch(/06-bad\.md: body line \d+ \(roof figure\) view: must be one of/);
    const yaml = problems("06-bad.md", good.replace("view: plan", "view: plan\n  : : :"));
    expect(yaml).toMatch(/06-bad\.md: body line \d+ \(roof figure\): is not valid YAML/);
  });

  it("names bad front matter YAML, a bad file name and a repeated slug", () => {
    expect(problems("07-bad.md", good.replace("minutes: 20", "minutes: [20"))).toMatch(
      /07-bad\.md: front matter.*: is not valid YAML/,
    );
    expect(problems("Lesson One.md", good)).toMatch(/Lesson One\.md: \(file name\)/);
    fs.writeFileSync(path.join(dir, "08-same.md"), good);
    try {
      expect(problems("09-same.md", good)).toMatch(
        /09-same\.md: \(file name\): slug "same" is also used by 08-same\.md/,
      );
    } finally {
      fs.rmSync(path.join(dir, "08-same.md"));
    }
  });

  it("lists every problem at once", () => {
    const msg = problems("10-bad.md", good.replace(/^passMark: 70\n/m, "").replace("answer: 90 mm", "answer: 90"));
    expect(msg).toMatch(/^2 problems/);
  });
});
