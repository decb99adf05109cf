/** /roofs/:id/checks/:checkId: one as-built check, for whoever may read the roof. */
import { useEffect, useMemo } from "react";
import { data, Link, useSearchParams } from "react-router";
import type { Route } from "./+types/roofs.$id.checks.$checkId";
import { requirePermission } from "~/lib/auth.server";
import { getRoofFor } from "~/lib/roofs.server";
import { checkAccess } from "~/lib/permissions";
import { getCheck } from "~/lib/as-built-checks.server";
import { fixLine, verdictLine, worstLine } from "~/lib/as-built-check";
import { checkDrawing } from "~/lib/as-built-drawing";
import { formatRatio, type Point } from "~/engine";
import { Caution } from "~/components/caution";
import { GeneralErrorBoundary } from "~/components/error-boundary";
import { CheckPlan, DeviationKey } from "~/components/as-built/check-plan";
import { draftKey } from "~/components/as-built/measured-form";
import { FallLegend } from "~/components/sandbox/results/fall-legend";

export const meta: Route.MetaFunction = ({ data }) => [
  { title: `${data?.roof.name ?? "Roof"} · as-built check ${data?.check.measuredOn ?? ""} · Fallwright` },
];

/** The page carries its own caution beside the verdict: the footer leaves its copy out. */
export const handle = { ownCaution: true };

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requirePermission(request, "roofs:own");
  const roof = await getRoofFor(user, params.id);
  if (!roof || !checkAccess(roof).read) throw data("No roof with that id in your library.", { status: 404 });
  const check = await getCheck(roof.id, params.checkId);
  if (!check) throw data("No as-built check with that id on this roof.", { status: 404 });
  return {
    roof: { id: roof.id, name: roof.name, version: roof.version },
    check: {
      id: check.id,
      measuredOn: check.measuredOn,
      measuredBy: check.measuredBy,
      checkedBy: check.checkedBy,
      roofVersion: check.roofVersion,
      createdAt: check.createdAt,
      source: check.source,
      outline: check.spec.outline as Point[],
      result: check.result,
    },
  };
}

export default function CheckPage({ loaderData }: Route.ComponentProps) {
  const { roof, check } = loaderData;
  const [params] = useSearchParams();
  const r = check.result;
  const drawing = useMemo(() => checkDrawing(check.outline, r), [check.outline, r]);

  // Saved: the draft kept on this device for that design version has done its job.
  useEffect(() => {
    if (params.get("saved") === "1") {
      try {
        localStorage.removeItem(draftKey(roof.id, check.roofVersion));
      } catch {
        // Nothing to clear.
      }
    }
  }, [params, roof.id, check.roofVersion]);

  const worst = [...r.verdict.failures]
    .map((f, i) => ({ ...f, i }))
    .sort((a, b) => {
      const size = (m: string) => Number(/(\d+) mm/.exec(m)?.[1] ?? 0);
      return size(b.message) - size(a.message) || a.i - b.i;
    })
    .slice(0, 10);
  const mm = (m: number) => `${Math.round(m * 1000)} mm`;

  return (
    <article className="mx-auto max-w-6xl space-y-5" aria-labelledby="check-title">
      <header className="space-y-1">
        <p className="text-sm">
          <Link to={`/roofs/${roof.id}`}>← {roof.name}</Link> · <Link to={`/roofs/${roof.id}/checks`}>All checks</Link>
        </p>
        <h1 id="check-title" className="text-2xl font-bold tracking-tight sm:text-3xl">
          As-built check, {check.measuredOn}
        </h1>
        <p className="text-sm text-ink-soft">
          Measured by {check.measuredBy}, checked by {check.checkedBy}; against design version {check.roofVersion}
          {check.roofVersion !== roof.version ? ` (the roof is now at version ${roof.version})` : ""};{" "}
          {check.source === "csv" ? "from an uploaded CSV" : "entered joist by joist"}.
        </p>
      </header>

      <section
        aria-label="Verdict"
        className={`rounded border-2 px-4 py-3 ${r.verdict.passed ? "border-ok text-ok" : "border-bad text-bad"}`}
      >
        <p className="text-2xl font-bold" data-testid="verdict">
          {verdictLine(r)}
        </p>
        <p className="text-ink" data-testid="worst">
          {worstLine(r)}
        </p>
        <p className="text-sm text-ink-soft">
          Tolerances: deviation ±{mm(r.tolerance.deviation)}, standing water {mm(r.tolerance.pondDepth)}, finished fall
          at least {formatRatio(r.tolerance.minFall)}. {r.deviations.length} points measured.
        </p>
      </section>
      <Caution />

      <div className="flex flex-wrap gap-2">
        <a className="btn" href={`/roofs/${roof.id}/checks/${check.id}.pdf`} download>
          Download the report (PDF)
        </a>
      </div>

      <section aria-labelledby="maps" className="space-y-2">
        <h2 id="maps" className="text-xl font-semibold">
          Design and as built
        </h2>
        <div className="grid gap-4 md:grid-cols-2">
          <CheckPlan drawing={drawing} surface="design" title="Design: fall map at the measured points" />
          <CheckPlan drawing={drawing} surface="built" title="As built: fall map, deviations and ponds" />
        </div>
        <FallLegend minRatio={r.tolerance.minFall} />
        <DeviationKey tolerance={r.tolerance.deviation} />
      </section>

      <section aria-labelledby="worst-places" className="space-y-2">
        <h2 id="worst-places" className="text-xl font-semibold">
          Worst places
        </h2>
        {worst.length ? (
          <ol className="list-decimal space-y-1 pl-6">
            {worst.map((f) => (
              <li key={f.i}>{f.message}</li>
            ))}
          </ol>
        ) : (
          <p>Nothing outside the tolerances.</p>
        )}
        <h3 className="text-lg font-semibold">Suggested fixes</h3>
        {r.fixes.length ? (
          <ul className="list-disc space-y-1 pl-6" data-testid="fixes">
            {r.fixes.map((f, i) => (
              <li key={i}>{fixLine(f, r.deviations)}</li>
            ))}
          </ul>
        ) : (
          <p>No joist needs packing up or planing down.</p>
        )}
        {r.surface.ponds.length ? (
          <>
            <h3 className="text-lg font-semibold">Ponds</h3>
            <table className="text-sm">
              <thead>
                <tr>
                  <th className="pr-4 text-left">at (m)</th>
                  <th className="pr-4 text-right">depth</th>
                  <th className="pr-4 text-right">area</th>
                  <th className="text-right">volume</th>
                </tr>
              </thead>
              <tbody>
                {r.surface.ponds.map((p, i) => (
                  <tr key={i}>
                    <td className="pr-4">
                      ({p.at[0].toFixed(2)}, {p.at[1].toFixed(2)})
                    </td>
                    <td className="pr-4 text-right">{mm(p.depth)}</td>
                    <td className="pr-4 text-right">{p.area.toFixed(2)} m²</td>
                    <td className="text-right">{(p.volume * 1000).toFixed(1)} L</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </>
        ) : null}
      </section>

      <details>
        <summary className="cursor-pointer font-semibold">Every measured point</summary>
        <table className="mt-2 text-sm">
          <thead>
            <tr>
              <th className="pr-4 text-left">point</th>
              <th className="pr-4 text-right">design</th>
              <th className="pr-4 text-right">built</th>
              <th className="text-right">deviation</th>
            </tr>
          </thead>
          <tbody>
            {r.deviations.map((d, i) => (
              <tr key={i}>
                <td className="pr-4">{d.label ?? `(${d.at[0].toFixed(2)}, ${d.at[1].toFixed(2)})`}</td>
                <td className="pr-4 text-right">{mm(d.design)}</td>
                <td className="pr-4 text-right">{mm(d.measured)}</td>
                <td className="text-right">{mm(d.delta)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </details>
    </article>
  );
}

export function ErrorBoundary() {
  return <GeneralErrorBoundary />;
}
