import { useFormat } from "../format";
import { useSandbox } from "../state/store";

/** What the 3D view shows, in words, for screen readers and for anyone who prefers reading. */
export function SceneSummary() {
  const { fallDetail, fall: formatRatio, mm, metres, area, point } = useFormat();
  const analysis = useSandbox((s) => s.analysis);
  const spec = useSandbox((s) => s.analysedSpec);
  if (!analysis || !spec) return <p>No roof to describe yet.</p>;
  const { shaped, minFall } = analysis;
  const steep = shaped.fallMap.areaByBand[0];
  const longest = shaped.longestFallLine;
  return (
    <div className="text-sm" data-testid="scene-summary">
      <p>
        A roof of {area(analysis.area)} inside {spec.outline.length} edges, shaped to {spec.outlets.length} outlet
        {spec.outlets.length === 1 ? "" : "s"}. The level rim stands at {mm(shaped.highLevel)}; the outlets sit at{" "}
        {spec.outlets.map((o) => mm(o.level ?? 0)).join(", ") || "no outlets"}.
      </p>
      <p>
        {longest
          ? `The longest fall line runs ${metres(longest.length, 1)} from ${point(longest.from)} to its drain, dropping ${mm(longest.drop)} at ${formatRatio(longest.ratio)} (${fallDetail(longest.ratio)}). `
          : "There is no fall line. "}
        {steep ? `${area(steep.area)} falls ${steep.label}; ` : ""}
        {area(shaped.fallMap.flatterThanMinimumArea)} is flatter than the minimum {formatRatio(minFall.ratio)}{" "}
        (hatched). {shaped.ponding.length ? `${shaped.ponding.length} place(s) hold water.` : "No water ponds."}
      </p>
      {(spec.openings?.length ?? 0) > 0 && (
        <p data-testid="scene-upstands">
          {spec.openings!.length} opening{spec.openings!.length === 1 ? "" : "s"} stand on the deck as boxes, each with
          its upstand:{" "}
          {spec.openings!.map((o, i) => `${i + 1}, ${o.kind ?? "other"}, ${mm(o.upstand ?? 0.15)}`).join("; ")}.
        </p>
      )}
      {(shaped.ridges?.length ?? 0) > 0 && (
        <p data-testid="scene-ridges">
          {shaped.ridges.length} ridge{shaped.ridges.length === 1 ? "" : "s"} drawn at the level rim
          {shaped.areas.length > 1 ? `, dividing the roof into ${shaped.areas.length} drainage areas` : ""}.
        </p>
      )}
    </div>
  );
}
