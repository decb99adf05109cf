/**
 * Lessons written in the app (docs/authoring.md): create, update, publish, duplicate, preview,
 * import and export. A lesson is always kept as the text of a lesson file (front matter and
 * Markdown body, lessons/README.md) and read with the start-up loader's own `parseLessonFile`,
 * so a lesson written here, one imported and one in `lessons/` pass exactly the same checks.
 */
import fs from "node:fs";
import path from "node:path";
import matter from "gray-matter";
import type { Knex } from "knex";
import type { RoofSpec } from "../../engine";
import { lessonForViewer, mayAuthor, type LessonEntry, type LessonViewer } from "./access.server";
import { getLesson } from "./catalogue.server";
import { CRITERION_KIND_IDS, CRITERION_KINDS } from "./criteria";
import { gradeLesson, type Answers, type GradeResult } from "./grade";
import {
  blankCriterion,
  blankQuestion,
  frontMatterFromForm,
  roofFigureBlock,
  type CatalogueEntry,
  type FormIssue,
  type LessonForm,
} from "./lesson-form";
import { lessonsDir, parseLessonFile } from "./load.server";
import type { Lesson } from "./schema";
import { nextVersionNumber } from "./sync.server";

export type Author = NonNullable<LessonViewer>;

export type Outcome<T> =
  { ok: true; value: T } | { ok: false; status: 400 | 403 | 404 | 409 | 413; message: string; issues: FormIssue[] };

const refuse = (status: 400 | 403 | 404 | 409 | 413, message: string, issues: FormIssue[] = []) =>
  ({ ok: false, status, message, issues }) as const;

/** The longest lesson file accepted (docs/security.md, "Limits"). */
export const MAX_LESSON_FILE = 256 * 1024;

const fileName = (position: number, slug: string) => `${String(Math.min(position, 999)).padStart(2, "0")}-${slug}.md`;

/** The lesson file for a front matter and a Markdown body. */
export function lessonSource(data: Record<string, unknown>, body: string): string {
  const text = body.endsWith("\n") ? body : `${body}\n`;
  return matter.stringify(`\n${text}`, data);
}

/**
 * Reads a lesson file's text exactly as the start-up loader reads `lessons/NN-slug.md`; issues
 * come back with the loader's paths (`quiz.0.answer`, `body line 12 (roof figure)`).
 */
export function readLessonText(slug: string, position: number, source: string): Outcome<Lesson> {
  if (Buffer.byteLength(source, "utf8") > MAX_LESSON_FILE)
    return refuse(413, `The lesson file is larger than ${MAX_LESSON_FILE / 1024} kB.`, [
      { path: "source", message: `must be at most ${MAX_LESSON_FILE / 1024} kB` },
    ]);
  const r = parseLessonFile(fileName(position, slug), source);
  if (!r.lesson)
    return refuse(
      400,
      "The lesson has problems: each is shown beside its field.",
      r.issues.map((i) => ({ path: i.path, message: i.message })),
    );
  return { ok: true, value: r.lesson };
}

/** The editor's form as a lesson file (front matter + body). Form-only problems come back as issues. */
export function sourceFromForm(form: LessonForm): { source: string; issues: FormIssue[] } {
  const { data, issues } = frontMatterFromForm(form);
  return { source: lessonSource(data, form.body), issues };
}

const yamlList = (v: unknown) => (Array.isArray(v) ? v.map(String).join("\n") : "");
const text = (v: unknown) => (v == null ? "" : typeof v === "string" ? v : String(v));
const jsonText = (v: unknown) => (v == null ? "" : JSON.stringify(v, null, 2));

/**
 * The editor's form for a lesson file, or null when the form cannot hold it without losing
 * something (an as-built task, a relative tolerance...): those are edited as a lesson file.
 */
export function formFromSource(source: string): LessonForm | null {
  let parsed: matter.GrayMatterFile<string>;
  try {
    parsed = matter(source, {});
  } catch {
    return null;
  }
  const d = parsed.data as Record<string, unknown>;
  const task = (d.task ?? {}) as Record<string, unknown>;
  if (task.kind === "as-built") return null;
  const form: LessonForm = {
    title: text(d.title),
    summary: text(d.summary),
    minutes: text(d.minutes),
    objectives: yamlList(d.objectives),
    passMark: text(d.passMark),
    body: parsed.content.replace(/^\n/, ""),
    quiz: (Array.isArray(d.quiz) ? d.quiz : []).map((raw: Record<string, unknown>, i) => {
      const q = { ...blankQuestion(i), id: text(raw.id) || `q${i + 1}` };
      q.prompt = text(raw.prompt);
      q.explanation = text(raw.explanation);
      q.hint = text(raw.hint);
      q.weight = raw.weight == null ? "1" : text(raw.weight);
      if (raw.kind === "choice") {
        const correct = Array.isArray(raw.correct) ? raw.correct.map(String) : [text(raw.correct)];
        q.kind = Array.isArray(raw.correct) ? "multiple" : "single";
        q.options = (Array.isArray(raw.options) ? raw.options : [])
          .map((o: { id?: unknown; text?: unknown }) => `${correct.includes(text(o.id)) ? "* " : ""}${text(o.text)}`)
          .join("\n");
      } else {
        q.kind = raw.kind === "ratio" ? "ratio" : "numeric";
        q.answer = text(raw.answer);
        q.tolerance = text(raw.tolerance);
      }
      return q;
    }),
    task: {
      title: text(task.title),
      goal: text(task.goal),
      start: jsonText(task.start),
      reference: jsonText(task.reference),
      editable: Array.isArray(task.editable) ? task.editable.map(String) : ["outlets", "baseFall"],
      criteria: (Array.isArray(task.criteria) ? task.criteria : []).map((c: Record<string, unknown>) => ({
        ...blankCriterion(),
        kind: text(c.kind),
        value: text(c.value),
        weight: c.weight == null ? "1" : text(c.weight),
        required: c.required === true,
        hint: text(c.hint),
      })),
      hints: yamlList(task.hints),
    },
  };
  // The form holds the lesson only if writing it back reads as the same lesson.
  const again = parseLessonFile("01-x.md", sourceFromForm(form).source);
  const before = parseLessonFile("01-x.md", source);
  if (!before.lesson) return form;
  if (!again.lesson) return null;
  const strip = ({ version: _v, ...rest }: Lesson) => rest;
  return JSON.stringify(strip(again.lesson)) === JSON.stringify(strip(before.lesson)) ? form : null;
}

/** A new lesson's form: one blank question, a roof task on `spec` with "no ponding" required. */
export function newLessonForm(spec: RoofSpec, caption: string): LessonForm {
  const specText = JSON.stringify(spec, null, 2);
  return {
    title: "",
    summary: "",
    minutes: "15",
    objectives: "",
    passMark: "70",
    body: ["Write the lesson here in Markdown.", "", roofFigureBlock(caption, spec), ""].join("\n"),
    quiz: [blankQuestion(0)],
    task: {
      title: "Shape this roof",
      goal: "",
      start: specText,
      reference: specText,
      editable: ["outlets", "baseFall"],
      criteria: [{ ...blankCriterion(), required: true }],
      hints: "",
    },
  };
}

/** The lesson file of a lesson the viewer may see: a built-in file's text, or the stored text. */
export async function exportLesson(
  knex: Knex,
  slug: string,
  viewer: LessonViewer,
): Promise<{ fileName: string; source: string } | null> {
  const entry = await lessonForViewer(knex, slug, viewer);
  if (!entry) return null;
  const source = await sourceOf(knex, entry);
  return { fileName: fileName(entry.lesson.position, entry.lesson.slug), source };
}

async function sourceOf(knex: Knex, entry: LessonEntry): Promise<string> {
  if (entry.builtIn) return fs.readFileSync(path.join(lessonsDir(), entry.lesson.file), "utf8");
  const row = await knex("lessons").where({ slug: entry.lesson.slug }).first("source");
  return row?.source ?? "";
}

/** The editor's view of a lesson: its file text, and its form when the form can hold it. */
export async function lessonForEditing(
  knex: Knex,
  slug: string,
  viewer: LessonViewer,
): Promise<{ entry: LessonEntry; source: string; form: LessonForm | null } | null> {
  const entry = await lessonForViewer(knex, slug, viewer);
  if (!entry || !mayAuthor(viewer)) return null;
  const source = await sourceOf(knex, entry);
  return { entry, source, form: formFromSource(source) };
}

function slugify(title: string): string {
  const s = title
    .toLowerCase()
    .normalize("NFKD")
    .replace(/[\u0300-\u036f]/g, "")
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-+|-+$/g, "")
    .slice(0, 60)
    .replace(/-+$/, "");
  return s || "lesson";
}

/** A slug no lesson uses, neither a built-in file nor any organisation's lesson. */
async function freeSlug(knex: Knex, base: string): Promise<string> {
  for (let n = 1; n < 1000; n++) {
    const slug = n === 1 ? base : `${base}-${n}`;
    if (getLesson(slug)) continue;
    if (!(await knex("lessons").where({ slug }).first("slug"))) return slug;
  }
  return `${base}-${crypto.randomUUID().slice(0, 8)}`;
}

async function nextPosition(knex: Knex, organisationId: string): Promise<number> {
  const row = await knex("lessons")
    .where("organisation_id", organisationId)
    .orWhereNull("organisation_id")
    .max<{ max: number | null }>("position as max")
    .first();
  return Math.min((row?.max ?? 0) + 1, 999);
}

/** Creates a draft lesson in the author's organisation from a lesson file's text. */
export async function createLesson(
  knex: Knex,
  author: LessonViewer,
  source: string,
  opts: { slugHint?: string } = {},
): Promise<Outcome<{ slug: string; lesson: Lesson }>> {
  if (!mayAuthor(author)) return refuse(403, "Only trainers and admins write lessons.");
  const title = (() => {
    try {
      return text((matter(source, {}).data as { title?: unknown }).title);
    } catch {
      return "";
    }
  })();
  const slug = await freeSlug(knex, slugify(opts.slugHint || title));
  const position = await nextPosition(knex, author.organisationId);
  const read = readLessonText(slug, position, source);
  if (!read.ok) return read;
  const lesson = read.value;
  try {
    await knex("lessons").insert({
      slug,
      title: lesson.title,
      position,
      version: lesson.version,
      content: JSON.stringify(lesson),
      source,
      organisation_id: author.organisationId,
      status: "draft",
      author_id: author.id,
    });
  } catch (e) {
    // Two lessons with one title at the same moment: the second picks the next free slug.
    if ((e as { code?: string }).code === "23505") return createLesson(knex, author, source, opts);
    throw e;
  }
  return { ok: true, value: { slug, lesson } };
}

/** The organisation's own lesson, locked for a change; refusals as the editor answers them. */
async function lockOwn(
  trx: Knex.Transaction,
  author: LessonViewer,
  slug: string,
): Promise<Outcome<{ slug: string; position: number; status: string; version: string }>> {
  if (getLesson(slug))
    return refuse(403, "Built-in lessons are read-only. Duplicate this one to your organisation to change it.");
  if (!mayAuthor(author)) return refuse(404, "No lesson with that name.");
  const row = await trx("lessons")
    .where({ slug, organisation_id: author.organisationId })
    .forUpdate()
    .first("slug", "position", "status", "version");
  if (!row) return refuse(404, "No lesson with that name.");
  return { ok: true, value: row };
}

async function addVersion(trx: Knex.Transaction, lesson: Lesson, source: string, by: string): Promise<void> {
  await trx("lesson_versions")
    .insert({
      slug: lesson.slug,
      version: lesson.version,
      content: JSON.stringify(lesson),
      source,
      created_by: by,
      number: nextVersionNumber(trx, lesson.slug) as unknown as number,
    })
    .onConflict(["slug", "version"])
    .ignore();
}

/**
 * Saves a new text for an organisation's lesson. A draft is overwritten; a published lesson
 * gets a new version (v2, v3...) at once, and attempts keep the version they were graded on.
 */
export async function updateLesson(
  knex: Knex,
  author: LessonViewer,
  slug: string,
  source: string,
): Promise<Outcome<{ lesson: Lesson; newVersion: boolean }>> {
  return knex.transaction(async (trx) => {
    const own = await lockOwn(trx, author, slug);
    if (!own.ok) return own;
    const read = readLessonText(slug, own.value.position, source);
    if (!read.ok) return read;
    const lesson = read.value;
    const published = own.value.status === "published";
    const changed = lesson.version !== own.value.version;
    if (published && changed) await addVersion(trx, lesson, source, author!.id);
    await trx("lessons")
      .where({ slug })
      .update({
        title: lesson.title,
        version: lesson.version,
        content: JSON.stringify(lesson),
        source,
        updated_at: trx.fn.now(),
      });
    return { ok: true as const, value: { lesson, newVersion: published && changed } };
  });
}

/** Publishes a draft: it becomes a numbered version that the organisation's trainees see. */
export async function publishLesson(
  knex: Knex,
  author: LessonViewer,
  slug: string,
): Promise<Outcome<{ versionNumber: number }>> {
  return knex.transaction(async (trx) => {
    const own = await lockOwn(trx, author, slug);
    if (!own.ok) return own;
    if (own.value.status === "published") return refuse(409, "This lesson is already published.");
    const row = await trx("lessons").where({ slug }).first("content", "source");
    await addVersion(trx, row!.content as Lesson, row!.source ?? "", author!.id);
    await trx("lessons").where({ slug }).update({ status: "published", updated_at: trx.fn.now() });
    const v = await trx("lesson_versions").where({ slug, version: own.value.version }).first("number");
    return { ok: true as const, value: { versionNumber: v!.number } };
  });
}

/** Copies a lesson the author may see (a built-in one, typically) into their organisation as a draft. */
export async function duplicateLesson(
  knex: Knex,
  author: LessonViewer,
  slug: string,
): Promise<Outcome<{ slug: string; lesson: Lesson }>> {
  if (!mayAuthor(author)) return refuse(403, "Only trainers and admins write lessons.");
  const exported = await exportLesson(knex, slug, author);
  if (!exported) return refuse(404, "No lesson with that name.");
  const parsed = matter(exported.source, {});
  const data = { ...(parsed.data as Record<string, unknown>) };
  data.title = `${text(data.title)} (copy)`;
  return createLesson(knex, author, lessonSource(data, parsed.content.replace(/^\n/, "")));
}

/** Imports a lesson file as a draft, read exactly as the start-up loader reads `lessons/`. */
export async function importLesson(
  knex: Knex,
  author: LessonViewer,
  name: string,
  source: string,
): Promise<Outcome<{ slug: string; lesson: Lesson }>> {
  // The slug the file carries (`03-some-slug.md`), when free; else one from the title.
  const slugHint = /^\d{2,3}-([a-z0-9]+(?:-[a-z0-9]+)*)\.md$/.exec(path.basename(name))?.[1];
  const out = await createLesson(knex, author, source, { slugHint });
  if (!out.ok && out.issues.length)
    return { ...out, message: `The file ${path.basename(name) || "(pasted)"} is not a lesson this app can read.` };
  return out;
}

/** The answers a lesson's own key gives: what the preview's trial attempt submits. */
export function answerKey(lesson: Lesson): Answers {
  const out: Answers = {};
  for (const q of lesson.quiz) out[q.id] = q.kind === "choice" ? q.correct : q.answer;
  return out;
}

export interface PreviewResult {
  /** The reference roof with the quiz's own answers: should pass. */
  reference: GradeResult | { error: string };
  /** The starting roof with the quiz's own answers: what the trainee starts from. */
  start: GradeResult | { error: string };
}

/** A trial attempt graded on the server and not saved (docs/authoring.md, "Preview"). */
export function previewLesson(lesson: Lesson): PreviewResult {
  const key = answerKey(lesson);
  const grade = (spec: unknown) => {
    const g = gradeLesson(lesson, key, spec);
    return "ok" in g ? { error: g.message } : g;
  };
  if (lesson.task.kind !== "roof") {
    const g = grade(null);
    return { reference: g, start: g };
  }
  return { reference: grade(lesson.task.reference), start: grade(lesson.task.start) };
}

const LIMIT_EXAMPLE: Record<string, string> = {
  ratio: "1:80",
  length: "150 mm",
  area: "4 m^2",
  flow: "2.5 L/s",
  count: "1",
  percent: "10",
  none: "",
};

/** The engine's criteria, for the editor's choice list: id, what it says, the kind of value and an example. */
export function criteriaCatalogue(): CatalogueEntry[] {
  return CRITERION_KIND_IDS.map((id) => {
    const k = CRITERION_KINDS[id];
    return { id, label: k.label("…"), limit: k.limit, example: LIMIT_EXAMPLE[k.limit] ?? "" };
  });
}
