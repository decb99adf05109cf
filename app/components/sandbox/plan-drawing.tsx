import { useMemo } from "react";
import type { Analysis, RoofSpec } from "~/engine";
import { useFormat } from "./format";
import { MeshSampler } from "./mesh-sample";
import { bounds, edgeKindsOf, signedArea } from "./spec-edit";

/**
 * A still plan of the roof for print: outline (parapets solid, eaves dashed), joist lines, the
 * longest fall line, outlets, edge lengths, levels in mm at corners and outlets, and a scale bar.
 */
export function PlanDrawing({ spec, analysis, className = "" }: { spec: RoofSpec; analysis: Analysis; className?: string }) {
  const { metres, mm, system } = useFormat();
  // Levels at corners and outlets without their unit (the label says which).
  const level = (z: number) => (system === "us" ? mm(z).replace(/\u00a0in$/, "") : String(Math.round(z * 1000)));
  const levelUnit = system === "us" ? "inches" : "millimetres";
  const b = bounds(spec.outline);
  const span = Math.max(b.maxX - b.minX, b.maxY - b.minY, 1);
  const pad = span * 0.14;
  const vb = { x: b.minX - pad, y: -(b.maxY + pad), w: b.maxX - b.minX + 2 * pad, h: b.maxY - b.minY + 2 * pad };
  const u = span / 60;
  const kinds = edgeKindsOf(spec);
  const sampler = useMemo(() => (analysis.shaped.mesh ? new MeshSampler(analysis.shaped.mesh) : null), [analysis]);
  const n = spec.outline.length;
  const out = signedArea(spec.outline) > 0 ? 1 : -1;
  const joists = analysis.shaped.joists.flatMap((j) => j.spans.map((s) => `M${s.start[0]} ${-s.start[1]}L${s.end[0]} ${-s.end[1]}`)).join("");
  const line = analysis.shaped.longestFallLine;
  const linePath = line ? (line.path.length >= 2 ? line.path : [line.from, line.to]).map((p, i) => `${i ? "L" : "M"}${p[0]} ${-p[1]}`).join("") : "";
  // The scale bar: a round number of metres, or of feet.
  const unitLength = system === "us" ? 0.3048 : 1;
  const scaleUnits = [1, 2, 5, 10, 20, 50, 100, 200, 500].find((s) => s * unitLength >= span / 5) ?? 500;
  const scale = scaleUnits * unitLength;
  return (
    <svg viewBox={`${vb.x} ${vb.y} ${vb.w} ${vb.h}`} className={className} role="img" aria-label={`Plan of the roof with outlets, joists, the longest fall line and levels in ${levelUnit}`} data-testid="plan-drawing">
      <polygon points={spec.outline.map((p) => `${p[0]},${-p[1]}`).join(" ")} fill="#fffdf8" />
      <path d={joists} stroke="#52606d" strokeOpacity={0.35} strokeWidth={u * 0.08} />
      {(spec.openings ?? []).map((o, i) => (
        <polygon key={`opening-${i}`} data-testid={`sheet-plan-opening-${i}`} points={o.outline.map((p) => `${p[0]},${-p[1]}`).join(" ")}
          fill="#e4e7eb" stroke="#1f2933" strokeWidth={u * 0.15} />
      ))}
      {linePath && <path d={linePath} stroke="#b4471f" strokeWidth={u * 0.35} strokeDasharray={`${u * 1.2} ${u * 0.6}`} fill="none" />}
      {spec.outline.map((a, i) => {
        const c = spec.outline[(i + 1) % n];
        const len = Math.hypot(c[0] - a[0], c[1] - a[1]);
        const nx = len ? (out * (c[1] - a[1])) / len : 0;
        const ny = len ? (-out * (c[0] - a[0])) / len : 0;
        const mx = (a[0] + c[0]) / 2 + nx * u * 2.2;
        const my = (a[1] + c[1]) / 2 + ny * u * 2.2;
        return (
          <g key={i}>
            <line x1={a[0]} y1={-a[1]} x2={c[0]} y2={-c[1]} stroke="#1f2933" strokeWidth={kinds[i] === "eaves" ? u * 0.2 : u * 0.45}
              strokeDasharray={kinds[i] === "eaves" ? `${u} ${u * 0.6}` : undefined} strokeLinecap="square" />
            <text x={mx} y={-my} fontSize={u * 1.5} textAnchor="middle" dominantBaseline="middle" fill="#52606d">
              {metres(len)}{kinds[i] === "eaves" ? " eaves" : ""}
            </text>
          </g>
        );
      })}
      {spec.outline.map((p, i) => {
        const z = sampler?.levelAt(p[0], p[1]);
        return (
          <g key={`c${i}`}>
            <circle cx={p[0]} cy={-p[1]} r={u * 0.35} fill="#1f2933" />
            {z != null && (
              <text x={p[0] + u * 0.8} y={-p[1] - u * 0.8} fontSize={u * 1.4} fill="#1f2933" fontWeight={700}>
                {level(z)}
              </text>
            )}
          </g>
        );
      })}
      {spec.outlets.map((o, k) => (
        <g key={`o${k}`}>
          <circle cx={o.at[0]} cy={-o.at[1]} r={u * 0.9} fill="#b4471f" stroke="#1f2933" strokeWidth={u * 0.2} />
          <text x={o.at[0] + u * 1.3} y={-o.at[1] - u * 1.1} fontSize={u * 1.4} fill="#8c3516" fontWeight={700}>
            O{k + 1} · {level(o.level ?? 0)}
          </text>
        </g>
      ))}
      <g transform={`translate(${b.minX} ${-(b.minY - pad * 0.55)})`}>
        <line x1={0} y1={0} x2={scale} y2={0} stroke="#1f2933" strokeWidth={u * 0.3} />
        <line x1={0} y1={-u * 0.6} x2={0} y2={u * 0.6} stroke="#1f2933" strokeWidth={u * 0.2} />
        <line x1={scale} y1={-u * 0.6} x2={scale} y2={u * 0.6} stroke="#1f2933" strokeWidth={u * 0.2} />
        <text x={scale + u} y={0} fontSize={u * 1.4} dominantBaseline="middle" fill="#1f2933">{scaleUnits} {system === "us" ? "ft" : "m"}</text>
      </g>
    </svg>
  );
}
