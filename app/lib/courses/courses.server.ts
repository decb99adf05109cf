/**
 * Courses (docs/product.md capability 10): an organisation's ordered sets of lessons, and the
 * course a class follows. Trainers and admins see and edit every course of their organisation;
 * a trainee sees the courses their classes follow; anything else answers 404.
 */
import type { Knex } from "knex";
import { classUsableLessons } from "../lessons/access.server";
import type { SessionUser } from "~/lib/auth.server";
import { db } from "~/lib/db.server";
import { isUuid } from "~/lib/input";
import { can } from "~/lib/permissions";
import { spreadDueDates } from "~/lib/courses/due-dates";

export interface CourseRow {
  id: string;
  organisation_id: string;
  name: string;
  description: string;
}

export interface CourseSummary extends CourseRow {
  lessons: number;
  classes: number;
}

export interface LessonChoice {
  slug: string;
  title: string;
}

export interface CourseLesson extends LessonChoice {
  position: number;
}

/**
 * The lessons a course may include, for this viewer: the built-in lessons and the published ones
 * of the viewer's organisation (never drafts, never another organisation's), the same rule as a
 * class's assignments (`classUsableLessons`).
 */
export async function courseLessonChoices(
  knex: Knex,
  viewer: Pick<SessionUser, "id" | "organisationId">,
): Promise<LessonChoice[]> {
  // Built-in lessons and the organisation's published ones, as for a class's assignments.
  return classUsableLessons(knex("lessons").select("slug", "title"), viewer.organisationId).orderBy([
    { column: "position" },
    { column: "slug" },
  ]);
}

const COLUMNS = ["c.id", "c.organisation_id", "c.name", "c.description"];

function followedByMyClasses(userId: string) {
  return db()("classes as k")
    .join("class_members as m", "m.class_id", "k.id")
    .whereRaw("k.course_id = c.id")
    .where("m.user_id", userId);
}

/** The courses on the user's Courses page, by name. */
export async function listCoursesFor(user: SessionUser): Promise<CourseSummary[]> {
  const q = db()("courses as c")
    .select(COLUMNS)
    .select(db().raw(`(select count(*)::int from course_lessons l where l.course_id = c.id) as lessons`))
    .select(db().raw(`(select count(*)::int from classes k where k.course_id = c.id) as classes`))
    .orderByRaw("lower(c.name), c.created_at");
  if (can(user.role, "courses:manage")) q.where("c.organisation_id", user.organisationId);
  else q.whereExists(followedByMyClasses(user.id));
  return q;
}

/** The course if this user may see it ("view") or edit it ("manage"); else null (the caller answers 404). */
export async function getCourseFor(
  user: SessionUser,
  id: string,
  access: "view" | "manage",
): Promise<(CourseRow & { canManage: boolean }) | null> {
  if (!isUuid(id)) return null;
  const course: CourseRow | undefined = await db()("courses as c").where("c.id", id).first(COLUMNS);
  if (!course) return null;
  const canManage = can(user.role, "courses:manage") && course.organisation_id === user.organisationId;
  if (canManage) return { ...course, canManage };
  if (access === "view") {
    const follows = await db()("classes as k")
      .join("class_members as m", "m.class_id", "k.id")
      .where({ "k.course_id": course.id, "m.user_id": user.id })
      .first("k.id");
    if (follows) return { ...course, canManage };
  }
  return null;
}

export async function createCourse(user: SessionUser, input: { name: string; description: string }): Promise<string> {
  const [row] = await db()("courses")
    .insert({ organisation_id: user.organisationId, created_by: user.id, ...input })
    .returning("id");
  return row.id;
}

export async function updateCourse(id: string, input: { name: string; description: string }) {
  await db()("courses")
    .where({ id })
    .update({ ...input, updated_at: db().fn.now() });
}

export async function courseLessons(courseId: string, knex: Knex = db()): Promise<CourseLesson[]> {
  return knex("course_lessons as cl")
    .join("lessons as l", "l.slug", "cl.lesson_slug")
    .where("cl.course_id", courseId)
    .select("cl.lesson_slug as slug", "l.title", "cl.position")
    .orderBy([{ column: "cl.position" }, { column: "cl.lesson_slug" }]);
}

/** Writes the course's lessons in this order (positions 1, 2, 3, ...), in one transaction. */
export async function setCourseLessons(courseId: string, slugs: string[]) {
  await db().transaction(async (trx) => {
    await trx("course_lessons").where({ course_id: courseId }).delete();
    if (slugs.length)
      await trx("course_lessons").insert(
        slugs.map((slug, i) => ({ course_id: courseId, lesson_slug: slug, position: i + 1 })),
      );
    await trx("courses").where({ id: courseId }).update({ updated_at: trx.fn.now() });
  });
}

/** The classes that follow a course and that this user runs (their own, or all of the organisation for an admin). */
export async function classesFollowing(user: SessionUser, courseId: string) {
  const q = db()("classes as k")
    .where("k.course_id", courseId)
    .select("k.id", "k.name", "k.starts_on", "k.ends_on")
    .orderByRaw("k.starts_on desc nulls last, k.name");
  if (user.role === "admin") q.where("k.organisation_id", user.organisationId);
  else if (user.role === "trainer") q.where("k.trainer_id", user.id);
  else q.whereExists(db()("class_members as m").whereRaw("m.class_id = k.id").where("m.user_id", user.id));
  return q as Promise<{ id: string; name: string; starts_on: string | null; ends_on: string | null }[]>;
}

/** For the class page: the course the class follows and the courses it could follow. */
export async function classCourseChoice(user: SessionUser, classId: string) {
  const [row, courses] = await Promise.all([
    db()("classes").where({ id: classId }).first("course_id"),
    db()("courses").where({ organisation_id: user.organisationId }).select("id", "name").orderByRaw("lower(name)"),
  ]);
  return { courseId: (row?.course_id as string | null) ?? null, courses: courses as { id: string; name: string }[] };
}

/**
 * A class follows a course: the course's lessons become the class's assignments in one step,
 * due dates spread over the class's days (spreadDueDates). Other assignments stay. With no
 * course, the class follows none and its assignments stay as they are.
 */
export async function followCourse(
  cls: { id: string; organisation_id: string; starts_on: string | null; ends_on: string | null },
  courseId: string | null,
): Promise<{ assigned: number } | null> {
  return db().transaction(async (trx) => {
    if (courseId === null) {
      await trx("classes").where({ id: cls.id }).update({ course_id: null });
      return { assigned: 0 };
    }
    const course = await trx("courses").where({ id: courseId, organisation_id: cls.organisation_id }).first("id");
    if (!course) return null;
    await trx("classes").where({ id: cls.id }).update({ course_id: courseId });
    const lessons = await courseLessons(courseId, trx);
    const due = spreadDueDates(cls.starts_on, cls.ends_on, lessons.length);
    for (const [i, l] of lessons.entries()) {
      await trx("assignments")
        .insert({ class_id: cls.id, lesson_slug: l.slug, due_on: due[i] })
        .onConflict(["class_id", "lesson_slug"])
        .merge(["due_on"]);
    }
    return { assigned: lessons.length };
  });
}
