/** /roofs/:id/sheet: a saved roof's check sheet, for whoever may read the roof. */
import { useMemo } from "react";
import { data, Link } from "react-router";
import type { Route } from "./+types/roofs.$id.sheet";
import { parseSpec } from "~/engine";
import { requirePermission } from "~/lib/auth.server";
import { getRoofFor } from "~/lib/roofs.server";
import { CheckSheet } from "~/components/pack/check-sheet";
import { GeneralErrorBoundary } from "~/components/error-boundary";
import { runAnalysis } from "~/components/sandbox/engine-bridge/run-analysis";

export const meta: Route.MetaFunction = ({ data }) => [{ title: `${data?.name ?? "Roof"} · check sheet · Fallwright` }];

/** The sheet carries its own caution: the page footer leaves its copy out. */
export const handle = { ownCaution: true };

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requirePermission(request, "roofs:own");
  const roof = await getRoofFor(user, params.id);
  if (!roof) throw data("No roof with that id in your library.", { status: 404 });
  const parsed = parseSpec(roof.spec);
  if (!parsed.ok) throw data(`This roof cannot be shaped as saved: ${parsed.error.message}`, { status: 422 });
  return { id: roof.id, name: roof.name, spec: parsed.spec };
}

export default function RoofSheet({ loaderData }: Route.ComponentProps) {
  const { id, name, spec } = loaderData;
  const outcome = useMemo(() => runAnalysis(spec), [spec]);
  if (!outcome.ok)
    return (
      <p role="alert" className="card mx-auto max-w-xl">
        {outcome.error.message}
      </p>
    );
  return (
    <CheckSheet
      name={name}
      spec={spec}
      analysis={outcome.analysis}
      pdfHref={`/roofs/${id}/sheet.pdf`}
      back={
        <Link className="btn" to={`/roofs/${id}`}>
          Back to the roof
        </Link>
      }
    />
  );
}

export function ErrorBoundary() {
  return <GeneralErrorBoundary />;
}
