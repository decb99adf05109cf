import { Form, Link, useSubmit } from "react-router";
import type { Route } from "./+types/gradebook";
import { requirePermission } from "~/lib/auth.server";
import { getClassFor, isUuid, listClassesFor } from "~/lib/classes.server";
import { classGradebook } from "~/lib/gradebook.server";
import { GeneralErrorBoundary } from "~/components/error-boundary";
import { GradebookView } from "~/components/classes/gradebook-view";

export const meta: Route.MetaFunction = () => [{ title: "Gradebook · Fallwright" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requirePermission(request, "gradebook:view");
  const classes = await listClassesFor(user);
  const asked = new URL(request.url).searchParams.get("class");
  // Only a class from my own list can be chosen: another trainer's id falls back to my first class.
  const selected = classes.find((c) => isUuid(asked) && c.id === asked) ?? classes[0] ?? null;
  const cls = selected ? await getClassFor(user, selected.id, "manage") : null;
  const book = cls ? await classGradebook(cls) : null;
  return {
    classes: classes.map((c) => ({ id: c.id, name: c.name })),
    selected: selected ? { id: selected.id, name: selected.name } : null,
    book,
  };
}

export default function GradebookPage({ loaderData }: Route.ComponentProps) {
  const { classes, selected, book } = loaderData;
  const submit = useSubmit();
  return (
    <div className="grid gap-4">
      <header className="flex flex-wrap items-end justify-between gap-4">
        <h1 className="text-display font-bold tracking-tight">Gradebook</h1>
        {classes.length > 1 ? (
          <Form method="get" className="flex items-end gap-2" onChange={(e) => submit(e.currentTarget)}>
            <div>
              <label className="label" htmlFor="gb-class">
                Class
              </label>
              <select key={selected?.id} id="gb-class" name="class" className="field" defaultValue={selected?.id}>
                {classes.map((c) => (
                  <option key={c.id} value={c.id}>
                    {c.name}
                  </option>
                ))}
              </select>
            </div>
            <noscript>
              <button className="btn" type="submit">
                Show
              </button>
            </noscript>
          </Form>
        ) : null}
      </header>
      {selected && book ? (
        <>
          <p className="text-lg">
            <Link className="underline" to={`/classes/${selected.id}`}>
              {selected.name}
            </Link>
          </p>
          <GradebookView book={book} classId={selected.id} className={selected.name} />
        </>
      ) : (
        <p className="card max-w-2xl text-ink-soft">
          No classes yet, so no grades.{" "}
          <Link className="underline" to="/classes">
            Create a class
          </Link>
          , invite trainees and assign lessons.
        </p>
      )}
    </div>
  );
}

export function ErrorBoundary() {
  return <GeneralErrorBoundary />;
}
