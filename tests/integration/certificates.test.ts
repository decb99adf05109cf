import { fileURLToPath } from "node:url";
import { getDocument } from "pdfjs-dist/legacy/build/pdf.mjs";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { useTestDatabase } from "../support/db";
import { callRoute, formPost, get, sessionCookie, uniqueAddress } from "../support/accounts";
import { demoClassId, ensureLesson, ensureSpool, insertAttempt, makeTrainee } from "../support/classes";
import { call, cookieFor, jsonRequest } from "../support/roofs";
import { startServer, type RunningServer } from "../support/server";
import * as coursesPage from "~/routes/courses._index";
import * as coursePage from "~/routes/courses.$id";
import * as classPage from "~/routes/classes.$id";
import * as review from "~/routes/attempts.$id.review";
import * as attemptsApi from "~/routes/api.v1.attempts";
import * as certificatePage from "~/routes/certificates.$id";
import * as certificatePdfRoute from "~/routes/certificates.$id-pdf";
import * as verify from "~/routes/verify.$code";
import * as verifyEntry from "~/routes/verify._index";
import * as myAttempts from "~/routes/attempts._index";
import { getLesson } from "~/lib/lessons/catalogue.server";
import { roofTaskOf, type Lesson } from "~/lib/lessons/schema";
import { certificateLines } from "~/lib/certificates/certificate-text";
import { appOrigin } from "~/lib/app-url";

// docs/product.md capability 10: a class follows a course; a trainee who passes its last lesson
// gets one certificate, with a page, a PDF and a public verification page that shows nothing else.
const database = useTestDatabase();
const FONTS = fileURLToPath(new URL("../../node_modules/pdfjs-dist/standard_fonts/", import.meta.url));

const QUIZ_LESSON = "zz-course-first";
const OUTLETS = getLesson("outlets-and-overflows")!;
const OUTLETS_TASK = roofTaskOf(OUTLETS);
const rightAnswers = (l: Lesson) =>
  Object.fromEntries(l.quiz.map((q) => [q.id, q.kind === "choice" ? q.correct : q.answer]));
const MOVED = { ...(OUTLETS_TASK.start as object), outlets: [{ at: [9, 0] }] };

let trainer: string;
let admin: string;
let classId: string;
let courseId: string;

const certificatesOf = (traineeId: string) =>
  database.db()("certificates").where({ trainee_id: traineeId }).select("id", "course_id", "code");

/** An attempt at the outlets lesson through the API, graded by the real grader. */
async function submitOutlets(cookie: string, spec: unknown) {
  const r = await call(
    attemptsApi.action,
    jsonRequest(
      "POST",
      "/api/v1/attempts",
      {
        lesson: OUTLETS.slug,
        answers: rightAnswers(OUTLETS),
        spec,
        idempotencyKey: `c-${Math.random().toString(36).slice(2, 12)}`,
        timeSpentSeconds: 60,
      },
      cookie,
    ),
  );
  expect(r.status).toBe(201);
  return (await r.json()).attempt as { id: string; passed: boolean };
}

const override = (attemptId: string, passed: boolean, score: string, cookie = trainer) =>
  callRoute(
    review.action,
    formPost(
      `/attempts/${attemptId}/review`,
      { override: "on", score, passed: passed ? "yes" : "no", reason: "Checked against the site photos." },
      cookie,
    ),
    { params: { id: attemptId } },
  );

async function pdfText(bytes: Uint8Array): Promise<string> {
  const doc = await getDocument({ data: bytes.slice(), isEvalSupported: false, standardFontDataUrl: FONTS }).promise;
  let text = "";
  for (let i = 1; i <= doc.numPages; i++) {
    const content = await (await doc.getPage(i)).getTextContent();
    text += `${content.items.map((it) => ("str" in it ? it.str : "")).join(" ")} `;
  }
  await doc.destroy();
  return text.replace(/\s+/g, " ");
}

beforeAll(async () => {
  ensureSpool();
  trainer = await sessionCookie("trainer@tidemark.example");
  admin = await sessionCookie("admin@tidemark.example");
  classId = await demoClassId();
  await ensureLesson(QUIZ_LESSON, "Course test: first lesson");
  await database.db()("classes").where({ id: classId }).update({ starts_on: "2027-03-01", ends_on: "2027-03-09" });

  const created = await callRoute(
    coursesPage.action,
    formPost("/courses", { name: "Falls to outlets, foundation", description: "Two lessons, in order." }, trainer),
  );
  expect(created.status).toBe(302);
  courseId = /^\/courses\/([0-9a-f-]{36})\?created=1$/.exec(created.location ?? "")![1];
  for (const lesson of [QUIZ_LESSON, OUTLETS.slug]) {
    const added = await callRoute(
      coursePage.action,
      formPost(`/courses/${courseId}`, { intent: "add", lesson }, trainer),
      { params: { id: courseId } },
    );
    expect(added.status).toBe(200);
  }
}, 60_000);

describe("a class follows a course", () => {
  it("a bad course id is 400 naming the field; a course assigns its lessons with due dates spread over the class's dates", async () => {
    const bad = await callRoute(
      classPage.action,
      formPost(`/classes/${classId}`, { intent: "course", courseId: "not-a-course" }, trainer),
      { params: { id: classId } },
    );
    expect(bad.status).toBe(400);
    expect((bad.data as { courseError: string }).courseError).toMatch(/courseId/);

    const res = await callRoute(
      classPage.action,
      formPost(`/classes/${classId}`, { intent: "course", courseId }, trainer),
      { params: { id: classId } },
    );
    expect(res.status).toBe(200);
    expect((res.data as { notice: string }).notice).toMatch(/2 lessons assigned/);
    const rows = await database
      .db()("assignments")
      .where({ class_id: classId })
      .whereIn("lesson_slug", [QUIZ_LESSON, OUTLETS.slug])
      .select("lesson_slug", "due_on");
    // 1-9 March is 8 days; two lessons: the first 4 days in, the last on the last day.
    expect(Object.fromEntries(rows.map((r) => [r.lesson_slug, r.due_on]))).toEqual({
      [QUIZ_LESSON]: "2027-03-05",
      [OUTLETS.slug]: "2027-03-09",
    });
    const cls = await database.db()("classes").where({ id: classId }).first("course_id");
    expect(cls!.course_id).toBe(courseId);
  });
});

describe("certificates", () => {
  let traineeId: string;
  let traineeEmail: string;
  let certificateId: string;
  let code: string;

  it("are issued exactly when the last lesson is passed: not before, not on a non-passing override, once only", async () => {
    traineeEmail = uniqueAddress("course-trainee");
    traineeId = await makeTrainee(traineeEmail, "Halvard Nyquist", classId);
    const cookie = await cookieFor(traineeEmail);

    // A failing attempt at one lesson, then a passing one: one of two lessons passed, nothing issued.
    expect((await submitOutlets(cookie, OUTLETS_TASK.start)).passed).toBe(false);
    expect((await submitOutlets(cookie, MOVED)).passed).toBe(true);
    expect(await certificatesOf(traineeId)).toEqual([]);

    // The other lesson: an attempt that did not pass, then an override that still does not pass it.
    const attempt = await insertAttempt(traineeId, QUIZ_LESSON, { score: 55, passed: false });
    expect((await override(attempt, false, "60")).status).toBe(200);
    expect(await certificatesOf(traineeId)).toEqual([]);

    // The override that passes it completes the course: one certificate.
    expect((await override(attempt, true, "85")).status).toBe(200);
    const issued = await certificatesOf(traineeId);
    expect(issued).toHaveLength(1);
    expect(issued[0].course_id).toBe(courseId);
    expect(issued[0].code).toMatch(/^[0-9A-HJKMNP-TV-Z]{12}$/);
    certificateId = issued[0].id;
    code = issued[0].code;

    // Passing again, by attempt or by override, issues no second one.
    expect((await submitOutlets(cookie, MOVED)).passed).toBe(true);
    expect((await override(attempt, true, "90")).status).toBe(200);
    expect(await certificatesOf(traineeId)).toEqual(issued);
  }, 120_000);

  it("a graded attempt that passes the last lesson issues one too (the attempt hook)", async () => {
    const email = uniqueAddress("course-trainee-2");
    const id = await makeTrainee(email, "Sorrel Vantongeren", classId);
    const attempt = await insertAttempt(id, QUIZ_LESSON, { score: 55, passed: false });
    expect((await override(attempt, true, "80")).status).toBe(200);
    expect(await certificatesOf(id)).toEqual([]);
    expect((await submitOutlets(await cookieFor(email), MOVED)).passed).toBe(true);
    expect(await certificatesOf(id)).toHaveLength(1);
  }, 120_000);

  it("a trainee outside any class that follows the course gets none", async () => {
    const email = uniqueAddress("course-outsider");
    const id = await makeTrainee(email, "Ilse Brandvold");
    await insertAttempt(id, QUIZ_LESSON, { score: 90, passed: true });
    expect((await submitOutlets(await cookieFor(email), MOVED)).passed).toBe(true);
    expect(await certificatesOf(id)).toEqual([]);
  }, 120_000);

  it("/certificates/:id is for its owner, their trainer and admins; anyone else gets 404", async () => {
    const open = async (cookie: string) =>
      callRoute(certificatePage.loader, get(`/certificates/${certificateId}`, cookie), {
        params: { id: certificateId },
      });
    const mine = await open(await cookieFor(traineeEmail));
    expect(mine.status).toBe(200);
    expect((mine.data as { certificate: { traineeName: string; courseName: string } }).certificate).toMatchObject({
      traineeName: "Halvard Nyquist",
      courseName: "Falls to outlets, foundation",
      organisationName: expect.any(String),
    });
    expect((await open(trainer)).status).toBe(200);
    expect((await open(admin)).status).toBe(200);
    // The trainee finds it on My attempts.
    const listed = await callRoute(myAttempts.loader, get("/attempts", await cookieFor(traineeEmail)));
    expect((listed.data as { certificates: { id: string; courseName: string }[] }).certificates).toEqual([
      expect.objectContaining({ id: certificateId, courseName: "Falls to outlets, foundation" }),
    ]);
    for (const other of ["trainee@tidemark.example", "designer@tidemark.example", "trainer2@tidemark.example"]) {
      expect((await open(await sessionCookie(other))).status, other).toBe(404);
    }
    const anonymous = await callRoute(certificatePage.loader, get(`/certificates/${certificateId}`), {
      params: { id: certificateId },
    });
    expect(anonymous.status).toBe(302);
    const pdfOther = await callRoute(
      certificatePdfRoute.loader,
      get(`/certificates/${certificateId}.pdf`, await sessionCookie("trainee2@tidemark.example")),
      { params: { id: certificateId } },
    );
    expect(pdfOther.status).toBe(404);
  });

  it("the PDF, parsed back, says what the page says", async () => {
    const page = await callRoute(certificatePage.loader, get(`/certificates/${certificateId}`, trainer), {
      params: { id: certificateId },
    });
    const facts = (page.data as { certificate: Parameters<typeof certificateLines>[0] }).certificate;
    const res = await certificatePdfRoute.loader({
      request: get(`/certificates/${certificateId}.pdf`, await cookieFor(traineeEmail)),
      params: { id: certificateId },
      context: {},
    } as never);
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("application/pdf");
    expect(res.headers.get("content-disposition")).toMatch(
      /^attachment; filename="falls-to-outlets-foundation-certificate-\d{4}-\d{2}-\d{2}\.pdf"$/,
    );
    const text = await pdfText(new Uint8Array(await res.arrayBuffer()));
    const lines = certificateLines(facts, appOrigin());
    for (const line of [
      lines.title,
      lines.name,
      lines.course,
      lines.organisation,
      lines.date,
      lines.code,
      lines.verify,
    ])
      expect(text).toContain(line);
    expect(text).toContain("Halvard Nyquist");
    expect(text).not.toContain("Revoked");
  });

  it("/verify/<code> confirms a valid certificate without sign-in and shows no e-mail; a made-up code is 404", async () => {
    const ok = await callRoute(verify.loader, get(`/verify/${code}`), { params: { code } });
    expect(ok.status).toBe(200);
    expect(ok.data).toMatchObject({
      traineeName: "Halvard Nyquist",
      courseName: "Falls to outlets, foundation",
      revokedOn: null,
    });
    expect(Object.keys(ok.data as object).sort()).toEqual(
      ["code", "courseName", "issuedOn", "organisationName", "revokedOn", "traineeName"].sort(),
    );
    expect(JSON.stringify(ok.data)).not.toContain(traineeEmail);
    // Typed as people type it: lower case, in groups.
    const typed = `${code.slice(0, 4)}-${code.slice(4, 8)}-${code.slice(8)}`.toLowerCase();
    expect((await callRoute(verify.loader, get(`/verify/${typed}`), { params: { code: typed } })).status).toBe(200);
    const madeUp = code === "ZZZZZZZZZZZZ" ? "YYYYYYYYYYYY" : "ZZZZZZZZZZZZ";
    const none = await callRoute(verify.loader, get(`/verify/${madeUp}`), { params: { code: madeUp } });
    expect(none.status).toBe(404);
    expect(none.data).toBe("No such certificate.");
  });

  it("/verify takes a code typed from paper: one that reads as a code opens its page, anything else stays with what was typed", async () => {
    const typed = ` ${code.slice(0, 4)} ${code.slice(4, 8)}-${code.slice(8)} `.toLowerCase();
    const go = await callRoute(verifyEntry.loader, get(`/verify?code=${encodeURIComponent(typed)}`));
    expect(go.status).toBe(302);
    expect(go.location).toBe(`/verify/${code.slice(0, 4)}-${code.slice(4, 8)}-${code.slice(8)}`);
    const short = await callRoute(verifyEntry.loader, get(`/verify?code=${encodeURIComponent("7Q2K-9XPM")}`));
    expect(short.status).toBe(400);
    expect(short.data).toEqual({
      typed: "7Q2K-9XPM",
      error: "This cannot be a certificate code: a code is 12 letters and digits.",
    });
    const blank = await callRoute(verifyEntry.loader, get("/verify"));
    expect(blank.status).toBe(200);
    expect(blank.data).toEqual({ typed: "", error: null });
  });

  it("revoking needs a trainer or admin and a reason; it is in the audit log and /verify says revoked", async () => {
    const revoke = (fields: Record<string, string>, cookie: string) =>
      callRoute(certificatePage.action, formPost(`/certificates/${certificateId}`, fields, cookie), {
        params: { id: certificateId },
      });
    const own = await revoke({ intent: "revoke", reason: "I want to retake it." }, await cookieFor(traineeEmail));
    expect(own.status).toBe(403);
    const blank = await revoke({ intent: "revoke", reason: "  " }, trainer);
    expect(blank.status).toBe(400);
    expect(blank.data).toMatchObject({ reasonError: expect.stringMatching(/reason/i), reason: "  " });
    expect(await database.db()("certificates").where({ id: certificateId }).first("revoked_at")).toEqual({
      revoked_at: null,
    });

    const done = await revoke({ intent: "revoke", reason: "Quiz answers were shared between trainees." }, trainer);
    expect(done.status).toBe(200);
    const row = await database.db()("certificates").where({ id: certificateId }).first();
    expect(row).toMatchObject({ revoke_reason: "Quiz answers were shared between trainees." });
    expect(row!.revoked_at).not.toBeNull();
    const entry = await database
      .db()("audit_log")
      .where({ action: "certificate_revoked", subject_id: traineeId })
      .first("detail", "actor_id");
    expect(entry!.detail).toMatchObject({ certificateId, reason: "Quiz answers were shared between trainees." });
    expect(entry!.actor_id).toBe(
      (await database.db()("users").where({ email: "trainer@tidemark.example" }).first("id"))!.id,
    );

    const again = await revoke({ intent: "revoke", reason: "Twice." }, admin);
    expect(again.status).toBe(409);

    const v = await callRoute(verify.loader, get(`/verify/${code}`), { params: { code } });
    expect(v.status).toBe(200);
    expect((v.data as { revokedOn: string | null }).revokedOn).toMatch(/^\d{4}-\d{2}-\d{2}$/);
    expect(JSON.stringify(v.data)).not.toContain("shared between");
  });
});

describe("the public pages through the production server", () => {
  let server: RunningServer;
  beforeAll(async () => {
    server = await startServer(database.url());
  }, 120_000);
  afterAll(async () => {
    await server?.stop();
  });

  it("/verify/<code> renders without sign-in, shows no e-mail, and a made-up code is a plain 'no such certificate' 404", async () => {
    const row = await database
      .db()("certificates as x")
      .join("users as u", "u.id", "x.trainee_id")
      .first("x.code", "u.email", "u.name");
    const res = await fetch(`${server.url}/verify/${row!.code}`);
    expect(res.status).toBe(200);
    const html = await res.text();
    expect(html).toContain(row!.name);
    expect(html).toContain("Falls to outlets, foundation");
    expect(html).toMatch(/Revoked certificate|Valid certificate/);
    expect(html).not.toContain(row!.email);
    const none = await fetch(`${server.url}/verify/ABCD-EFGH-JKMN`);
    expect(none.status).toBe(404);
    const body = await none.text();
    expect(body).toContain("No such certificate");
    // …with the code as typed in a field, to be put right and checked again.
    expect(body).toMatch(/<input[^>]*name="code"[^>]*value="ABCD-EFGH-JKMN"/);
  });
});
