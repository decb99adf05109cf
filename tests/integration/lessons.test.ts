import { describe, expect, it } from "vitest";
import { useTestDatabase } from "../support/db";
import { call, cookieFor, getRequest, jsonRequest, userId } from "../support/roofs";
import * as attemptsApi from "~/routes/api.v1.attempts";
import * as attemptApi from "~/routes/api.v1.attempts.$id";
import * as lessonsApi from "~/routes/api.v1.lessons";
import * as lessonApi from "~/routes/api.v1.lessons.$slug";
import * as player from "~/routes/lessons.$slug";
import * as attemptPage from "~/routes/attempts.$id";
import { createAttempt } from "~/lib/lessons/attempts.server";
import { allLessons, ensureLessonsSynced, getLesson } from "~/lib/lessons/catalogue.server";
import { nextVersionNumber, syncLessons } from "~/lib/lessons/sync.server";
import { roofTaskOf, type Lesson } from "~/lib/lessons/schema";

const { db } = useTestDatabase();

const OUTLETS = getLesson("outlets-and-overflows")!;
const OUTLETS_TASK = roofTaskOf(OUTLETS);
const rightAnswers = (l: Lesson) =>
  Object.fromEntries(l.quiz.map((q) => [q.id, q.kind === "choice" ? q.correct : q.answer]));
const body = (over: Record<string, unknown> = {}) => ({
  lesson: OUTLETS.slug,
  answers: rightAnswers(OUTLETS),
  spec: OUTLETS_TASK.start,
  idempotencyKey: `k-${Math.random().toString(36).slice(2, 12)}`,
  timeSpentSeconds: 95,
  ...over,
});
const post = (b: unknown, cookie?: string, headers?: Record<string, string>) =>
  call(attemptsApi.action, jsonRequest("POST", "/api/v1/attempts", b, cookie, headers));

describe("lessons in the database", () => {
  it("are synced by the seed: one row per lesson file, the current version in lesson_versions", async () => {
    const rows = await db()("lessons").select("slug", "version", "position", "title");
    for (const l of allLessons()) {
      expect(rows).toContainEqual({ slug: l.slug, version: l.version, position: l.position, title: l.title });
      expect(await db()("lesson_versions").where({ slug: l.slug, version: l.version }).first("slug")).toBeTruthy();
    }
  });

  it("sync again is idempotent, and a changed file adds a version without losing the old one", async () => {
    await ensureLessonsSynced(db());
    const before = await db()("lesson_versions").count<{ count: string }[]>("* as count");
    expect((await syncLessons(db(), allLessons())).changed).toEqual([]);
    const edited = { ...allLessons()[0], version: "f".repeat(64), title: "Edited title" };
    expect((await syncLessons(db(), [edited])).changed).toEqual([edited.slug]);
    const after = await db()("lesson_versions").count<{ count: string }[]>("* as count");
    expect(Number(after[0].count)).toBe(Number(before[0].count) + 1);
    expect(await db()("lessons").where({ slug: edited.slug }).first("title", "version")).toEqual({
      title: "Edited title",
      version: "f".repeat(64),
    });
    await syncLessons(db(), [allLessons()[0]]);
    expect(await db()("lessons").where({ slug: edited.slug }).first("title")).toEqual({ title: allLessons()[0].title });
  });

  it("has the demo trainees' attempts, graded by the real grader", async () => {
    const tess = await userId("trainee@tidemark.example");
    const rows = await db()("attempts").where({ trainee_id: tess }).orderBy("submitted_at");
    expect(rows.map((r) => [r.lesson_slug, r.passed])).toEqual([
      ["reading-falls", true],
      ["why-water-stands", false],
      ["why-water-stands", true],
    ]);
    expect(rows[0].score).toBe(100);
    const failed = (rows[1].results as { task: { id: string }[] }).task.find((i) => i.id === "flat-area");
    // Joists along x with the outlet on the front edge leave about 67 m² of the 72 m² roof flatter than 1:100.
    expect(failed).toMatchObject({ passed: false, measured: expect.stringMatching(/^6\d\.\d+ m²$/) });
  });
});

describe("one attempt row per idempotency key", () => {
  it("two concurrent submits with one key make one row and both answer with it", async () => {
    const trainee = await userId("trainee4@tidemark.example");
    const sub = { ...body(), answers: rightAnswers(OUTLETS), version: undefined, timeSpentSeconds: 10 } as Parameters<
      typeof createAttempt
    >[2];
    const [a, b] = await Promise.all([
      createAttempt(db(), trainee, sub, getLesson),
      createAttempt(db(), trainee, sub, getLesson),
    ]);
    if (!("attempt" in a) || !("attempt" in b)) throw new Error("not created");
    expect(a.attempt.id).toBe(b.attempt.id);
    expect([a.status, b.status].sort()).toEqual([200, 201]);
    expect(
      await db()("attempts")
        .where({ trainee_id: trainee, idempotency_key: sub.idempotencyKey })
        .count<{ count: string }[]>("* as count"),
    ).toEqual([{ count: "1" }]);
  });

  it("through the API: 201 then 200 with the same attempt; five racing posts still one row", async () => {
    const cookie = await cookieFor("trainee3@tidemark.example");
    const b = body();
    const first = await post(b, cookie);
    expect(first.status).toBe(201);
    const created = (await first.json()).attempt;
    const again = await post(b, cookie);
    expect(again.status).toBe(200);
    expect((await again.json()).attempt.id).toBe(created.id);

    const race = body();
    const all = await Promise.all(Array.from({ length: 5 }, () => post(race, cookie)));
    const ids = new Set(await Promise.all(all.map(async (r) => (await r.json()).attempt.id)));
    expect(ids.size).toBe(1);
    expect(all.filter((r) => r.status === 201)).toHaveLength(1);
    expect(
      await db()("attempts").where({ idempotency_key: race.idempotencyKey }).count<{ count: string }[]>("* as count"),
    ).toEqual([{ count: "1" }]);
  });

  it("the player's form double submit makes one attempt too", async () => {
    const cookie = await cookieFor("trainee2@tidemark.example");
    const fields = new URLSearchParams({
      idempotencyKey: "form-key-0001",
      version: OUTLETS.version,
      spec: JSON.stringify(OUTLETS_TASK.reference),
      timeSpentSeconds: "61",
    });
    for (const [id, v] of Object.entries(rightAnswers(OUTLETS)))
      for (const x of [v].flat()) fields.append(`q:${id}`, x as string);
    const submit = () =>
      call(
        player.action,
        new Request(`http://localhost/lessons/${OUTLETS.slug}`, {
          method: "POST",
          headers: { "Content-Type": "application/x-www-form-urlencoded", cookie },
          body: fields,
        }),
        { slug: OUTLETS.slug },
      );
    const [x, y] = await Promise.all([submit(), submit()]);
    const [dx, dy] = [await x.json(), await y.json()];
    expect(dx.attempt.id).toBe(dy.attempt.id);
    expect(dx.attempt).toMatchObject({ passed: true, score: 100, timeSpentSeconds: 61 });
    expect(
      await db()("attempts").where({ idempotency_key: "form-key-0001" }).count<{ count: string }[]>("* as count"),
    ).toEqual([{ count: "1" }]);
  });
});

describe("attempts API: grading on the server and statuses", () => {
  it("grades the starting roof as failing and the moved outlet as passing, whatever score the browser sends", async () => {
    const cookie = await cookieFor("trainee@tidemark.example");
    const fail = await post({ ...body(), score: 100, passed: true, results: { task: [] } }, cookie);
    expect(fail.status).toBe(201);
    const failed = (await fail.json()).attempt;
    expect(failed.passed).toBe(false);
    const fallLine = failed.results.task.find((i: { id: string }) => i.id === "fall-line");
    // CHECK: docs/roof-method.md §3 and §7 by hand - H = 9 m / 60 = 150 mm; corner outlet to the far corner 20.12 m → 1:134.2.
    expect(fallLine).toMatchObject({
      passed: false,
      measured: expect.stringMatching(/^1:134\.2 over 20\.1 m, drop 150 mm$/),
    });
    expect(failed.results.quiz.every((q: { passed: boolean }) => q.passed)).toBe(true);
    // Quiz 5 of 5 + criteria 0 of 3, 1 of 1, 1 of 1: 7 of 10 points = 70, but the fall line is
    // required, so the score is capped at 69 (grading-rule.ts).
    expect(failed.results.rawScore).toBeCloseTo(70, 1);
    expect(failed.score).toBe(69);

    const moved = { ...(OUTLETS_TASK.start as object), outlets: [{ at: [9, 0] }] };
    const pass = await post(body({ spec: moved }), cookie);
    const passed = (await pass.json()).attempt;
    expect(passed).toMatchObject({ passed: true, score: 100, lessonVersion: OUTLETS.version, timeSpentSeconds: 95 });
    const row = await db()("attempts").where({ id: passed.id }).first();
    expect(row).toMatchObject({ passed: true, score: 100, lesson_slug: OUTLETS.slug, time_spent_s: 95 });
    expect((row!.spec as { outlets: unknown }).outlets).toEqual([{ at: [9, 0] }]);
  });

  it("answers 401, 415, 400, 404, 409 and 422 for bad submissions, never 500", async () => {
    const cookie = await cookieFor("trainee@tidemark.example");
    expect((await post(body())).status).toBe(401);
    expect((await post(body(), cookie, { "Content-Type": "text/plain" })).status).toBe(415);
    expect((await post("{nope", cookie)).status).toBe(400);
    expect((await post({ lesson: OUTLETS.slug }, cookie)).status).toBe(400);
    expect((await post(body({ idempotencyKey: "short" }), cookie)).status).toBe(400);
    expect((await post(body({ answers: { q1: { evil: true } } }), cookie)).status).toBe(400);
    expect((await post(body({ lesson: "no-such-lesson" }), cookie)).status).toBe(404);
    expect((await post(body({ version: "0".repeat(64) }), cookie)).status).toBe(409);
    const malformed = await post(body({ spec: { outline: "square" } }), cookie);
    expect(malformed.status).toBe(400);
    const unbuildable = await post(
      body({
        spec: {
          outline: [
            [0, 0],
            [10, 10],
            [10, 0],
            [0, 10],
          ],
          outlets: [],
          baseFall: "1:60",
        },
      }),
      cookie,
    );
    expect(unbuildable.status).toBe(422);
    expect((await unbuildable.json()).error.message).toMatch(/cannot be built/);
    for (const junk of [null, 42, [], "x", { lesson: 1 }, body({ timeSpentSeconds: -1 }), body({ spec: null })]) {
      const r = await post(junk, cookie);
      expect([400, 422]).toContain(r.status);
    }
  });

  it("grades an attempt on the lesson version it names, if that version is stored", async () => {
    const cookie = await cookieFor("trainee@tidemark.example");
    const old = {
      ...OUTLETS,
      version: "a".repeat(64),
      passMark: 10,
      task: { ...OUTLETS_TASK, criteria: OUTLETS_TASK.criteria.slice(1) },
    };
    await db()("lesson_versions").insert({
      slug: old.slug,
      version: old.version,
      content: JSON.stringify(old),
      number: nextVersionNumber(db(), old.slug) as unknown as number,
    });
    const r = await post(body({ version: old.version }), cookie);
    expect(r.status).toBe(201);
    const a = (await r.json()).attempt;
    expect(a.lessonVersion).toBe(old.version);
    expect(a.results.task.map((i: { id: string }) => i.id)).not.toContain("fall-line");
    expect(a.passed).toBe(true);
  });

  it("lists my attempts; trainers see their own classes' trainees only; others get 403", async () => {
    const tess = await userId("trainee@tidemark.example");
    const list = async (q: string, email: string) =>
      call(attemptsApi.loader, getRequest(`/api/v1/attempts${q}`, await cookieFor(email)));
    const mine = await list("?mine=1", "trainee@tidemark.example");
    expect(mine.status).toBe(200);
    const attempts = (await mine.json()).attempts;
    expect(attempts.length).toBeGreaterThanOrEqual(3);
    expect(attempts.every((a: { traineeId: string }) => a.traineeId === tess)).toBe(true);
    expect((await list(`?trainee=${tess}`, "trainer@tidemark.example")).status).toBe(200);
    expect((await list(`?trainee=${tess}`, "trainer2@tidemark.example")).status).toBe(403);
    expect((await list(`?trainee=${tess}`, "trainee2@tidemark.example")).status).toBe(403);
    expect((await list(`?trainee=not-a-uuid`, "trainer@tidemark.example")).status).toBe(403);
    expect((await list(`?trainee=${tess}`, "admin@tidemark.example")).status).toBe(200);
    const filtered = await (await list("?mine=1&lesson=reading-falls", "trainee@tidemark.example")).json();
    expect(filtered.attempts.every((a: { lesson: string }) => a.lesson === "reading-falls")).toBe(true);
    expect((await call(attemptsApi.loader, getRequest("/api/v1/attempts?mine=1"))).status).toBe(401);
  });

  it("shows one attempt to its trainee and their trainer, and 404 to anyone else", async () => {
    const tess = await userId("trainee@tidemark.example");
    const row = await db()("attempts").where({ trainee_id: tess }).first("id");
    const one = async (email: string) =>
      call(attemptApi.loader, getRequest(`/api/v1/attempts/${row!.id}`, await cookieFor(email)), { id: row!.id });
    expect((await one("trainee@tidemark.example")).status).toBe(200);
    expect((await one("trainer@tidemark.example")).status).toBe(200);
    expect((await one("trainee2@tidemark.example")).status).toBe(404);
    expect((await one("trainer2@tidemark.example")).status).toBe(404);
    const page = async (email: string) =>
      call(attemptPage.loader, getRequest(`/attempts/${row!.id}`, await cookieFor(email)), { id: row!.id });
    expect((await page("trainee@tidemark.example")).status).toBe(200);
    expect((await page("trainee3@tidemark.example")).status).toBe(404);
  });

  it("serves the course and one lesson without answers or reference roofs", async () => {
    const listed = await (await call(lessonsApi.loader, getRequest("/api/v1/lessons"))).json();
    expect(listed.lessons.map((l: { slug: string }) => l.slug)).toEqual(allLessons().map((l) => l.slug));
    expect(listed.lessons[0].progress).toBeUndefined();
    const withProgress = await (
      await call(lessonsApi.loader, getRequest("/api/v1/lessons", await cookieFor("trainee@tidemark.example")))
    ).json();
    expect(withProgress.lessons.find((l: { slug: string }) => l.slug === "reading-falls").progress).toMatchObject({
      passed: true,
      bestScore: 100,
    });
    const res = await call(lessonApi.loader, getRequest(`/api/v1/lessons/${OUTLETS.slug}`), { slug: OUTLETS.slug });
    expect(res.status).toBe(200);
    const text = await res.text();
    const lesson = JSON.parse(text).lesson;
    expect(lesson.quiz).toHaveLength(OUTLETS.quiz.length);
    expect(lesson.task.start).toEqual(OUTLETS_TASK.start);
    expect(text).not.toMatch(/"reference"|"correct"|"answer"|"explanation"/);
    expect((await call(lessonApi.loader, getRequest("/api/v1/lessons/nope"), { slug: "nope" })).status).toBe(404);
  });
});
