import { useId, useState } from "react";
import { Box } from "lucide-react";
import type { FigureData } from "~/lib/lessons/types";
import { FallLegend } from "~/components/sandbox/results/fall-legend";
import { useFormat } from "~/components/sandbox/format";
import { SandboxWorkspace } from "~/components/sandbox/workspace";

/** The plan of a figure: fall map or catchments, flat faces hatched, outline, outlets, longest fall line. */
function PlanSvg({ f }: { f: FigureData }) {
  const id = useId().replace(/[^a-zA-Z0-9_-]/g, "");
  const hatch = `hatch${id}`;
  const clip = `clip${id}`;
  const u = f.unit;
  // The fall grid is drawn in cell units, so its hatch is sized in cells too.
  const hatchSize = f.grid ? (u * 1.2) / f.grid.cell : u * 1.2;
  const gridTransform = f.grid ? `translate(${f.grid.x} ${f.grid.y}) scale(${f.grid.cell})` : undefined;
  const label =
    f.view === "catchments"
      ? "Plan of the roof coloured by catchment, with its outlets"
      : "Plan of the roof coloured by fall, faces flatter than the minimum hatched, with outlets and the longest fall line";
  return (
    <svg viewBox={f.viewBox} className="h-auto max-h-[26rem] w-full" role="img" aria-label={label}>
      <defs>
        <pattern
          id={hatch}
          width={hatchSize}
          height={hatchSize}
          patternUnits="userSpaceOnUse"
          patternTransform="rotate(45)"
        >
          <line
            x1="0"
            y1="0"
            x2="0"
            y2={hatchSize}
            stroke="#1f2933"
            strokeWidth={hatchSize * 0.15}
            strokeOpacity="0.55"
          />
        </pattern>
        <clipPath id={clip}>
          <polygon points={f.outline} />
        </clipPath>
      </defs>
      <polygon points={f.outline} fill="var(--color-sheet)" />
      <g clipPath={`url(#${clip})`}>
        <g transform={gridTransform}>
          {f.fills.map((g) => (
            <path key={g.fill} d={g.d} fill={g.fill} stroke={g.fill} strokeWidth={f.grid ? 0.1 : u * 0.04} />
          ))}
        </g>
        {f.flat && <path d={f.flat} fill={`url(#${hatch})`} transform={gridTransform} />}
      </g>
      {f.edges.map((e, i) => (
        <path
          key={i}
          d={e.d}
          stroke="var(--color-ink)"
          strokeWidth={e.eaves ? u * 0.25 : u * 0.6}
          strokeDasharray={e.eaves ? `${u} ${u * 0.6}` : undefined}
          strokeLinecap="square"
          fill="none"
        />
      ))}
      {f.view !== "catchments" && f.longest && (
        <path
          d={f.longest.d}
          stroke="var(--color-accent)"
          strokeWidth={u * 0.45}
          strokeDasharray={`${u * 1.4} ${u * 0.7}`}
          fill="none"
          strokeLinecap="round"
        />
      )}
      {f.outlets.map(([x, y], i) => (
        <circle
          key={i}
          cx={x}
          cy={y}
          r={u * 1.1}
          fill="var(--color-accent)"
          stroke="var(--color-ink)"
          strokeWidth={u * 0.3}
        />
      ))}
    </svg>
  );
}

function KeyTable({ f }: { f: FigureData }) {
  return (
    <dl className="grid grid-cols-[auto_1fr] gap-x-4 text-sm max-sm:grid-cols-2">
      {f.key.map((k) => (
        <div key={k.label} className="col-span-2 grid grid-cols-subgrid border-b border-rule py-1 last:border-b-0">
          <dt className="text-ink-soft">{k.label}</dt>
          <dd className="font-medium tabular-nums">{k.value}</dd>
        </div>
      ))}
    </dl>
  );
}

function CatchmentKey({ f }: { f: FigureData }) {
  const { area, flow, system } = useFormat();
  return (
    <table className="data-table w-full">
      <caption className="pb-1 text-left text-xs text-ink-soft">
        Design flow Q = i·A/3600 at{" "}
        {system === "us" ? `${(f.intensity / 25.4).toFixed(2)} in/h` : `${f.intensity} mm/h`}
      </caption>
      <thead>
        <tr>
          <th scope="col">Drain</th>
          <th scope="col" className="text-right">
            Area
          </th>
          <th scope="col" className="text-right">
            Flow
          </th>
        </tr>
      </thead>
      <tbody>
        {f.catchments.map((c) => (
          <tr key={c.label}>
            <td>
              <span
                className="mr-2 inline-block h-3 w-3 rounded-sm border border-ink/40 align-middle"
                style={{ background: c.fill }}
                aria-hidden="true"
              />
              {c.label}
            </td>
            <td className="text-right">{area(c.area)}</td>
            <td className="text-right">{flow(c.flow)}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

function Schedule({ f }: { f: FigureData }) {
  const { metres, mm } = useFormat();
  return (
    <div className="max-h-72 overflow-auto rounded border border-rule">
      <table className="data-table w-full">
        <caption className="sr-only">Drop schedule: drop below the high level at each end of every joist span</caption>
        <thead className="sticky top-0 bg-sheet">
          <tr>
            <th scope="col">Joist</th>
            <th scope="col" className="text-right">
              Length
            </th>
            <th scope="col" className="text-right">
              Drop at start
            </th>
            <th scope="col" className="text-right">
              Drop at end
            </th>
            <th scope="col" className="text-right">
              Fall
            </th>
          </tr>
        </thead>
        <tbody>
          {f.schedule.map((r, i) => (
            <tr key={i}>
              <td>{r.joist}</td>
              <td className="text-right">{metres(r.length)}</td>
              <td className="text-right">{mm(r.startDrop / 1000)}</td>
              <td className="text-right">{mm(r.endDrop / 1000)}</td>
              <td className="text-right">{r.ratio}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function Compare({ f }: { f: FigureData }) {
  const { metres, mm } = useFormat();
  const c = f.compare!;
  const rows = [
    { label: "Shaped (level rim)", h: c.shaped },
    { label: "Internal gutter", h: c.gutter },
    { label: "One plane to an open edge", h: c.openEdge },
  ];
  const max = Math.max(...rows.map((r) => r.h ?? 0), 0.001);
  return (
    <div className="grid gap-2">
      <svg
        viewBox="0 0 320 110"
        className="h-auto w-full max-w-xl"
        role="img"
        aria-label="High level of each layout as a bar"
      >
        {rows.map((r, i) => (
          <g key={r.label} transform={`translate(0 ${i * 36})`}>
            <text x="0" y="14" fontSize="11" fill="var(--color-ink)">
              {r.label}
            </text>
            {r.h != null ? (
              <>
                <rect
                  x="0"
                  y="18"
                  height="10"
                  width={(220 * r.h) / max}
                  fill={i === 0 ? "var(--color-accent)" : "var(--color-ink-soft)"}
                />
                <text x={(220 * r.h) / max + 6} y="27" fontSize="11" fill="var(--color-ink)">
                  {mm(r.h)}
                </text>
              </>
            ) : (
              <text x="0" y="28" fontSize="11" fill="var(--color-ink-soft)">
                not comparable: {c.reason}
              </text>
            )}
          </g>
        ))}
      </svg>
      <p className="text-sm">
        {c.saved != null ? (
          <>
            Shaping saves <strong>{mm(c.saved)}</strong> of height against the gutter layout, and about{" "}
            {metres(c.detailLength, 0)} of membrane changes of plane along {metres(c.gutterLength, 1)} of gutter.
          </>
        ) : (
          <>The gutter layout is not comparable here: {c.reason}.</>
        )}
      </p>
    </div>
  );
}

/** A lesson figure the app draws itself; 3D figures open the live, read-only roof on request. */
export function RoofFigure({ f }: { f: FigureData }) {
  const [live, setLive] = useState(false);
  if (f.error) {
    return (
      <p role="alert" className="rounded border border-bad/40 px-3 py-2 text-sm text-bad">
        This figure could not be drawn: {f.error}
      </p>
    );
  }
  return (
    // Plan and key side by side only where the figure itself is wide (a container query): in a
    // half-width column the key's figures were squeezed to a word a line.
    <figure className="card @container my-4 grid gap-3" data-testid="roof-figure">
      {f.view === "plan" || f.view === "catchments" || (f.view === "3d" && !live) ? (
        <div className="grid gap-3 @2xl:grid-cols-[3fr_2fr] @2xl:items-start">
          <div>
            <PlanSvg f={f} />
            {f.view !== "catchments" && <FallLegend minRatio={f.minRatio} />}
          </div>
          <div className="grid gap-2">
            {f.view === "catchments" ? <CatchmentKey f={f} /> : <KeyTable f={f} />}
            {f.view === "3d" && (
              <button type="button" className="btn-primary justify-self-start" onClick={() => setLive(true)}>
                <Box aria-hidden="true" className="h-4 w-4" /> Open the live roof in 3D
              </button>
            )}
          </div>
        </div>
      ) : null}
      {f.view === "3d" && live && <SandboxWorkspace initialSpec={f.spec} readOnly />}
      {f.view === "figures" && <KeyTable f={f} />}
      {f.view === "schedule" && <Schedule f={f} />}
      {f.view === "compare" && <Compare f={f} />}
      <figcaption className="text-sm text-ink-soft">{f.caption}</figcaption>
    </figure>
  );
}
