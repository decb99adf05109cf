import { Link } from "react-router";
import type { Route } from "./+types/classes.$id.gradebook";
import { requirePermission } from "~/lib/auth.server";
import { findClassFor } from "~/lib/classes.server";
import { classGradebook } from "~/lib/gradebook.server";
import { GeneralErrorBoundary } from "~/components/error-boundary";
import { GradebookView } from "~/components/classes/gradebook-view";

export const meta: Route.MetaFunction = ({ data }) => [
  { title: `Gradebook · ${data?.cls.name ?? "Class"} · Fallwright` },
];

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requirePermission(request, "gradebook:view");
  const cls = await findClassFor(user, params.id, "manage");
  return { cls: { id: cls.id, name: cls.name }, book: await classGradebook(cls) };
}

export default function ClassGradebook({ loaderData }: Route.ComponentProps) {
  const { cls, book } = loaderData;
  return (
    <div className="grid gap-4">
      <header>
        <p className="text-sm">
          <Link className="underline" to="/classes">
            Classes
          </Link>{" "}
          /{" "}
          <Link className="underline" to={`/classes/${cls.id}`}>
            {cls.name}
          </Link>
        </p>
        <h1 className="text-display font-bold tracking-tight">Gradebook</h1>
      </header>
      <GradebookView book={book} classId={cls.id} className={cls.name} />
    </div>
  );
}

export function ErrorBoundary() {
  return <GeneralErrorBoundary />;
}
