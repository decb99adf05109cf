import Papa from "papaparse";
import { beforeAll, describe, expect, it } from "vitest";
import { useTestDatabase } from "../support/db";
import { callRoute, formPost, get, sessionCookie, uniqueAddress, userIdOf, waitForMail } from "../support/accounts";
import { demoClassId, ensureSpool, ensureLesson, insertAttempt, makeTrainee } from "../support/classes";
import * as review from "~/routes/attempts.$id.review";
import * as classGradebook from "~/routes/classes.$id.gradebook";
import * as gradebookCsv from "~/routes/classes.$id.gradebook-csv";
import { reviewsForAttempt } from "~/lib/reviews.server";

// docs/product.md capability 5: the trainer's comment and grade override, kept with who and when; the original kept.
const database = useTestDatabase();
const LESSON = "zz-review-test";
const TITLE = "Review test lesson";

let trainer: string;
let admin: string;
let classId: string;
let traineeEmail: string;
let traineeId: string;

beforeAll(async () => {
  ensureSpool();
  trainer = await sessionCookie("trainer@tidemark.example");
  admin = await sessionCookie("admin@tidemark.example");
  classId = await demoClassId();
  await ensureLesson(LESSON, TITLE);
  await database
    .db()("assignments")
    .insert({ class_id: classId, lesson_slug: LESSON })
    .onConflict(["class_id", "lesson_slug"])
    .ignore();
  traineeEmail = uniqueAddress("review-trainee");
  traineeId = await makeTrainee(traineeEmail, "Rhea Tollan", classId);
});

const post = (attemptId: string, fields: Record<string, string>, cookie = trainer) =>
  callRoute(review.action, formPost(`/attempts/${attemptId}/review`, fields, cookie), { params: { id: attemptId } });

async function csvRows() {
  const response = await gradebookCsv.loader({
    request: get(`/classes/${classId}/gradebook.csv`, trainer),
    params: { id: classId },
    context: {},
  } as never);
  expect(response.status).toBe(200);
  expect(response.headers.get("content-type")).toBe("text/csv; charset=utf-8");
  expect(response.headers.get("content-disposition")).toMatch(
    /^attachment; filename="parapet-roofs-spring-cohort-gradebook\.csv"$/,
  );
  const text = (await response.text()).replace(/^\uFEFF/, "");
  return Papa.parse<Record<string, string>>(text.trim(), { header: true }).data;
}

describe("reviewing an attempt", () => {
  it("a comment alone is kept with who and when, and the trainee is told by e-mail", async () => {
    const attemptId = await insertAttempt(traineeId, LESSON, { score: 55, passed: false });
    const before = Date.now();
    const r = await post(attemptId, { comment: "Move the outlet toward the long side and try again." });
    expect(r.status).toBe(200);
    expect(r.data.notice).toMatch(/told by e-mail/);
    const [row] = await database.db()("attempt_reviews").where({ attempt_id: attemptId });
    expect(row).toMatchObject({
      reviewer_id: await userIdOf("trainer@tidemark.example"),
      comment: "Move the outlet toward the long side and try again.",
      override_score: null,
      override_passed: null,
    });
    expect(new Date(row.at).getTime()).toBeGreaterThanOrEqual(before - 1000);
    const mail = await waitForMail(traineeEmail, { subject: new RegExp(TITLE) });
    expect(mail.text).toContain("Move the outlet toward the long side");
    // The link opens the trainee's own attempt page, which shows the comment (lessons module).
    expect(mail.text).toMatch(new RegExp(`https?://\\S+/attempts/${attemptId}(\\s|$)`));
    // The trainee sees it on their attempt.
    const own = await callRoute(
      review.loader,
      get(`/attempts/${attemptId}/review`, await sessionCookie(traineeEmail)),
      { params: { id: attemptId } },
    );
    expect(own.data.reviews[0]).toMatchObject({
      reviewerName: "Tomas Verrall",
      comment: "Move the outlet toward the long side and try again.",
    });
    expect(own.data.grade).toMatchObject({ score: 55, passed: false, override: null });
  });

  it("an empty review, or an override without score, result or reason, is a 400 that keeps the text and saves nothing", async () => {
    const attemptId = await insertAttempt(traineeId, LESSON);
    const empty = await post(attemptId, { comment: "   " });
    expect(empty.status).toBe(400);
    expect(empty.data.errors.comment).toBeTruthy();
    const bad = await post(attemptId, { comment: "Close call", override: "on", score: "130", passed: "", reason: "" });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.data.errors).sort()).toEqual(["passed", "reason", "score"]);
    expect(bad.data.values).toMatchObject({ comment: "Close call", score: "130", override: "on" });
    expect(
      await database.db()("attempt_reviews").where({ attempt_id: attemptId }).count("* as n").first(),
    ).toMatchObject({ n: "0" });
  });

  it("an override adds a row, never touches the attempt, and is what the gradebook and the CSV show", async () => {
    const attemptId = await insertAttempt(traineeId, LESSON, { score: 62, passed: false });
    const original = await database.db()("attempts").where({ id: attemptId }).first();

    const r = await post(attemptId, {
      comment: "The fall line is fine on site drawings.",
      override: "on",
      score: "78",
      passed: "yes",
      reason: "Measured fall line 1:98 is within drawing tolerance",
    });
    expect(r.status).toBe(200);
    const after = await database.db()("attempts").where({ id: attemptId }).first();
    expect(after).toEqual(original);
    const rows = await database.db()("attempt_reviews").where({ attempt_id: attemptId });
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({
      reviewer_id: await userIdOf("trainer@tidemark.example"),
      override_score: 78,
      override_passed: true,
      reason: "Measured fall line 1:98 is within drawing tolerance",
    });
    expect(rows[0].at).toBeInstanceOf(Date);

    const mail = await waitForMail(traineeEmail, { subject: new RegExp(TITLE) });
    expect(mail.text).toMatch(/now 78\/100, passed \(the automatic grade was 62\/100, not passed\)/);

    const book = await callRoute(classGradebook.loader, get(`/classes/${classId}/gradebook`, trainer), {
      params: { id: classId },
    });
    const row = book.data.book.rows.find((x: { traineeId: string }) => x.traineeId === traineeId);
    expect(row.cells[LESSON]).toMatchObject({ attemptId, score: 78, passed: true, overridden: true });

    const csv = (await csvRows()).find((x) => x["E-mail"] === traineeEmail)!;
    expect(csv).toMatchObject({
      Trainee: "Rhea Tollan",
      [`${TITLE} (score)`]: "78",
      [`${TITLE} (result)`]: "passed (override)",
    });

    // A later override by someone else wins; both stay on record.
    const second = await post(
      attemptId,
      { comment: "", override: "on", score: "74.5", passed: "yes", reason: "Rounded the wrong way" },
      admin,
    );
    expect(second.status).toBe(200);
    const history = await reviewsForAttempt(attemptId);
    expect(history.map((h) => [h.reviewerName, h.overrideScore])).toEqual([
      ["Ada Marrow", 74.5],
      ["Tomas Verrall", 78],
    ]);
    expect((await csvRows()).find((x) => x["E-mail"] === traineeEmail)![`${TITLE} (score)`]).toBe("74.5");
    expect(await database.db()("attempts").where({ id: attemptId }).first()).toEqual(original);
  });

  it("the CSV escapes cells a spreadsheet would run as formulas", async () => {
    const email = uniqueAddress("csv-formula");
    await makeTrainee(email, '=HYPERLINK("http://example.org")', classId);
    const row = (await csvRows()).find((x) => x["E-mail"] === email)!;
    expect(row.Trainee.startsWith("'=")).toBe(true);
    expect(row[`${TITLE} (result)`]).toBe("not attempted");
  });
});
