import { data, Form, Link } from "react-router";
import type { Route } from "./+types/lessons.$slug.edit";
import { requirePermission } from "~/lib/auth.server";
import { db } from "~/lib/db.server";
import { criteriaCatalogue, lessonForEditing } from "~/lib/lessons/authoring.server";
import { lessonEditorAction } from "~/lib/lessons/editor-action.server";
import { GeneralErrorBoundary } from "~/components/error-boundary";
import { FormError } from "~/components/form-field";
import { LessonEditor, type EditorOutcome } from "~/components/lessons/lesson-editor";
import { listMyRoofSpecs } from "~/lib/roofs.server";
import { LessonPreview } from "~/components/lessons/lesson-preview";

export const meta: Route.MetaFunction = ({ data }) => [{ title: `Edit: ${data?.title ?? "lesson"} · Fallwright` }];

/**
 * /lessons/:slug/edit: the organisation's trainers and admins edit its lessons (403 for other
 * roles, 404 for a lesson they may not see). A built-in lesson is read-only: duplicate it.
 * `?mode=file` edits the lesson file's text (as-built tasks are only edited so).
 */
export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requirePermission(request, "lessons:author");
  const found = await lessonForEditing(db(), params.slug, user);
  if (!found) throw data("No lesson with that name.", { status: 404 });
  const url = new URL(request.url);
  const { entry } = found;
  return {
    slug: entry.lesson.slug,
    title: entry.lesson.title,
    builtIn: entry.builtIn,
    editable: entry.editable,
    status: entry.status,
    versionNumber: entry.versionNumber,
    source: found.source,
    form: url.searchParams.get("mode") === "file" ? null : found.form,
    saved: url.searchParams.get("saved") === "1",
    catalogue: criteriaCatalogue(),
    roofs: await listMyRoofSpecs(user),
  };
}

export async function action({ request, params }: Route.ActionArgs) {
  const user = await requirePermission(request, "lessons:author");
  return lessonEditorAction(request, user, params.slug);
}

export default function EditLesson({ loaderData, actionData }: Route.ComponentProps) {
  const l = loaderData;
  const a = actionData as EditorOutcome | undefined;
  const form = a?.form ?? l.form;
  const status = l.builtIn
    ? "Built-in lesson: read-only."
    : l.status === "draft"
      ? "Draft: only your organisation's trainers and admins see it."
      : `Published as v${l.versionNumber}. Saving makes v${(l.versionNumber ?? 0) + 1}; attempts keep the version they were graded on.`;
  return (
    <div className="grid gap-6">
      <header className="grid gap-2">
        <p className="text-sm">
          <Link to="/lessons" className="underline">
            Lessons
          </Link>{" "}
          /{" "}
          <Link to={`/lessons/${l.slug}`} className="underline">
            {l.title}
          </Link>
        </p>
        <h1 className="text-display font-bold tracking-tight">Edit: {l.title}</h1>
        <p className="text-sm font-medium" data-testid="edit-status">
          {status}
        </p>
        {l.saved && !a && (
          <p role="status" className="text-sm text-ok">
            Saved.
          </p>
        )}
        <p className="flex flex-wrap gap-3 text-sm">
          <a className="underline" href={`/lessons/${l.slug}/export`} download>
            Export as a lesson file
          </a>
          {form && l.editable ? (
            <Link className="underline" to="?mode=file">
              Edit as a lesson file
            </Link>
          ) : l.editable ? (
            <Link className="underline" to=".">
              Edit with the form
            </Link>
          ) : null}
        </p>
      </header>
      {l.builtIn || !l.editable ? (
        <Form method="post" className="card grid gap-3">
          <p>Built-in lessons cannot be changed. Duplicate it to your organisation and edit the copy.</p>
          <button type="submit" name="intent" value="duplicate" className="btn-primary justify-self-start">
            Duplicate to my organisation
          </button>
        </Form>
      ) : (
        <>
          {a?.preview && <LessonPreview {...a.preview} />}
          {form ? (
            <LessonEditor
              form={form}
              outcome={a}
              catalogue={l.catalogue}
              roofs={l.roofs}
              actions={[
                { intent: "preview", label: "Preview" },
                { intent: "save", label: l.status === "draft" ? "Save draft" : "Save as a new version" },
                ...(l.status === "draft" ? [{ intent: "publish", label: "Publish", primary: true }] : []),
              ]}
            />
          ) : (
            <Form method="post" className="card grid gap-3">
              <FormError message={a?.formError} />
              {a?.issues && a.issues.length > 0 && (
                <ul className="list-disc pl-6 text-sm text-bad">
                  {a.issues.map((i) => (
                    <li key={`${i.path}:${i.message}`}>
                      <strong>{i.path}</strong>: {i.message}
                    </li>
                  ))}
                </ul>
              )}
              <label className="label" htmlFor="lesson-source">
                The lesson file (front matter and Markdown body, as lessons/README.md describes)
              </label>
              <textarea
                id="lesson-source"
                name="source"
                rows={30}
                className="field font-mono text-sm"
                defaultValue={a?.source ?? l.source}
              />
              <button type="submit" name="intent" value="save-file" className="btn-primary justify-self-start">
                {l.status === "draft" ? "Save draft" : "Save as a new version"}
              </button>
            </Form>
          )}
        </>
      )}
    </div>
  );
}

export function ErrorBoundary() {
  return <GeneralErrorBoundary />;
}
