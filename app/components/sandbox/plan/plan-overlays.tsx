import { memo } from "react";
import type { Analysis, RoofSpec } from "~/engine";
import { sectionJoistIndex } from "../view-3d/section-joist";
import { useSandbox } from "../state/store";

/** What the engine found, drawn on the plan: joist lines, the section joist, the longest fall line. */
export const PlanOverlays = memo(function PlanOverlays({ px }: { px: number }) {
  const analysis = useSandbox((s) => s.analysis);
  const stale = useSandbox((s) => s.analysedSpec !== s.spec);
  const showJoists = useSandbox((s) => s.view.showJoists);
  const highlight = useSandbox((s) => s.view.highlightFallLine);
  const section = useSandbox((s) =>
    s.view.camera === "section" && s.analysis ? sectionJoistIndex(s.analysis.shaped.joists, s.view.sectionJoist) : -1,
  );
  const openings = useSandbox((s) => s.spec.openings);
  const ridges = useSandbox((s) => s.spec.ridges);
  if (!analysis)
    return (
      <>
        {openings?.length ? <Openings openings={openings} /> : null}
        {ridges?.length ? <Ridges ridges={ridges} /> : null}
      </>
    );
  return (
    <g pointerEvents="none" opacity={stale ? 0.55 : 1}>
      {openings && openings.length > 0 && <Openings openings={openings} />}
      {ridges && ridges.length > 0 && <Ridges ridges={ridges} />}
      {showJoists && <JoistLines joists={analysis.shaped.joists} />}
      {section >= 0 && <SectionJoist joists={analysis.shaped.joists} index={section} />}
      {highlight && analysis.shaped.longestFallLine && <FallLinePath line={analysis.shaped.longestFallLine} px={px} />}
    </g>
  );
});

/** Openings as cross-hatched outlines (no deck there), numbered as in the settings list. */
function Openings({ openings }: { openings: NonNullable<RoofSpec["openings"]> }) {
  return (
    <g data-testid="plan-openings" pointerEvents="none">
      {openings.map((o, i) => {
        const d = o.outline.map((p, k) => `${k ? "L" : "M"}${p[0]} ${-p[1]}`).join("") + "Z";
        const xs = o.outline.map((p) => p[0]);
        const ys = o.outline.map((p) => p[1]);
        const [x0, x1, y0, y1] = [Math.min(...xs), Math.max(...xs), Math.min(...ys), Math.max(...ys)];
        return (
          <g key={i} data-testid={`plan-opening-${i}`}>
            <path
              d={d}
              fill="var(--color-sheet)"
              stroke="var(--color-ink)"
              strokeWidth={2}
              vectorEffect="non-scaling-stroke"
            />
            <path
              d={`M${x0} ${-y0}L${x1} ${-y1}M${x0} ${-y1}L${x1} ${-y0}`}
              stroke="var(--color-ink-soft)"
              strokeWidth={1}
              vectorEffect="non-scaling-stroke"
            />
            <title>{`Opening ${i + 1}: ${o.kind ?? "other"}, upstand ${Math.round((o.upstand ?? 0.15) * 1000)} mm`}</title>
          </g>
        );
      })}
    </g>
  );
}

/** Ridges (docs/roof-method-plans.md P4, P5) as heavy lines; crickets dashed. */
function Ridges({ ridges }: { ridges: NonNullable<RoofSpec["ridges"]> }) {
  return (
    <g data-testid="plan-ridges" pointerEvents="none">
      {ridges.map((r, i) => (
        <path
          key={i}
          data-testid={`plan-ridge-${i}`}
          d={r.line.map((p, k) => `${k ? "L" : "M"}${p[0]} ${-p[1]}`).join("")}
          fill="none"
          stroke="var(--color-ink)"
          strokeWidth={3}
          strokeDasharray={r.kind === "cricket" ? "6 3" : undefined}
          vectorEffect="non-scaling-stroke"
        >
          <title>{`Ridge ${i + 1}${r.kind === "cricket" ? " (cricket)" : ", level at the high level"}`}</title>
        </path>
      ))}
    </g>
  );
}

function JoistLines({ joists }: { joists: Analysis["shaped"]["joists"] }) {
  let d = "";
  for (const j of joists) for (const s of j.spans) d += `M${s.start[0]} ${-s.start[1]}L${s.end[0]} ${-s.end[1]}`;
  return (
    <path
      d={d}
      stroke="var(--color-ink-soft)"
      strokeOpacity={0.35}
      strokeWidth={1}
      vectorEffect="non-scaling-stroke"
      data-testid="plan-joists"
    />
  );
}

function SectionJoist({ joists, index }: { joists: Analysis["shaped"]["joists"]; index: number }) {
  const j = joists[Math.min(index, joists.length - 1)];
  if (!j) return null;
  const d = j.spans.map((s) => `M${s.start[0]} ${-s.start[1]}L${s.end[0]} ${-s.end[1]}`).join("");
  return (
    <path d={d} stroke="var(--color-ink)" strokeWidth={3} strokeDasharray="2 3" vectorEffect="non-scaling-stroke" />
  );
}

function FallLinePath({ line, px }: { line: NonNullable<Analysis["shaped"]["longestFallLine"]>; px: number }) {
  const pts = line.path.length >= 2 ? line.path : [line.from, line.to];
  const d = pts.map((p, i) => `${i ? "L" : "M"}${p[0]} ${-p[1]}`).join("");
  const end = pts[pts.length - 1];
  const before = pts[pts.length - 2];
  const ang = Math.atan2(-(end[1] - before[1]), end[0] - before[0]);
  const s = 9 * px;
  const head = [
    [end[0], -end[1]],
    [end[0] - s * Math.cos(ang - 0.4), -end[1] - s * Math.sin(ang - 0.4)],
    [end[0] - s * Math.cos(ang + 0.4), -end[1] - s * Math.sin(ang + 0.4)],
  ]
    .map((p) => p.join(","))
    .join(" ");
  return (
    <g data-testid="plan-fall-line">
      <path d={d} stroke="var(--color-sheet)" strokeWidth={5} fill="none" vectorEffect="non-scaling-stroke" />
      <path
        d={d}
        stroke="var(--color-accent)"
        strokeWidth={2.5}
        strokeDasharray="8 4"
        fill="none"
        vectorEffect="non-scaling-stroke"
      />
      <polygon points={head} fill="var(--color-accent)" />
    </g>
  );
}
