/** A small plan of a roof as SVG: outline and outlets, y up as on the plan editor. */
export function PlanThumb({ spec, label, className = "" }: { spec: unknown; label: string; className?: string }) {
  const s = spec as { outline?: [number, number][]; outlets?: { at: [number, number] }[] } | null;
  const outline = Array.isArray(s?.outline) ? s.outline : [];
  if (outline.length < 3) return null;
  const xs = outline.map((p) => p[0]);
  const ys = outline.map((p) => p[1]);
  const [minX, maxX, minY, maxY] = [Math.min(...xs), Math.max(...xs), Math.min(...ys), Math.max(...ys)];
  const size = Math.max(maxX - minX, maxY - minY, 1e-6);
  const pad = size * 0.08;
  const r = size * 0.035;
  // Plan y runs up; SVG y runs down.
  const pt = (p: [number, number]) => `${p[0]},${maxY + minY - p[1]}`;
  return (
    <svg
      role="img"
      aria-label={label}
      className={className}
      viewBox={`${minX - pad} ${minY - pad} ${maxX - minX + 2 * pad} ${maxY - minY + 2 * pad}`}
      preserveAspectRatio="xMidYMid meet"
    >
      <polygon
        points={outline.map(pt).join(" ")}
        className="fill-paper-deep stroke-ink"
        strokeWidth={size * 0.012}
        strokeLinejoin="round"
      />
      {(Array.isArray(s?.outlets) ? s.outlets : []).map((o, i) => {
        const [x, y] = pt(o.at).split(",").map(Number);
        return <circle key={i} cx={x} cy={y} r={r} className="fill-accent stroke-ink" strokeWidth={size * 0.008} />;
      })}
    </svg>
  );
}
