/**
 * Classes: who may see which class, its roster, pending invitations and assignments.
 * The rule (docs/product.md capability 5): trainers see their own classes and those classes'
 * trainees; trainees see the classes they belong to; admins see every class of their
 * organisation. Anything else answers 404, so ids of other classes reveal nothing.
 */
import { data } from "react-router";
import type { SessionUser } from "~/lib/auth.server";
import { db } from "~/lib/db.server";
import { classUsableLessons } from "~/lib/lessons/access.server";
import type { GradeCell } from "~/lib/gradebook";
import { bestGrades, cellKey } from "~/lib/grades.server";

import { isUuid } from "~/lib/input";

export { isUuid };

export function notFound(what = "Not found"): never {
  throw data(what, { status: 404 });
}

export interface ClassRow {
  id: string;
  name: string;
  starts_on: string | null;
  ends_on: string | null;
  venue: string;
  trainer_id: string;
  organisation_id: string;
  trainer_name: string;
}

/** "manage": the class's trainer or an admin. "follow": those, or a member of the class. */
export type ClassAccess = "manage" | "follow";

const CLASS_COLUMNS = [
  "c.id",
  "c.name",
  "c.starts_on",
  "c.ends_on",
  "c.venue",
  "c.trainer_id",
  "c.organisation_id",
  "t.name as trainer_name",
];

export function canManageClass(user: SessionUser, cls: Pick<ClassRow, "trainer_id" | "organisation_id">): boolean {
  if (user.role === "admin") return cls.organisation_id === user.organisationId;
  return user.role === "trainer" && cls.trainer_id === user.id;
}

export async function isMember(classId: string, userId: string): Promise<boolean> {
  return !!(await db()("class_members").where({ class_id: classId, user_id: userId }).first("user_id"));
}

/** The class if this user may see it in the given way, else null (for resource routes). */
export async function getClassFor(user: SessionUser, id: string, access: ClassAccess): Promise<ClassRow | null> {
  if (!isUuid(id)) return null;
  const cls: ClassRow | undefined = await db()("classes as c")
    .join("users as t", "t.id", "c.trainer_id")
    .where("c.id", id)
    .first(CLASS_COLUMNS);
  if (!cls) return null;
  if (canManageClass(user, cls)) return cls;
  if (access === "follow" && (await isMember(cls.id, user.id))) return cls;
  return null;
}

/** The class if this user may see it in the given way; otherwise a 404 response is thrown. */
export async function findClassFor(user: SessionUser, id: string, access: ClassAccess): Promise<ClassRow> {
  return (await getClassFor(user, id, access)) ?? notFound("Class not found");
}

export interface ClassSummary {
  id: string;
  name: string;
  starts_on: string | null;
  ends_on: string | null;
  venue: string;
  trainer_name: string;
  members: number;
  pending: number;
  assignments: number;
}

/** The classes on the user's Classes page, newest start first. */
export async function listClassesFor(user: SessionUser): Promise<ClassSummary[]> {
  const q = db()("classes as c")
    .join("users as t", "t.id", "c.trainer_id")
    .select("c.id", "c.name", "c.starts_on", "c.ends_on", "c.venue", "t.name as trainer_name")
    .select(db().raw(`(select count(*)::int from class_members m where m.class_id = c.id) as members`))
    .select(
      db().raw(
        `(select count(distinct lower(k.email))::int from tokens k where k.class_id = c.id and k.kind = 'invitation' and k.used_at is null and k.expires_at > now()) as pending`,
      ),
    )
    .select(db().raw(`(select count(*)::int from assignments s where s.class_id = c.id) as assignments`))
    .orderByRaw("c.starts_on desc nulls last, c.created_at desc");
  if (user.role === "admin") q.where("c.organisation_id", user.organisationId);
  else if (user.role === "trainer") q.where("c.trainer_id", user.id);
  else q.whereExists(db()("class_members as m").whereRaw("m.class_id = c.id").where("m.user_id", user.id));
  return q;
}

export interface CreateClassInput {
  name: string;
  startsOn: string | null;
  endsOn: string | null;
  venue: string;
}

export async function createClass(user: SessionUser, input: CreateClassInput): Promise<string> {
  const [row] = await db()("classes")
    .insert({
      organisation_id: user.organisationId,
      trainer_id: user.id,
      name: input.name,
      starts_on: input.startsOn,
      ends_on: input.endsOn,
      venue: input.venue,
    })
    .returning("id");
  return row.id;
}

export async function updateClass(classId: string, input: CreateClassInput) {
  await db()("classes")
    .where({ id: classId })
    .update({ name: input.name, starts_on: input.startsOn, ends_on: input.endsOn, venue: input.venue });
}

export interface Member {
  id: string;
  name: string;
  email: string;
  role: string;
  active: boolean;
  joined_at: string;
}

export async function classRoster(classId: string): Promise<Member[]> {
  const rows = await db()("class_members as m")
    .join("users as u", "u.id", "m.user_id")
    .where("m.class_id", classId)
    .select("u.id", "u.name", "u.email", "u.role", "u.active", "m.joined_at")
    .orderByRaw("lower(coalesce(nullif(u.name, ''), u.email))");
  return rows.map((r) => ({ ...r, joined_at: new Date(r.joined_at).toISOString() }));
}

export interface PendingInvitation {
  email: string;
  invited_at: string;
  expires_at: string;
  expired: boolean;
}

/** Unused invitation tokens for the class, one line per address (the latest). */
export async function pendingInvitations(classId: string): Promise<PendingInvitation[]> {
  const rows = await db()
    .select(
      db().raw(
        `distinct on (lower(email)) lower(email) as email, created_at, expires_at, expires_at <= now() as expired`,
      ),
    )
    .from("tokens")
    .where({ class_id: classId, kind: "invitation" })
    .whereNull("used_at")
    .whereNotExists(
      db()("class_members as m")
        .join("users as u", "u.id", "m.user_id")
        .where("m.class_id", classId)
        .whereRaw("lower(u.email) = lower(tokens.email)"),
    )
    .orderByRaw("lower(email), created_at desc");
  return rows
    .map((r) => ({
      email: r.email,
      invited_at: new Date(r.created_at).toISOString(),
      expires_at: new Date(r.expires_at).toISOString(),
      expired: r.expired,
    }))
    .sort((a, b) => Number(a.expired) - Number(b.expired) || a.email.localeCompare(b.email));
}

/** Withdraws the class's unused invitations for one address: the links stop working at once. */
export async function withdrawInvitation(classId: string, email: string): Promise<number> {
  return db()("tokens")
    .where({ class_id: classId, kind: "invitation" })
    .whereNull("used_at")
    .whereRaw("lower(email) = ?", [email.toLowerCase()])
    .delete();
}

/** Takes someone out of the class (their attempts stay); returns the name shown, or null if they were not in it. */
export async function removeMember(classId: string, userId: string): Promise<string | null> {
  const removed = await db()("class_members").where({ class_id: classId, user_id: userId }).delete();
  if (!removed) return null;
  const u = await db()("users").where({ id: userId }).first("name", "email");
  return u?.name || u?.email || "The trainee";
}

export interface LessonOption {
  slug: string;
  title: string;
  position: number;
}

/** The lessons a class of this organisation may be given (access.server.ts: built-in and its published ones). */
export async function listLessons(organisationId: string): Promise<LessonOption[]> {
  return classUsableLessons(db()("lessons"), organisationId)
    .select("slug", "title", "position")
    .orderBy([{ column: "position" }, { column: "slug" }]);
}

export interface Assignment {
  lesson_slug: string;
  title: string;
  due_on: string | null;
}

export async function classAssignments(classId: string): Promise<Assignment[]> {
  return db()("assignments as s")
    .join("lessons as l", "l.slug", "s.lesson_slug")
    .where("s.class_id", classId)
    .select("s.lesson_slug", "l.title", "s.due_on")
    .orderBy([{ column: "l.position" }, { column: "l.slug" }]);
}

/** Replaces the class's assignments with the given set in one transaction. */
export async function saveAssignments(classId: string, items: { slug: string; dueOn: string | null }[]) {
  await db().transaction(async (trx) => {
    const keep = items.map((i) => i.slug);
    const del = trx("assignments").where({ class_id: classId });
    if (keep.length) del.whereNotIn("lesson_slug", keep);
    await del.delete();
    for (const i of items) {
      await trx("assignments")
        .insert({ class_id: classId, lesson_slug: i.slug, due_on: i.dueOn })
        .onConflict(["class_id", "lesson_slug"])
        .merge(["due_on"]);
    }
  });
}

/** Where a lesson is assigned to a trainee: the soonest due date among their classes (undated last). */
export interface LessonDue {
  dueOn: string | null;
  className: string;
  /** How many of the trainee's classes assign it. */
  classes: number;
}

/** For the lessons list: per lesson slug, when the trainee's classes want it done. */
export async function dueDatesForTrainee(traineeId: string): Promise<Record<string, LessonDue>> {
  const rows: { lesson_slug: string; due_on: string | null; name: string }[] = await db()("assignments as s")
    .join("classes as c", "c.id", "s.class_id")
    .join("class_members as m", "m.class_id", "s.class_id")
    .where("m.user_id", traineeId)
    .select("s.lesson_slug", "s.due_on", "c.name")
    .orderByRaw("s.due_on asc nulls last, c.name");
  const out: Record<string, LessonDue> = {};
  for (const r of rows) {
    const seen = out[r.lesson_slug];
    if (seen) seen.classes += 1;
    else out[r.lesson_slug] = { dueOn: r.due_on, className: r.name, classes: 1 };
  }
  return out;
}

export interface MyAssignment {
  slug: string;
  title: string;
  dueOn: string | null;
  cell: GradeCell | null;
}

/** For a trainee's Classes page: each class's assignments with the trainee's best grade so far. */
export async function assignmentsForTrainee(
  traineeId: string,
  classIds: string[],
): Promise<Record<string, MyAssignment[]>> {
  if (!classIds.length) return {};
  const rows = await db()("assignments as s")
    .join("lessons as l", "l.slug", "s.lesson_slug")
    .join("classes as c", "c.id", "s.class_id")
    .whereIn("s.class_id", classIds)
    .select("s.class_id", "s.lesson_slug", "l.title", "s.due_on", "c.trainer_id", "c.organisation_id")
    .orderByRaw("s.due_on asc nulls last, l.position");
  const out: Record<string, MyAssignment[]> = Object.fromEntries(classIds.map((id) => [id, []]));
  // Each class reads grades as its own gradebook does (only its own trainer's and admins' overrides).
  for (const classId of classIds) {
    const mine = rows.filter((r) => r.class_id === classId);
    if (!mine.length) continue;
    const grades = await bestGrades([traineeId], [...new Set(mine.map((r) => r.lesson_slug as string))], {
      trainerId: mine[0].trainer_id,
      organisationId: mine[0].organisation_id,
    });
    for (const r of mine)
      out[classId].push({
        slug: r.lesson_slug,
        title: r.title,
        dueOn: r.due_on,
        cell: grades.get(cellKey(traineeId, r.lesson_slug)) ?? null,
      });
  }
  return out;
}
