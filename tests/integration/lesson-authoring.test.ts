import { describe, expect, it } from "vitest";
import { useTestDatabase } from "../support/db";
import { callRoute, formPost, get, sessionCookie } from "../support/accounts";
import { db } from "~/lib/db.server";
import { lessonForViewer, visibleLessons, type LessonViewer } from "~/lib/lessons/access.server";
import { createAttempt } from "~/lib/lessons/attempts.server";
import {
  createLesson,
  duplicateLesson,
  exportLesson,
  importLesson,
  previewLesson,
  publishLesson,
  sourceFromForm,
  updateLesson,
} from "~/lib/lessons/authoring.server";
import { submitAttempt } from "~/lib/lessons/submit.server";
import { blankCriterion, type LessonForm } from "~/lib/lessons/lesson-form";
import type { GradeResult } from "~/lib/lessons/grade";
import * as lessonPage from "~/routes/lessons.$slug";
import * as attemptPage from "~/routes/attempts.$id";
import * as apiLessons from "~/routes/api.v1.lessons";
import * as newLesson from "~/routes/lessons.new";
import * as editLesson from "~/routes/lessons.$slug.edit";

// Issue 17, items 1, 2 and 5 (docs/authoring.md): a trainer's lesson from draft to v2, who sees it.
useTestDatabase();

const ROOF = {
  outline: [
    [0, 0],
    [12, 0],
    [12, 6],
    [0, 6],
  ],
  outlets: [{ at: [6, 0] }],
  baseFall: "1:60",
};

function form(over: Partial<LessonForm> = {}): LessonForm {
  return {
    title: "Falls on the annex roof",
    summary: "A short lesson written in the app.",
    minutes: "10",
    objectives: "Read a fall as 1:N\nFind the outlet",
    passMark: "70",
    body: `Read the figure.\n\n\`\`\`roof\ncaption: The annex roof\nview: plan\nspec: ${JSON.stringify(ROOF)}\n\`\`\`\n`,
    quiz: [
      {
        kind: "numeric",
        id: "q1",
        prompt: "How much does a 12 m run fall at 1:80?",
        answer: "150 mm",
        tolerance: "2 mm",
        options: "",
        explanation: "12 000 mm / 80.",
        hint: "Put the run in millimetres first.",
        weight: "1",
      },
      {
        kind: "multiple",
        id: "q2",
        prompt: "Which are falls steeper than 1:80?",
        answer: "",
        tolerance: "",
        options: "* 1:40\n1:100\n* 1:60",
        explanation: "A smaller N is steeper.",
        hint: "Compare N.",
        weight: "1",
      },
    ],
    task: {
      title: "Shape this roof",
      goal: "Keep the water moving to the outlet.",
      start: JSON.stringify(ROOF),
      reference: JSON.stringify(ROOF),
      editable: ["outlets", "baseFall"],
      criteria: [{ ...blankCriterion(), kind: "noPonding", required: true }],
      hints: "Look at the fall map.",
    },
    ...over,
  };
}

async function viewer(email: string): Promise<NonNullable<LessonViewer>> {
  const u = await db()("users").where({ email }).first("id", "role", "organisation_id");
  return { id: u!.id, role: u!.role, organisationId: u!.organisation_id };
}

async function otherOrganisationTrainer(): Promise<NonNullable<LessonViewer>> {
  const [org] = await db()("organisations").insert({ name: "Brightwater Training (invented)" }).returning("id");
  const [u] = await db()("users")
    .insert({
      organisation_id: org.id,
      email: `trainer-${crypto.randomUUID().slice(0, 8)}@brightwater.example`,
      role: "trainer",
      name: "Oli Test",
    })
    .returning(["id"]);
  return { id: u.id, role: "trainer", organisationId: org.id };
}

const key = () => `k-${crypto.randomUUID()}`;

describe("writing a lesson in the app", () => {
  it("create → preview → publish → edit makes v2; an attempt on v1 still shows v1's grade and criteria", async () => {
    const trainer = await viewer("trainer@tidemark.example");
    const trainee = await viewer("trainee@tidemark.example");
    const created = await createLesson(db(), trainer, sourceFromForm(form()).source);
    if (!created.ok) throw new Error(JSON.stringify(created.issues));
    const slug = created.value.slug;
    expect(slug).toBe("falls-on-the-annex-roof");

    // Preview: a trial attempt graded on the server, nothing stored.
    const before = await db()("attempts").count<{ count: string }[]>("* as count");
    const preview = previewLesson(created.value.lesson);
    expect("score" in preview.reference && preview.reference.passed).toBe(true);
    expect((await db()("attempts").count<{ count: string }[]>("* as count"))[0].count).toBe(before[0].count);

    // A draft cannot be attempted, and has no version yet.
    const onDraft = await submitAttempt(
      { ...trainee, email: "", name: "" },
      { lesson: slug, idempotencyKey: key(), spec: ROOF },
    );
    expect(onDraft.status).toBe(404);
    expect(await db()("lesson_versions").where({ slug })).toHaveLength(0);

    const published = await publishLesson(db(), trainer, slug);
    expect(published).toEqual({ ok: true, value: { versionNumber: 1 } });
    expect((await publishLesson(db(), trainer, slug)).ok).toBe(false);

    // The trainee answers q1 wrong (140 mm) on v1: q1 fails and the attempt keeps v1's single criterion.
    const v1 = await lessonForViewer(db(), slug, trainee);
    expect(v1?.versionNumber).toBe(1);
    const a1 = await submitAttempt(
      { ...trainee, email: "", name: "" },
      {
        lesson: slug,
        version: v1!.lesson.version,
        answers: { q1: "140 mm", q2: ["a", "c"] },
        spec: ROOF,
        idempotencyKey: key(),
      },
    );
    if (!("attempt" in a1)) throw new Error(JSON.stringify(a1));
    expect(a1.status).toBe(201);
    const v1Score = a1.attempt.score;

    // v2: a second criterion and a different pass mark. The published lesson changes at once.
    const edited = form({ passMark: "90" });
    edited.task.criteria.push({ ...blankCriterion(), kind: "maxOutlets", value: "1" });
    const updated = await updateLesson(db(), trainer, slug, sourceFromForm(edited).source);
    if (!updated.ok) throw new Error(JSON.stringify(updated.issues));
    expect(updated.value.newVersion).toBe(true);
    const v2 = await lessonForViewer(db(), slug, trainee);
    expect(v2?.versionNumber).toBe(2);
    expect(v2?.lesson.passMark).toBe(90);

    // The old attempt's page: its own grade, its one criterion, and "v1".
    const cookie = await sessionCookie("trainer@tidemark.example");
    // The trainer sees it only as a trainer of the trainee's class: the demo class holds trainee@.
    const page = await callRoute(attemptPage.loader, get(`/attempts/${a1.attempt.id}`, cookie), {
      params: { id: a1.attempt.id },
    });
    expect(page.status).toBe(200);
    const d = page.data as {
      versionNumber: number;
      outdated: boolean;
      attempt: { score: number; results: GradeResult };
    };
    expect(d.versionNumber).toBe(1);
    expect(d.outdated).toBe(true);
    expect(d.attempt.score).toBe(v1Score);
    expect(d.attempt.results.passMark).toBe(70);
    expect(d.attempt.results.task.map((i) => i.id)).toEqual(["c1"]);

    // A submit from a page opened on v1 is still graded on v1; a new one on v2.
    const onV1 = await createAttempt(
      db(),
      trainee.id,
      {
        lesson: slug,
        version: v1!.lesson.version,
        answers: {},
        spec: ROOF,
        idempotencyKey: key(),
        timeSpentSeconds: 0,
      },
      () => v2!.lesson,
    );
    expect("attempt" in onV1 && onV1.attempt.results.task.map((i) => i.id)).toEqual(["c1"]);
    const onV2 = await submitAttempt(
      { ...trainee, email: "", name: "" },
      { lesson: slug, answers: { q1: "150 mm", q2: ["a", "c"] }, spec: ROOF, idempotencyKey: key() },
    );
    expect("attempt" in onV2 && onV2.attempt.results.task.map((i) => i.id)).toEqual(["c1", "c2"]);
    const versions = await db()("lesson_versions").where({ slug }).orderBy("number").select("number", "created_by");
    expect(versions).toEqual([
      { number: 1, created_by: trainer.id },
      { number: 2, created_by: trainer.id },
    ]);
  });

  it("a trainee never sees a draft; another organisation never sees the lesson at all (404)", async () => {
    const trainer = await viewer("trainer@tidemark.example");
    const created = await createLesson(db(), trainer, sourceFromForm(form({ title: "A draft for later" })).source);
    if (!created.ok) throw new Error("not created");
    const slug = created.value.slug;
    const trainee = await viewer("trainee@tidemark.example");
    const other = await otherOrganisationTrainer();

    expect(await lessonForViewer(db(), slug, trainer)).not.toBeNull();
    expect(await lessonForViewer(db(), slug, trainee)).toBeNull();
    expect(await lessonForViewer(db(), slug, other)).toBeNull();
    expect(await lessonForViewer(db(), slug, null)).toBeNull();
    expect((await visibleLessons(db(), trainee)).map((e) => e.lesson.slug)).not.toContain(slug);

    const traineeCookie = await sessionCookie("trainee@tidemark.example");
    const asTrainee = await callRoute(lessonPage.loader, get(`/lessons/${slug}`, traineeCookie), { params: { slug } });
    expect(asTrainee.status).toBe(404);
    const res = (await apiLessons.loader({
      request: get("/api/v1/lessons", traineeCookie),
      params: {},
      context: {},
    } as never)) as Response;
    const listed = (await res.json()) as { lessons: { slug: string }[] };
    expect(listed.lessons.map((l) => l.slug)).not.toContain(slug);

    await publishLesson(db(), trainer, slug);
    expect(await lessonForViewer(db(), slug, trainee)).not.toBeNull();
    expect(await lessonForViewer(db(), slug, other)).toBeNull();
    // Not editable, publishable or exportable from another organisation either.
    expect(await updateLesson(db(), other, slug, sourceFromForm(form()).source)).toMatchObject({
      ok: false,
      status: 404,
    });
    expect(await exportLesson(db(), slug, other)).toBeNull();
    // Built-in lessons stay visible to everyone, exactly as before.
    const builtIn = (await visibleLessons(db(), null)).map((e) => e.lesson.slug);
    expect((await visibleLessons(db(), other)).map((e) => e.lesson.slug)).toEqual(builtIn);
  });

  it("refuses a bad lesson with the loader's messages, naming each field", async () => {
    const trainer = await viewer("trainer@tidemark.example");
    const bad = form({ minutes: "ten", body: "No figure here." });
    bad.quiz[0].answer = "150";
    const r = await createLesson(db(), trainer, sourceFromForm(bad).source);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.status).toBe(400);
    const paths = r.issues.map((i) => i.path);
    expect(paths).toContain("minutes");
    expect(paths).toContain("quiz.0.answer");
    expect(paths).toContain("body");
    expect(r.issues.find((i) => i.path === "quiz.0.answer")?.message).toMatch(/needs a unit/);
  });

  it("built-in lessons are read-only and can be duplicated into the organisation as a draft", async () => {
    const trainer = await viewer("trainer@tidemark.example");
    expect(await updateLesson(db(), trainer, "reading-falls", "x")).toMatchObject({ ok: false, status: 403 });
    const copy = await duplicateLesson(db(), trainer, "reading-falls");
    if (!copy.ok) throw new Error(JSON.stringify(copy.issues));
    const entry = await lessonForViewer(db(), copy.value.slug, trainer);
    expect(entry).toMatchObject({ builtIn: false, status: "draft", editable: true });
    expect(entry!.lesson.title).toMatch(/\(copy\)$/);
    expect(entry!.lesson.quiz).toEqual((await lessonForViewer(db(), "reading-falls", null))!.lesson.quiz);
  });

  it("exports a lesson as a lesson file and imports it back as the same lesson; a broken file is refused", async () => {
    const trainer = await viewer("trainer@tidemark.example");
    const other = await otherOrganisationTrainer();
    const created = await createLesson(
      db(),
      trainer,
      sourceFromForm(form({ title: "Moving between organisations" })).source,
    );
    if (!created.ok) throw new Error("not created");
    await publishLesson(db(), trainer, created.value.slug);
    const file = await exportLesson(db(), created.value.slug, trainer);
    expect(file?.fileName).toMatch(/^\d{2,3}-moving-between-organisations\.md$/);
    const imported = await importLesson(db(), other, file!.fileName, file!.source);
    if (!imported.ok) throw new Error(JSON.stringify(imported.issues));
    const strip = ({ slug: _s, position: _p, file: _f, ...rest }: Record<string, unknown>) => rest;
    expect(strip({ ...imported.value.lesson })).toEqual(strip({ ...created.value.lesson }));
    expect(imported.value.lesson.version).toBe(created.value.lesson.version);
    expect((await lessonForViewer(db(), imported.value.slug, other))?.status).toBe("draft");

    // A built-in lesson's export is its file, byte for byte.
    const builtIn = await exportLesson(db(), "reading-falls", null);
    expect(builtIn?.fileName).toBe("01-reading-falls.md");

    const broken = await importLesson(db(), other, "x.md", file!.source.replace(/passMark: \d+/, "passMark: lots"));
    expect(broken).toMatchObject({ ok: false, status: 400 });
    if (!broken.ok) expect(broken.issues.map((i) => i.path)).toContain("passMark");
    const notYaml = await importLesson(db(), other, "x.md", "---\ntitle: [\n---\nbody");
    expect(notYaml.ok).toBe(false);
  });
});

describe("the editor's pages answer bad input with 4xx by field, never 500", () => {
  const fields = (f: LessonForm): Record<string, string> => {
    const out: Record<string, string> = {
      title: f.title,
      summary: f.summary,
      minutes: f.minutes,
      objectives: f.objectives,
      passMark: f.passMark,
      body: f.body,
      "task.title": f.task.title,
      "task.goal": f.task.goal,
      "task.start": f.task.start,
      "task.reference": f.task.reference,
      "task.hints": f.task.hints,
    };
    f.quiz.forEach((q, i) => {
      for (const [k, v] of Object.entries(q)) out[`quiz.${i}.${k}`] = String(v);
    });
    f.task.criteria.forEach((c, i) => {
      out[`task.criteria.${i}.kind`] = c.kind;
      out[`task.criteria.${i}.value`] = c.value;
      out[`task.criteria.${i}.weight`] = c.weight;
    });
    return out;
  };

  it("a bad form: 400, the message beside each field, what was typed kept; nothing saved", async () => {
    const cookie = await sessionCookie("trainer@tidemark.example");
    const bad = form({ title: "Typed title stays", passMark: "lots", minutes: "0" });
    bad.task.start = "{ not json";
    bad.quiz[1].kind = "single"; // two options are starred
    const before = (await db()("lessons").count<{ count: string }[]>("* as count"))[0].count;
    const r = await callRoute(newLesson.action, formPost("/lessons/new", { ...fields(bad), intent: "save" }, cookie));
    expect(r.status).toBe(400);
    const d = r.data as { fieldErrors: Record<string, string>; form: LessonForm };
    expect(d.fieldErrors["task.start"]).toMatch(/not valid JSON/);
    expect(d.fieldErrors["quiz.1.options"]).toMatch(/exactly one right option/);
    expect(d.form.title).toBe("Typed title stays");
    expect(d.form.passMark).toBe("lots");
    // With the form's own problems fixed, the schema's turn: each field named.
    bad.task.start = JSON.stringify(ROOF);
    bad.quiz[1].kind = "multiple";
    const r2 = await callRoute(newLesson.action, formPost("/lessons/new", { ...fields(bad), intent: "save" }, cookie));
    expect(r2.status).toBe(400);
    const e2 = (r2.data as { fieldErrors: Record<string, string> }).fieldErrors;
    expect(Object.keys(e2)).toEqual(expect.arrayContaining(["passMark", "minutes"]));
    expect((await db()("lessons").count<{ count: string }[]>("* as count"))[0].count).toBe(before);
  });

  it("preview answers 200 with trial grades and saves nothing; trainees get 403; another organisation's edit page is 404", async () => {
    const cookie = await sessionCookie("trainer@tidemark.example");
    const r = await callRoute(
      newLesson.action,
      formPost("/lessons/new", { ...fields(form({ title: "Previewed, never saved" })), intent: "preview" }, cookie),
    );
    expect(r.status).toBe(200);
    const d = r.data as { preview: { reference: GradeResult; start: GradeResult } };
    expect(d.preview.reference.passed).toBe(true);
    expect(await db()("lessons").where({ title: "Previewed, never saved" })).toHaveLength(0);

    const trainee = await sessionCookie("trainee@tidemark.example");
    const t = await callRoute(
      newLesson.action,
      formPost("/lessons/new", { ...fields(form()), intent: "save" }, trainee),
    );
    expect(t.status).toBe(403);
    const page = await callRoute(newLesson.loader, get("/lessons/new", trainee));
    expect(page.status).toBe(403);

    const own = await viewer("trainer@tidemark.example");
    const created = await createLesson(db(), own, sourceFromForm(form({ title: "Only ours" })).source);
    if (!created.ok) throw new Error("not created");
    const admin = await sessionCookie("admin@tidemark.example");
    const ok = await callRoute(editLesson.loader, get(`/lessons/${created.value.slug}/edit`, admin), {
      params: { slug: created.value.slug },
    });
    expect(ok.status).toBe(200);
    const other = await otherOrganisationTrainer();
    const otherCookie = await sessionCookie((await db()("users").where({ id: other.id }).first("email"))!.email);
    const hidden = await callRoute(editLesson.loader, get(`/lessons/${created.value.slug}/edit`, otherCookie), {
      params: { slug: created.value.slug },
    });
    expect(hidden.status).toBe(404);
  });

  it("a broken lesson file on import: 400 listing the loader's problems", async () => {
    const cookie = await sessionCookie("trainer@tidemark.example");
    const r = await callRoute(
      newLesson.action,
      formPost("/lessons/new", { intent: "import", source: "---\ntitle: Half a lesson\n---\nNo figure.\n" }, cookie),
    );
    expect(r.status).toBe(400);
    const paths = (r.data as { issues: { path: string }[] }).issues.map((i) => i.path);
    expect(paths).toEqual(expect.arrayContaining(["summary", "minutes", "quiz", "task", "body"]));
  });
});
