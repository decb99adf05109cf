/**
 * Which lessons a viewer may see (docs/authoring.md, "Who sees what"). The one place that answers
 * it: the course list, the player, the API, attempts and (after the merge) courses all ask here.
 *
 * - Built-in lessons (the `lessons/*.md` files, `organisation_id` null): everyone, signed in or not.
 * - An organisation's published lessons: its members (any role).
 * - An organisation's drafts: its trainers and admins only.
 * Anything else answers as missing (null), so another organisation's lesson is a 404, never a 403.
 */
import type { Knex } from "knex";
import { can, type Role } from "../permissions";
import { allLessons, ensureLessonsSynced, getLesson } from "./catalogue.server";
import type { Lesson } from "./schema";

export type LessonStatus = "draft" | "published";

/** Who is looking: a signed-in user's id, role and organisation, or null for a visitor. */
export type LessonViewer = { id: string; role: Role; organisationId: string } | null;

/** A lesson as a viewer may see it, with where it comes from and its readable version. */
export interface LessonEntry {
  lesson: Lesson;
  /** True for the repository's lessons (read-only; they can be duplicated). */
  builtIn: boolean;
  organisationId: string | null;
  status: LessonStatus;
  /** The readable number of the current version (1 for v1); null for a draft never published. */
  versionNumber: number | null;
  /** May this viewer edit it (a trainer or admin of the owning organisation; never a built-in). */
  editable: boolean;
}

type Row = { slug: string; content: unknown; organisation_id: string | null; status: string; number: number | null };

function entryOf(r: Row, viewer: LessonViewer): LessonEntry {
  const lesson = r.content as Lesson;
  return {
    lesson,
    builtIn: false,
    organisationId: r.organisation_id,
    status: r.status === "draft" ? "draft" : "published",
    versionNumber: r.number,
    editable: mayAuthor(viewer) && viewer?.organisationId === r.organisation_id,
  };
}

/** May this viewer write lessons for their organisation (trainers and admins). */
export function mayAuthor(viewer: LessonViewer): viewer is NonNullable<LessonViewer> {
  return !!viewer && can(viewer.role, "lessons:author");
}

function ownLessons(knex: Knex, viewer: NonNullable<LessonViewer>) {
  const q = knex("lessons as l")
    .leftJoin("lesson_versions as v", (j) => j.on("v.slug", "l.slug").andOn("v.version", "l.version"))
    .where("l.organisation_id", viewer.organisationId)
    .select("l.slug", "l.content", "l.organisation_id", "l.status", "v.number");
  if (!mayAuthor(viewer)) q.andWhere("l.status", "published");
  return q;
}

async function builtInNumbers(knex: Knex, slugs: { slug: string; version: string }[]): Promise<Map<string, number>> {
  if (!slugs.length) return new Map();
  await ensureLessonsSynced(knex);
  const rows = await knex("lesson_versions")
    .whereIn(
      ["slug", "version"],
      slugs.map((s) => [s.slug, s.version]),
    )
    .select("slug", "number");
  return new Map(rows.map((r) => [r.slug, r.number]));
}

function builtInEntry(lesson: Lesson, number: number | null): LessonEntry {
  return {
    lesson,
    builtIn: true,
    organisationId: null,
    status: "published",
    versionNumber: number,
    editable: false,
  };
}

/** Every lesson the viewer may see: the built-in course first, then their organisation's, in order. */
export async function visibleLessons(knex: Knex, viewer: LessonViewer): Promise<LessonEntry[]> {
  const builtIn = allLessons();
  const numbers = await builtInNumbers(knex, builtIn);
  const own = viewer ? await ownLessons(knex, viewer).orderBy([{ column: "l.position" }, { column: "l.slug" }]) : [];
  return [
    ...builtIn.map((l) => builtInEntry(l, numbers.get(l.slug) ?? null)),
    ...own.map((r: Row) => entryOf(r, viewer)),
  ];
}

/** One lesson if the viewer may see it, else null (answer 404). */
export async function lessonForViewer(knex: Knex, slug: string, viewer: LessonViewer): Promise<LessonEntry | null> {
  const file = getLesson(slug);
  if (file) return builtInEntry(file, (await builtInNumbers(knex, [file])).get(slug) ?? null);
  if (!viewer || slug.length > 100) return null;
  const row = (await ownLessons(knex, viewer).andWhere("l.slug", slug).first()) as Row | undefined;
  return row ? entryOf(row, viewer) : null;
}

/** The readable number of a stored version of a lesson (v1 is 1), or null when it is not known. */
export async function versionNumberOf(knex: Knex, slug: string, version: string): Promise<number | null> {
  const row = await knex("lesson_versions").where({ slug, version }).first("number");
  return row?.number ?? null;
}

/**
 * Narrows a query on `lessons` (as `alias`) to what an organisation's classes may use: the
 * built-in lessons and the organisation's published ones (never a draft, never another's).
 */
export function classUsableLessons<T extends Knex.QueryBuilder>(q: T, organisationId: string, alias = "lessons"): T {
  return q.where((w) =>
    w
      .whereNull(`${alias}.organisation_id`)
      .orWhere((o) => o.where(`${alias}.organisation_id`, organisationId).andWhere(`${alias}.status`, "published")),
  ) as T;
}
