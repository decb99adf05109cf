import { data, Form, Link } from "react-router";
import type { Route } from "./+types/lessons.new";
import { requirePermission } from "~/lib/auth.server";
import { db } from "~/lib/db.server";
import { criteriaCatalogue, newLessonForm } from "~/lib/lessons/authoring.server";
import { lessonEditorAction } from "~/lib/lessons/editor-action.server";
import { readLinkedSpec } from "~/lib/linked-spec.server";
import { getRoofFor, listMyRoofSpecs } from "~/lib/roofs.server";
import { isUuid } from "~/lib/input";
import type { RoofSpec } from "~/engine";
import { GeneralErrorBoundary } from "~/components/error-boundary";
import { FormError } from "~/components/form-field";
import { LessonEditor, type EditorOutcome } from "~/components/lessons/lesson-editor";
import { LessonPreview } from "~/components/lessons/lesson-preview";
import { DEMO_ROOF } from "~/components/sandbox/state/demo-roof";

export const meta: Route.MetaFunction = () => [{ title: "Write a lesson · Fallwright" }];

/**
 * /lessons/new: a new lesson for the organisation (trainers and admins). `?spec=` (the sandbox's
 * "Make this roof a task") or `?roof=<id>` (a saved roof) starts the task and the first figure
 * from that roof.
 */
export async function loader({ request }: Route.LoaderArgs) {
  const user = await requirePermission(request, "lessons:author");
  const url = new URL(request.url);
  let spec: RoofSpec = DEMO_ROOF;
  let from = "the demo roof";
  const linked = readLinkedSpec(url);
  if (linked.error) throw data(linked.error.message, { status: linked.error.status });
  if (linked.spec) {
    spec = linked.spec;
    from = "the sandbox";
  }
  const roofId = url.searchParams.get("roof");
  if (roofId) {
    const roof = isUuid(roofId) ? await getRoofFor(user, roofId, db()) : null;
    if (!roof) throw data("No roof with that id that you may see.", { status: 404 });
    spec = roof.spec as RoofSpec;
    from = `your roof “${roof.name}”`;
  }
  return {
    form: newLessonForm(spec, "The roof of this lesson"),
    from,
    catalogue: criteriaCatalogue(),
    roofs: await listMyRoofSpecs(user),
  };
}

export async function action({ request }: Route.ActionArgs) {
  const user = await requirePermission(request, "lessons:author");
  return lessonEditorAction(request, user, null);
}

export default function NewLesson({ loaderData, actionData }: Route.ComponentProps) {
  const a = actionData as EditorOutcome | undefined;
  return (
    <div className="grid gap-6">
      <header className="grid gap-2">
        <p className="text-sm">
          <Link to="/lessons" className="underline">
            Lessons
          </Link>{" "}
          <span className="text-ink-soft">/ new</span>
        </p>
        <h1 className="text-display font-bold tracking-tight">Write a lesson</h1>
        <p className="max-w-prose text-ink-soft">
          The task starts from {loaderData.from}. The lesson is saved as a draft that only your organisation&apos;s
          trainers and admins see, until you publish it.
        </p>
      </header>
      {a?.preview && <LessonPreview {...a.preview} />}
      <LessonEditor
        form={loaderData.form}
        outcome={a}
        catalogue={loaderData.catalogue}
        roofs={loaderData.roofs}
        actions={[
          { intent: "preview", label: "Preview" },
          { intent: "save", label: "Save draft" },
          { intent: "publish", label: "Publish", primary: true },
        ]}
      />
      <section className="card grid gap-3" aria-labelledby="import-heading">
        <h2 id="import-heading" className="text-lg font-bold">
          Import a lesson file
        </h2>
        <p className="text-sm text-ink-soft">
          A lesson exported from Fallwright (Markdown with front matter, as in the repository&apos;s lessons folder). It
          is checked exactly as the app checks its own lessons at start-up, and saved as a draft.
        </p>
        <Form method="post" encType="multipart/form-data" className="grid gap-3">
          {a && !a.form && <FormError message={a.formError} />}
          {a && !a.form && a.issues && a.issues.length > 0 && (
            <ul className="list-disc pl-6 text-sm text-bad" data-testid="import-issues">
              {a.issues.map((i) => (
                <li key={`${i.path}:${i.message}`}>
                  <strong>{i.path}</strong>: {i.message}
                </li>
              ))}
            </ul>
          )}
          <label className="label" htmlFor="lesson-file">
            Lesson file (.md)
          </label>
          <input id="lesson-file" name="file" type="file" accept=".md,text/markdown,text/plain" className="field" />
          <button type="submit" name="intent" value="import" className="btn justify-self-start">
            Import
          </button>
        </Form>
      </section>
    </div>
  );
}

export function ErrorBoundary() {
  return <GeneralErrorBoundary />;
}
