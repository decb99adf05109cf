import { beforeAll, describe, expect, it } from "vitest";
import { useTestDatabase } from "../support/db";
import { callRoute, formPost, get, sessionCookie, uniqueAddress } from "../support/accounts";
import { demoClassId, ensureLesson, insertAttempt, makeTrainee } from "../support/classes";
import * as coursesPage from "~/routes/courses._index";
import * as coursePage from "~/routes/courses.$id";
import * as classPage from "~/routes/classes.$id";

// docs/product.md capability 10: courses are an organisation's; trainers and admins edit them,
// trainees see the courses their classes follow, designers none.
const database = useTestDatabase();
const LESSONS = ["zz-course-a", "zz-course-b", "zz-course-c"];

let trainer: string;
let courseId: string;

const act = (fields: Record<string, string>, cookie = trainer) =>
  callRoute(coursePage.action, formPost(`/courses/${courseId}`, fields, cookie), { params: { id: courseId } });
const order = async () =>
  (await database.db()("course_lessons").where({ course_id: courseId }).orderBy("position").select("lesson_slug")).map(
    (r) => r.lesson_slug,
  );

beforeAll(async () => {
  trainer = await sessionCookie("trainer@tidemark.example");
  for (const [i, slug] of LESSONS.entries()) await ensureLesson(slug, `Course lesson ${"ABC"[i]}`, 950 + i);
});

describe("courses", () => {
  it("a nameless course is 400 naming the field and keeping what was typed; a named one is created", async () => {
    const bad = await callRoute(
      coursesPage.action,
      formPost("/courses", { name: " ", description: "Kept text" }, trainer),
    );
    expect(bad.status).toBe(400);
    expect(bad.data).toMatchObject({
      errors: { name: "Give the course a name." },
      values: { description: "Kept text" },
    });
    const long = await callRoute(
      coursesPage.action,
      formPost("/courses", { name: "x".repeat(121), description: "" }, trainer),
    );
    expect(long.status).toBe(400);
    expect((long.data as { errors: { name: string } }).errors.name).toMatch(/120/);
    const ok = await callRoute(
      coursesPage.action,
      formPost("/courses", { name: "Outlets and overflows, refresher", description: "" }, trainer),
    );
    expect(ok.status).toBe(302);
    courseId = /\/courses\/([0-9a-f-]{36})/.exec(ok.location ?? "")![1];
  });

  it("lessons are added once, moved up and down, and removed; an unknown lesson is 400 naming it", async () => {
    for (const lesson of LESSONS) expect((await act({ intent: "add", lesson })).status).toBe(200);
    expect(await order()).toEqual(LESSONS);
    const twice = await act({ intent: "add", lesson: LESSONS[0] });
    expect(twice.status).toBe(400);
    expect(twice.data).toMatchObject({ lessonError: expect.stringMatching(/already in the course/) });
    const unknown = await act({ intent: "add", lesson: "no-such-lesson" });
    expect(unknown.status).toBe(400);
    expect(unknown.data).toMatchObject({ lesson: "no-such-lesson", lessonError: expect.any(String) });

    expect((await act({ intent: "move", lesson: LESSONS[2], direction: "up" })).status).toBe(200);
    expect(await order()).toEqual([LESSONS[0], LESSONS[2], LESSONS[1]]);
    expect((await act({ intent: "move", lesson: LESSONS[0], direction: "down" })).status).toBe(200);
    expect(await order()).toEqual([LESSONS[2], LESSONS[0], LESSONS[1]]);
    // Up from the top leaves the order as it was.
    expect((await act({ intent: "move", lesson: LESSONS[2], direction: "up" })).status).toBe(200);
    expect(await order()).toEqual([LESSONS[2], LESSONS[0], LESSONS[1]]);
    expect((await act({ intent: "move", lesson: LESSONS[2], direction: "sideways" })).status).toBe(400);

    expect((await act({ intent: "remove", lesson: LESSONS[0] })).status).toBe(200);
    expect(await order()).toEqual([LESSONS[2], LESSONS[1]]);
    const positions = await database
      .db()("course_lessons")
      .where({ course_id: courseId })
      .orderBy("position")
      .pluck("position");
    expect(positions).toEqual([1, 2]);
  });

  it("the name and description are edited with field errors that keep what was typed", async () => {
    const bad = await act({ intent: "details", name: "", description: "d".repeat(2001) });
    expect(bad.status).toBe(400);
    expect(bad.data).toMatchObject({
      errors: { name: expect.any(String), description: expect.stringMatching(/2,000/) },
      values: { description: "d".repeat(2001) },
    });
    expect(
      (await act({ intent: "details", name: "Outlets, refresher", description: "Two short lessons." })).status,
    ).toBe(200);
    expect(await database.db()("courses").where({ id: courseId }).first("name", "description")).toEqual({
      name: "Outlets, refresher",
      description: "Two short lessons.",
    });
  });

  it("trainers and admins of the organisation see and edit it; a trainee only once their class follows it; a designer never", async () => {
    const open = async (email: string) =>
      callRoute(coursePage.loader, get(`/courses/${courseId}`, await sessionCookie(email)), {
        params: { id: courseId },
      });
    expect((await open("trainer2@tidemark.example")).status).toBe(200);
    expect((await open("admin@tidemark.example")).status).toBe(200);
    expect((await open("trainee@tidemark.example")).status).toBe(404);
    expect((await open("designer@tidemark.example")).status).toBe(403);
    const list = async (email: string) =>
      (await callRoute(coursesPage.loader, get("/courses", await sessionCookie(email)))).data as {
        courses: { id: string }[];
      };
    expect((await list("trainee@tidemark.example")).courses.map((c) => c.id)).not.toContain(courseId);

    // The demo class (trainer@'s, with trainee@ in it) follows the course: now trainee@ sees it, read-only.
    const classId = await demoClassId();
    const follow = await callRoute(
      classPage.action,
      formPost(`/classes/${classId}`, { intent: "course", courseId }, trainer),
      { params: { id: classId } },
    );
    expect(follow.status).toBe(200);
    const seen = await open("trainee@tidemark.example");
    expect(seen.status).toBe(200);
    expect((seen.data as { course: { canManage: boolean } }).course.canManage).toBe(false);
    expect((await list("trainee@tidemark.example")).courses.map((c) => c.id)).toContain(courseId);
    const edit = await callRoute(
      coursePage.action,
      formPost(
        `/courses/${courseId}`,
        { intent: "remove", lesson: LESSONS[1] },
        await sessionCookie("trainee@tidemark.example"),
      ),
      { params: { id: courseId } },
    );
    expect(edit.status).toBe(403);
    expect(await order()).toEqual([LESSONS[2], LESSONS[1]]);
  });

  it("a class without dates follows a course with no due dates", async () => {
    const [cls] = await database
      .db()("classes")
      .insert({
        organisation_id: (await database.db()("courses").where({ id: courseId }).first("organisation_id"))!
          .organisation_id,
        trainer_id: (await database.db()("users").where({ email: "trainer@tidemark.example" }).first("id"))!.id,
        name: "Undated course class",
      })
      .returning("id");
    const res = await callRoute(
      classPage.action,
      formPost(`/classes/${cls.id}`, { intent: "course", courseId }, trainer),
      { params: { id: cls.id } },
    );
    expect(res.status).toBe(200);
    const rows = await database.db()("assignments").where({ class_id: cls.id }).select("lesson_slug", "due_on");
    expect(rows).toHaveLength(2);
    expect(rows.every((r) => r.due_on === null)).toBe(true);
  });
});

describe("following a course after the lessons were passed", () => {
  it("a member who already passed every lesson gets the certificate when the class follows the course; one who did not gets none", async () => {
    const org = (await database.db()("courses").where({ id: courseId }).first("organisation_id"))!.organisation_id;
    const trainerId = (await database.db()("users").where({ email: "trainer@tidemark.example" }).first("id"))!.id;
    const [cls] = await database
      .db()("classes")
      .insert({ organisation_id: org, trainer_id: trainerId, name: "Late follower class" })
      .returning("id");
    const done = await makeTrainee(uniqueAddress("late-done"), "Odile Farrant", cls.id);
    const halfway = await makeTrainee(uniqueAddress("late-half"), "Piet Lanzerac", cls.id);
    const lessons = await database.db()("course_lessons").where({ course_id: courseId }).pluck("lesson_slug");
    expect(lessons.length).toBeGreaterThan(1);
    for (const slug of lessons) await insertAttempt(done, slug, { score: 90, passed: true });
    await insertAttempt(halfway, lessons[0], { score: 90, passed: true });

    const res = await callRoute(
      classPage.action,
      formPost(`/classes/${cls.id}`, { intent: "course", courseId }, trainer),
      { params: { id: cls.id } },
    );
    expect(res.status).toBe(200);
    expect((res.data as { notice: string }).notice).toMatch(/1 trainee has already passed every lesson/);
    expect(
      await database.db()("certificates").where({ trainee_id: done, course_id: courseId }).count("* as n"),
    ).toEqual([{ n: "1" }]);
    expect(await database.db()("certificates").where({ trainee_id: halfway })).toEqual([]);
  });
});
