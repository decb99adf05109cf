import { fallColourCss } from "~/lib/fall-colour";
import { deviationColour, type CheckDrawing } from "~/lib/as-built-drawing";

/**
 * One plan of an as-built check: the triangulated surface coloured by fall (the fall map's own
 * scale), the outline, ponds ringed, and each measured point coloured by its deviation (blue low,
 * red high, grey within tolerance). `surface` picks the design's levels or the as-built ones on
 * the same triangles, so the two plans side by side compare like with like.
 */
export function CheckPlan({
  drawing,
  surface,
  title,
  labelled = true,
}: {
  drawing: CheckDrawing;
  surface: "design" | "built";
  title: string;
  labelled?: boolean;
}) {
  const { box, triangles, outline, points, ponds } = drawing;
  const pad = Math.max(box.w, box.h) * 0.04;
  const vb = `${box.x - pad} ${-(box.y + box.h) - pad} ${box.w + 2 * pad} ${box.h + 2 * pad}`;
  const r = Math.max(box.w, box.h) / 90;
  return (
    <figure className="space-y-1">
      <figcaption className="font-semibold">{title}</figcaption>
      <svg viewBox={vb} className="h-auto w-full rounded border border-rule bg-sheet" role="img" aria-label={title}>
        <g transform="scale(1,-1)">
          {triangles.map((t, i) => (
            <polygon
              key={i}
              points={t.corners.map((c) => `${c[0]},${c[1]}`).join(" ")}
              fill={fallColourCss(surface === "design" ? t.designRatio : t.builtRatio)}
              stroke={fallColourCss(surface === "design" ? t.designRatio : t.builtRatio)}
              strokeWidth={r / 10}
            />
          ))}
          <polygon
            points={outline.map((c) => `${c[0]},${c[1]}`).join(" ")}
            fill="none"
            stroke="currentColor"
            strokeWidth={r / 2}
          />
          {surface === "built"
            ? ponds.map((p, i) => (
                <circle
                  key={i}
                  cx={p.at[0]}
                  cy={p.at[1]}
                  r={Math.max(r * 2, Math.sqrt(p.area / Math.PI))}
                  fill="rgb(40 110 220 / 0.35)"
                  stroke="rgb(20 70 170)"
                  strokeWidth={r / 3}
                  data-pond={i + 1}
                />
              ))
            : null}
          {points.map((p, i) => (
            <circle
              key={i}
              cx={p.at[0]}
              cy={p.at[1]}
              r={r}
              fill={surface === "design" ? "white" : deviationColour(p.delta, drawing.tolerance)}
              stroke="black"
              strokeWidth={r / 4}
            >
              <title>
                {p.label ?? `(${p.at[0].toFixed(2)}, ${p.at[1].toFixed(2)})`}: design {Math.round(p.design * 1000)} mm,
                built {Math.round(p.measured * 1000)} mm
              </title>
            </circle>
          ))}
        </g>
        {labelled && surface === "built"
          ? points
              .filter((p) => Math.abs(p.delta) > drawing.tolerance)
              .map((p, i) => (
                <text
                  key={i}
                  x={p.at[0] + r * 1.4}
                  y={-p.at[1] - r * 1.4}
                  fontSize={r * 2.4}
                  className="fill-current font-semibold"
                >
                  {Math.round(p.delta * 1000) > 0 ? "+" : ""}
                  {Math.round(p.delta * 1000)}
                </text>
              ))
          : null}
      </svg>
    </figure>
  );
}

/** The key to the deviation colours. */
export function DeviationKey({ tolerance }: { tolerance: number }) {
  const t = Math.round(tolerance * 1000);
  const swatch = (delta: number, text: string) => (
    <span className="flex items-center gap-1">
      <span
        aria-hidden="true"
        className="inline-block h-3 w-3 rounded-full border border-black"
        style={{ background: deviationColour(delta, tolerance) }}
      />
      {text}
    </span>
  );
  return (
    <p className="flex flex-wrap gap-4 text-sm">
      {swatch(-2 * tolerance, `low by more than ${t} mm`)}
      {swatch(0, `within ±${t} mm`)}
      {swatch(2 * tolerance, `high by more than ${t} mm`)}
    </p>
  );
}
