import { useMemo } from "react";
import type { Analysis, RoofSpec } from "~/engine";
import { figureExtent, planLabels } from "~/lib/pack/plan-figure";
import { MeshSampler } from "~/components/sandbox/view-3d/mesh-sample";

/** Helvetica/Arial digits and letters average under 0.6 em: a safe width for placing labels. */
const measure = (text: string, size: number) => text.length * size * 0.6;
const FONT = "Helvetica, Arial, sans-serif";

/**
 * The check sheet's plan as SVG: outline (parapets solid, eaves dashed), openings and ridges when
 * the roof has them, joists, the longest fall line, outlets, and labels (edge lengths, levels in
 * mm at corners and outlets) placed by the same collision pass as the PDF's.
 */
export function PlanFigureSvg({
  name,
  spec,
  analysis,
  className = "",
}: {
  name: string;
  spec: RoofSpec;
  analysis: Analysis;
  className?: string;
}) {
  const figure = useMemo(() => {
    const sampler = analysis.shaped.mesh ? new MeshSampler(analysis.shaped.mesh) : null;
    return planLabels({ name, date: new Date(0), spec, analysis }, measure, (x, y) => sampler?.levelAt(x, y) ?? null);
  }, [name, spec, analysis]);
  const e = figureExtent(figure);
  const u = figure.u;
  const Y = (y: number) => -y;
  const path = (pts: readonly (readonly [number, number])[], closed = false) =>
    pts.map((p, i) => `${i ? "L" : "M"}${p[0]} ${Y(p[1])}`).join("") + (closed ? "Z" : "");
  return (
    <svg
      viewBox={`${e.minX} ${-e.maxY} ${e.maxX - e.minX} ${e.maxY - e.minY}`}
      className={className}
      role="img"
      fontFamily={FONT}
      aria-label="Plan of the roof with outlets, joists, the longest fall line and levels in millimetres"
      data-testid="plan-drawing"
    >
      <path d={path(figure.corners, true)} fill="#fffdf8" />
      <path
        d={figure.joists.map(([a, b]) => path([a, b])).join("")}
        stroke="#52606d"
        strokeOpacity={0.35}
        strokeWidth={u * 0.08}
      />
      {figure.openings.map((o, i) => (
        <path key={`op${i}`} d={path(o, true)} fill="#f1eadb" stroke="#1f2933" strokeWidth={u * 0.3} />
      ))}
      {figure.ridges.map((r, i) => (
        <path
          key={`r${i}`}
          d={path(r)}
          fill="none"
          stroke="#b4471f"
          strokeWidth={u * 0.25}
          strokeDasharray={`${u * 0.6} ${u * 0.4}`}
        />
      ))}
      {figure.fallLine && (
        <path
          d={path(figure.fallLine)}
          stroke="#b4471f"
          strokeWidth={u * 0.35}
          strokeDasharray={`${u * 1.2} ${u * 0.6}`}
          fill="none"
        />
      )}
      {figure.edges.map((ed, i) => (
        <line
          key={`e${i}`}
          x1={ed.from[0]}
          y1={Y(ed.from[1])}
          x2={ed.to[0]}
          y2={Y(ed.to[1])}
          stroke="#1f2933"
          strokeWidth={ed.kind === "eaves" ? u * 0.2 : u * 0.45}
          strokeDasharray={ed.kind === "eaves" ? `${u} ${u * 0.6}` : undefined}
          strokeLinecap="square"
        />
      ))}
      {figure.corners.map((c, i) => (
        <circle key={`c${i}`} cx={c[0]} cy={Y(c[1])} r={u * 0.35} fill="#1f2933" />
      ))}
      {figure.outlets.map((o, i) => (
        <circle
          key={`o${i}`}
          cx={o.at[0]}
          cy={Y(o.at[1])}
          r={o.r}
          fill="#b4471f"
          stroke="#1f2933"
          strokeWidth={u * 0.2}
        />
      ))}
      {figure.labels.map((l, i) => (
        <text
          key={`l${i}`}
          x={l.centre[0]}
          y={Y(l.centre[1])}
          fontSize={l.size}
          textAnchor="middle"
          dominantBaseline="central"
          fill={l.kind === "outlet" ? "#8c3516" : l.kind === "edge" ? "#52606d" : "#1f2933"}
          fontWeight={l.kind === "edge" ? 400 : 700}
          data-label={l.kind}
        >
          {l.text}
        </text>
      ))}
      <g>
        <line
          x1={figure.scale.at[0]}
          y1={Y(figure.scale.at[1])}
          x2={figure.scale.at[0] + figure.scale.length}
          y2={Y(figure.scale.at[1])}
          stroke="#1f2933"
          strokeWidth={u * 0.3}
        />
        <text
          x={figure.scale.at[0] + figure.scale.length + u}
          y={Y(figure.scale.at[1])}
          fontSize={u * 1.4}
          dominantBaseline="central"
          fill="#1f2933"
        >
          {figure.scale.length} m
        </text>
      </g>
    </svg>
  );
}
