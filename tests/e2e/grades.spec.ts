import fs from "node:fs";
import path from "node:path";
import matter from "gray-matter";
import { expect, test } from "@playwright/test";
import { signedIn } from "./support/session";

// Issue 16, item 1: one attempt's grade reads the same on the result, the attempts list, the
// gradebook and its CSV; a failed required check is said first, in words, and caps the score.
const LESSON = {
  slug: "outlets-and-overflows",
  file: "03-outlets-and-overflows.md",
  title: "Outlets, overflows and scuppers",
};
const TRAINEE = { email: "trainee3@tidemark.example", name: "Priya Santhorn" };

test("a failed required check reads the same on the result, the attempts list, the gradebook and the CSV", async ({
  browser,
}) => {
  test.setTimeout(120_000);
  // The author's answers and reference roof, with the outline (fixed by the task) moved: every
  // point is earned, but the required check "Keep what the task fixes" fails.
  const { data } = matter(fs.readFileSync(path.join(process.cwd(), "lessons", LESSON.file), "utf8"));
  const answers: Record<string, string | string[]> = {};
  for (const q of data.quiz as { id: string; kind: string; answer?: string; correct?: string | string[] }[])
    answers[q.id] = q.kind === "choice" ? q.correct! : q.answer!;
  const spec = structuredClone(data.task.reference);
  spec.outline = spec.outline.map(([x, y]: [number, number]) => [x, y === 0 ? 0 : y + 0.5]);

  const trainee = (await signedIn(browser, TRAINEE.email)).page;
  await trainee.goto(`/lessons/${LESSON.slug}`);
  const rule = trainee.getByTestId("grading-rule");
  await expect(rule).toContainText(`You pass at ${data.passMark} or more`);
  await expect(rule).toContainText(`capped at ${data.passMark - 1}`);

  const posted = await trainee.request.post("/api/v1/attempts", {
    data: { lesson: LESSON.slug, answers, spec, idempotencyKey: `grades-e2e-${Date.now()}` },
  });
  expect(posted.status()).toBe(201);
  const { attempt } = await posted.json();
  expect(attempt).toMatchObject({ score: data.passMark - 1, passed: false });
  const shown = String(data.passMark - 1);

  // The result: the reason first, then the capped score and Not passed.
  await trainee.goto(`/attempts/${attempt.id}`);
  const summary = trainee.getByTestId("score-summary");
  await expect(summary.getByTestId("grade-reason")).toHaveText(
    /^A required check was not met: “Keep what the task fixes”/,
  );
  await expect(summary.getByTestId("grade-score")).toHaveText(`${shown} / 100`);
  await expect(summary).toContainText("Not passed");
  await expect(summary).not.toContainText("100 / 100");

  // The attempts list.
  await trainee.goto("/attempts");
  const row = trainee.getByTestId("attempts-table").getByRole("row").filter({ hasText: LESSON.title }).first();
  await expect(row.getByTestId("attempt-score")).toHaveText(shown);
  await expect(row.getByTestId("attempt-result")).toContainText("Not passed");
  await expect(row.getByTestId("attempt-result")).toContainText("required check not met");

  // The trainer's gradebook and its CSV.
  const trainer = (await signedIn(browser, "trainer@tidemark.example")).page;
  await trainer.goto("/classes");
  const href = await trainer.getByRole("link", { name: "Parapet roofs, spring cohort" }).first().getAttribute("href");
  const classId = /\/classes\/([0-9a-f-]{36})/.exec(href ?? "")?.[1];
  expect(classId).toBeTruthy();
  await trainer.goto(`/classes/${classId}/gradebook`);
  const cellLink = trainer.getByRole("link", {
    name: new RegExp(`^${TRAINEE.name}, ${LESSON.title}: ${shown} Not passed\\. A required check was not met`),
  });
  await expect(cellLink).toBeVisible();
  await expect(cellLink).toContainText("Not passed: required check not met");
  const csv = await (await trainer.request.get(`/classes/${classId}/gradebook.csv`)).text();
  const line = csv.split("\r\n").find((l) => l.includes(TRAINEE.email))!;
  expect(line).toContain(`${shown},"not passed: A required check was not met: “Keep what the task fixes”`);
});
