import { useEffect, useMemo, useState } from "react";
import { data, Link, useLoaderData } from "react-router";
import { Printer } from "lucide-react";
import type { Route } from "./+types/sandbox.sheet";
import { parseSpec, RULE_SETS, type Analysis, type RoofSpec } from "~/engine";
import { readLinkedSpec } from "~/components/sandbox/linked-spec.server";
import { Caution } from "~/components/caution";
import { GeneralErrorBoundary } from "~/components/error-boundary";
import { FallRatio } from "~/components/sandbox/fall-ratio";
import { fallDetail as degreesAndPercent, useFormat } from "~/components/sandbox/format";
import { RoofUnits } from "~/components/units";
import { Day } from "~/components/dates";
import { PlanDrawing } from "~/components/sandbox/plan-drawing";
import { citation, RULE_KEY_NAMES } from "~/lib/pack/rule-keys";
import { runAnalysis } from "~/components/sandbox/run-analysis";
import { scheduleRows } from "~/lib/pack/schedule-rows";
import { SHEET_SESSION_KEY } from "~/components/sandbox/sheet-link";

export const meta: Route.MetaFunction = () => [{ title: "Check sheet · Fallwright" }];

/** The roof comes in the link (`spec`, base64url JSON) or, for long ones, from the sandbox's sessionStorage. */
export async function loader({ request }: Route.LoaderArgs) {
  const url = new URL(request.url);
  const linked = readLinkedSpec(url);
  if (linked.error) throw data(linked.error.message, { status: linked.error.status });
  return { spec: linked.spec, fromSession: !linked.spec && url.searchParams.get("from") === "session" };
}

const PRINT_CSS = `
@page { size: A4; margin: 12mm; }
@media print {
  html, body { background: white !important; }
  body { font-size: 10pt; }
  .sheet-block { break-inside: avoid; }
  .sheet-table thead { display: table-header-group; }
  .sheet-table tr { break-inside: avoid; }
}`;

export default function CheckSheetPage() {
  const loaded = useLoaderData<typeof loader>();
  const [spec, setSpec] = useState<RoofSpec | null>(loaded.spec);
  const [missing, setMissing] = useState(false);

  useEffect(() => {
    if (loaded.spec || !loaded.fromSession) return;
    try {
      const parsed = parseSpec(JSON.parse(sessionStorage.getItem(SHEET_SESSION_KEY) ?? "null"));
      if (parsed.ok) setSpec(parsed.spec);
      else setMissing(true);
    } catch {
      setMissing(true);
    }
  }, [loaded]);

  if (!spec) {
    return (
      <div className="card mx-auto max-w-xl">
        <h1 className="text-xl font-bold">Check sheet</h1>
        <p className="mt-2 text-sm">
          {loaded.fromSession && !missing
            ? "Reading the roof from the sandbox…"
            : "There is no roof to print here. Open the sandbox and press “Check sheet”."}
        </p>
        <p className="mt-3">
          <Link className="btn" to="/sandbox">Open the sandbox</Link>
        </p>
      </div>
    );
  }
  return <CheckSheet spec={spec} />;
}

function Block({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <section className="sheet-block mt-5">
      <h2 className="mb-1.5 border-b-2 border-ink pb-0.5 text-sm font-bold uppercase tracking-wide">{title}</h2>
      {children}
    </section>
  );
}

function CheckSheet({ spec }: { spec: RoofSpec }) {
  const outcome = useMemo(() => runAnalysis(spec), [spec]);
  if (!outcome.ok) {
    return (
      <div className="card mx-auto max-w-xl" role="alert">
        <h1 className="text-xl font-bold">Check sheet</h1>
        <p className="mt-2 text-sm">{outcome.error.message}</p>
      </div>
    );
  }
  return (
    <RoofUnits ruleSet={spec.ruleSet}>
      <SheetBody spec={spec} analysis={outcome.analysis} />
    </RoofUnits>
  );
}

function SheetBody({ spec, analysis }: { spec: RoofSpec; analysis: Analysis }) {
  const { shaped, gutter, openEdge, comparison, advice } = analysis;
  const { area, flow, fall: formatRatio, metres, mm, point, system } = useFormat();
  const us = system === "us";
  const level = (m: number) => (us ? mm(m).replace(/\u00a0in$/, "") : String(Math.round(m * 1000)));
  const rows = scheduleRows(shaped.joists);
  const dir = shaped.joistDirection;
  const figures: [string, React.ReactNode][] = [
    ["Roof area", area(analysis.area)],
    ...(shaped.openings.length
      ? ([["Openings (no deck)", `${shaped.openings.length}, ${area(shaped.openings.reduce((sum, o) => sum + o.area, 0))}`]] as [string, React.ReactNode][])
      : []),
    ["High level H (" + shaped.highLevelSource + ")", mm(shaped.highLevel)],
    ["Base fall", <FallRatio key="b" ratio={analysis.baseFall.ratio} />],
    ["Minimum fall for fall lines", <FallRatio key="m" ratio={analysis.minFall.ratio} />],
    ["Longest fall line", shaped.longestFallLine ? <>{metres(shaped.longestFallLine.length)} at <FallRatio ratio={shaped.longestFallLine.ratio} /></> : "–"],
    ["Flattest fall line", <FallRatio key="w" ratio={shaped.worstFallRatio} />],
    ["Area flatter than the minimum", area(shaped.fallMap.flatterThanMinimumArea)],
    ["Joists", `${shaped.joists.length} at ${mm(spec.joists?.spacing ?? 0.4)}, direction (${dir[0].toFixed(3)}, ${dir[1].toFixed(3)})`],
    ["Rainfall intensity", `${us ? `${(analysis.rainfall.intensity / 25.4).toFixed(2)} in/h` : `${analysis.rainfall.intensity} mm/h`}${analysis.rainfall.assumed ? " (assumed)" : ""}`],
    ["Gutter layout high level", gutter.comparable ? `${mm(gutter.highLevel)} (saves ${mm(comparison.heightSaved)} by shaping)` : `not comparable: ${gutter.reason ?? ""}`],
    ["Open edge (edge " + (openEdge.edge + 1) + ") high level", mm(openEdge.highLevel)],
  ];
  return (
    <article className="mx-auto max-w-4xl bg-sheet p-6 shadow-[2px_2px_0_0_var(--color-rule)] print:max-w-none print:bg-white print:p-0 print:shadow-none" data-testid="check-sheet">
      <style>{PRINT_CSS}</style>
      <header className="flex flex-wrap items-start justify-between gap-3 border-b-2 border-ink pb-2">
        <div>
          <p className="text-xs font-medium uppercase tracking-widest text-accent">Fallwright · check sheet</p>
          <h1 className="text-2xl font-bold tracking-tight">Shaped parapet roof</h1>
          <p className="text-sm text-ink-soft">
            {spec.outline.length} edges, {spec.outlets.length} outlet{spec.outlets.length === 1 ? "" : "s"} · rule set: {analysis.ruleSet.name} · printed{" "}
            <Day iso={new Date().toISOString()} />
          </p>
        </div>
        <span className="no-print flex gap-2">
          <Link className="btn" to="/sandbox">Back to the sandbox</Link>
          <button type="button" className="btn-primary" onClick={() => window.print()}>
            <Printer size={16} aria-hidden="true" /> Print
          </button>
        </span>
      </header>
      <div className="mt-3">
        <Caution />
      </div>

      <div className="sheet-block mt-4 grid gap-4 md:grid-cols-[3fr_2fr] print:grid-cols-[3fr_2fr]">
        <figure>
          <PlanDrawing spec={spec} analysis={analysis} className="h-auto w-full border border-rule" />
          <figcaption className="mt-1 text-xs text-ink-soft">
            Plan. Levels in {us ? "inches" : "mm"} above the outlet datum; dashed orange: the longest fall line; thin lines: joists.
          </figcaption>
        </figure>
        <dl className="grid content-start gap-y-1 text-sm">
          {figures.map(([k, v]) => (
            <div key={k} className="flex justify-between gap-3 border-b border-rule py-0.5">
              <dt className="text-ink-soft">{k}</dt>
              <dd className="text-right font-medium tabular-nums">{v}</dd>
            </div>
          ))}
        </dl>
      </div>

      <Block title="Edge falls">
        <table className="data-table sheet-table w-full">
          <thead><tr><th>edge</th><th>from (low)</th><th>to (high)</th><th className="text-right">fall</th><th className="text-right">° · %</th></tr></thead>
          <tbody>
            {shaped.edgeFalls.map((r, i) => (
              <tr key={i}><td>{r.edge + 1}</td><td>{point(r.from)}</td><td>{point(r.to)}</td><td className="text-right">{formatRatio(r.ratio)}</td><td className="text-right">{degreesAndPercent(r.ratio)}</td></tr>
            ))}
          </tbody>
        </table>
      </Block>

      {shaped.openings.length > 0 && (
        <Block title="Openings">
          <table className="data-table sheet-table w-full" data-testid="sheet-openings">
            <thead><tr><th>opening</th><th>kind</th><th className="text-right">upstand</th><th className="text-right">area</th><th>corners</th></tr></thead>
            <tbody>
              {shaped.openings.map((o) => (
                <tr key={o.index}>
                  <td>{o.index + 1}</td><td>{o.kind}</td><td className="text-right">{mm(o.upstand)}</td><td className="text-right">{area(o.area)}</td>
                  <td>{(spec.openings?.[o.index]?.outline ?? []).map((p) => point(p)).join(" ")}</td>
                </tr>
              ))}
            </tbody>
          </table>
          <p className="mt-1 text-xs text-ink-soft">The deck keeps its levels round each opening; joists cut by one are trimmed and listed in pieces below.</p>
        </Block>
      )}

      <Block title="Catchments and flows">
        <table className="data-table sheet-table w-full">
          <thead><tr><th>drain</th><th className="text-right">area</th><th className="text-right">design flow</th><th className="text-right">capacity</th></tr></thead>
          <tbody>
            {shaped.catchments.map((c) => (
              <tr key={c.drain}><td>{c.label}</td><td className="text-right">{area(c.area)}</td><td className="text-right">{flow(c.flow)}</td><td className="text-right">{c.capacity == null ? "–" : flow(c.capacity)}</td></tr>
            ))}
          </tbody>
        </table>
        <p className="mt-1 text-xs text-ink-soft">
          Q = i·A/3600, runoff coefficient 1 (ASCE 7-05 Commentary C8). Ponding: {shaped.ponding.length ? `${shaped.ponding.length} low point(s)` : "none"}.
        </p>
      </Block>

      <Block title={`Warnings and advice`}>
        <ul className="list-disc pl-5 text-sm">
          {analysis.warnings.map((w, i) => <li key={i}>{w.message}</li>)}
          {analysis.warnings.length === 0 && <li>No warnings.</li>}
          {advice.minimumBaseFall && (
            <li>Flattest base fall keeping every fall line at {formatRatio(analysis.minFall.ratio)}: {formatRatio(advice.minimumBaseFall.ratio)} ({degreesAndPercent(advice.minimumBaseFall.ratio)}).</li>
          )}
          {advice.extraOutlet && (
            <li>One more outlet at {point(advice.extraOutlet.at)} (edge {advice.extraOutlet.edge + 1}) would bring the longest fall line to {formatRatio(advice.extraOutlet.longestFallRatio)}.</li>
          )}
        </ul>
      </Block>

      <Block title={`Drop schedule (H = ${mm(shaped.highLevel)})`}>
        <table className="data-table sheet-table w-full" data-testid="sheet-schedule">
          <thead>
            <tr><th>joist</th><th>offset{us ? "" : " (m)"}</th><th>span</th><th>length{us ? "" : " (m)"}</th><th>start level</th><th>end level</th><th>start drop</th><th>end drop</th><th>fall</th></tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={`${r.joist}-${r.span}`}>
                <td>{r.joist}</td><td>{us ? metres(r.offset) : r.offset.toFixed(2)}</td><td>{r.span}</td><td>{us ? metres(r.length) : r.length.toFixed(2)}</td>
                <td>{level(r.metres.startLevel)}</td><td>{level(r.metres.endLevel)}</td><td>{level(r.metres.startDrop)}</td><td>{level(r.metres.endDrop)}</td><td>{formatRatio(r.ratio)}</td>
              </tr>
            ))}
          </tbody>
        </table>
        <p className="mt-1 text-xs text-ink-soft">Levels and drops in {us ? "inches (to 1/16)" : "mm"}; drops measured down from H at each bearing.</p>
      </Block>

      <Block title="Rule set and sources">
        <p className="text-sm font-medium">{analysis.ruleSet.name}</p>
        <ul className="mt-1 list-disc pl-5 text-sm">
          {analysis.ruleSet.used.map((u) => (
            <li key={u.key}>
              {RULE_KEY_NAMES[u.key] ?? u.key}: {u.unit === "ratio" ? `${formatRatio(u.value)} (${degreesAndPercent(u.value)})` : u.unit === "m" ? mm(u.value) : `× ${u.value}`}, {citation(u)}
            </li>
          ))}
        </ul>
        {(RULE_SETS[analysis.ruleSet.id]?.notes ?? []).map((n) => <p key={n} className="mt-1 text-xs text-ink-soft">{n}</p>)}
      </Block>

      <div className="sheet-block mt-5">
        <Caution />
      </div>
    </article>
  );
}

export function ErrorBoundary() {
  return <GeneralErrorBoundary />;
}
