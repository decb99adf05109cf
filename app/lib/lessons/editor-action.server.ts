/**
 * The lesson editor's form actions (`/lessons/new`, `/lessons/:slug/edit`): save, publish,
 * preview, duplicate and import. Refusals answer 4xx with the loader's messages by field and the
 * form as typed; nothing here answers 500 to input.
 */
import { data, redirect } from "react-router";
import type { SessionUser } from "../auth.server";
import { db } from "../db.server";
import { readFormCapped } from "../json-api.server";
import {
  createLesson,
  duplicateLesson,
  importLesson,
  MAX_LESSON_FILE,
  previewLesson,
  publishLesson,
  readLessonText,
  sourceFromForm,
  updateLesson,
  type Outcome,
} from "./authoring.server";
import { fieldErrors, readLessonForm, type LessonForm } from "./lesson-form";
import { lessonView } from "./view.server";

const refusal = (out: Extract<Outcome<unknown>, { ok: false }>, extra: Record<string, unknown>) =>
  data(
    {
      formError: out.message,
      fieldErrors: fieldErrors(out.issues),
      issues: out.issues,
      preview: null,
      ...extra,
    },
    { status: out.status },
  );

export async function lessonEditorAction(request: Request, user: SessionUser, slug: string | null) {
  const read = await readFormCapped(request, MAX_LESSON_FILE * 2 + 64 * 1024);
  if (!read.ok)
    return data(
      { formError: "The form could not be read (too large?).", fieldErrors: {}, issues: [], preview: null, form: null },
      { status: read.status },
    );
  const f = read.form;
  const intent = String(f.get("intent") ?? "save");

  if (intent === "duplicate" && slug) {
    const out = await duplicateLesson(db(), user, slug);
    if (!out.ok) return refusal(out, { form: null });
    return redirect(`/lessons/${out.value.slug}/edit?duplicated=1`);
  }

  if (intent === "import" || intent === "save-file") {
    const file = f.get("file");
    const pasted = String(f.get("source") ?? "");
    const fromFile = file instanceof File && file.size > 0;
    if (fromFile && file.size > MAX_LESSON_FILE)
      return data(
        {
          formError: `The file is larger than ${MAX_LESSON_FILE / 1024} kB.`,
          fieldErrors: { file: "is too large" },
          issues: [],
          preview: null,
          form: null,
          source: "",
        },
        { status: 413 },
      );
    const source = fromFile ? await file.text() : pasted;
    if (!source.trim())
      return data(
        {
          formError: "Choose a lesson file or paste its text.",
          fieldErrors: { source: "is empty: choose a lesson file (.md) or paste one" },
          issues: [],
          preview: null,
          form: null,
          source,
        },
        { status: 400 },
      );
    const out =
      intent === "save-file" && slug
        ? await updateLesson(db(), user, slug, source)
        : await importLesson(db(), user, fromFile ? file.name : "pasted.md", source);
    if (!out.ok) return refusal(out, { form: null, source });
    return redirect(`/lessons/${"slug" in out.value ? out.value.slug : slug}/edit?saved=1`);
  }

  const form: LessonForm = readLessonForm(f);
  const built = sourceFromForm(form);
  if (built.issues.length)
    return refusal(
      {
        ok: false,
        status: 400,
        message: "The lesson has problems: each is shown beside its field.",
        issues: built.issues,
      },
      { form },
    );

  if (intent === "preview") {
    const read = readLessonText(slug ?? "preview", 1, built.source);
    if (!read.ok) return refusal(read, { form });
    const trial = previewLesson(read.value);
    return { formError: null, fieldErrors: {}, issues: [], form, preview: { view: lessonView(read.value), ...trial } };
  }

  const saved = slug
    ? await updateLesson(db(), user, slug, built.source)
    : await createLesson(db(), user, built.source);
  if (!saved.ok) return refusal(saved, { form });
  const target = slug ?? (saved.value as { slug: string }).slug;
  if (intent === "publish") {
    const pub = await publishLesson(db(), user, target);
    // Publishing an already published lesson: the save above made the new version.
    if (!pub.ok && pub.status !== 409) return refusal(pub, { form });
    return redirect(`/lessons/${target}?published=1`);
  }
  return redirect(`/lessons/${target}/edit?saved=1`);
}
