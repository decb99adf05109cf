import { analyse, formatRatio, parseSpec, type Analysis, type RoofSpec } from "../../engine";
import { cividis, fallPosition } from "../fall-colour";
import type { Figure } from "./schema";
import type { FigureData } from "./types";

export type { FigureData };

// Colour-blind-safe, distinct in grey too (Okabe & Ito 2008 palette, softened for fills).
const CATCHMENT_FILLS = ["#e69f00", "#56b4e9", "#009e73", "#f0e442", "#0072b2", "#d55e00", "#cc79a7", "#999999"];

/** The fall map's own scale (shared with the sandbox), in 40 steps so cells group into few paths. */
function bucketColour(ratio: number | null): string {
  const [r, g, b] = cividis(Math.round(fallPosition(ratio) * 40) / 40);
  return `rgb(${r} ${g} ${b})`;
}

const r2 = (v: number) => Math.round(v * 100) / 100;
const mm = (v: number) => `${Math.round(v * 1000)} mm`;

function tri(p: number[], a: number, b: number, c: number): string {
  return `M${r2(p[a * 3])} ${r2(-p[a * 3 + 1])}L${r2(p[b * 3])} ${r2(-p[b * 3 + 1])}L${r2(p[c * 3])} ${r2(-p[c * 3 + 1])}Z`;
}

function keyFigures(a: Analysis, spec: RoofSpec): FigureData["key"] {
  const line = a.shaped.longestFallLine;
  const out: FigureData["key"] = [
    { label: "High level (height budget)", value: mm(a.shaped.highLevel) },
    { label: "Base fall", value: formatRatio(a.baseFall.ratio) },
    {
      label: "Longest fall line",
      value: line ? `${formatRatio(line.ratio)} · ${line.length.toFixed(1)} m · drop ${mm(line.drop)}` : "none",
    },
    { label: "Flattest fall line", value: formatRatio(a.shaped.worstFallRatio) },
    {
      label: `Area flatter than ${formatRatio(a.minFall.ratio)}`,
      value: `${a.shaped.fallMap.flatterThanMinimumArea.toFixed(1)} m² of ${a.area.toFixed(1)} m²`,
    },
    { label: "Outlets", value: String(spec.outlets.length) },
    { label: "Ponding", value: a.shaped.ponding.length ? `${a.shaped.ponding.length} place(s)` : "none" },
  ];
  if (a.comparison.heightSaved != null)
    out.push({ label: "Height saved against an internal gutter", value: mm(a.comparison.heightSaved) });
  return out;
}

/** The engine's mesh, coarsened for a figure (the surface does not depend on joist spacing). */
function figureMesh(spec: RoofSpec, area: number) {
  const coarse: RoofSpec = {
    ...spec,
    joists: { ...spec.joists, spacing: Math.max(spec.joists?.spacing ?? 0.4, Math.sqrt(area / 300)) },
  };
  return analyse(coarse, { traces: false }).shaped.mesh ?? null;
}

/**
 * The fall map as vector shapes: every face of the engine's mesh, coloured by its own steepest
 * fall (the mesh's faceRatio) and grouped by colour; faces flatter than the minimum (or level)
 * also go into the hatched path. Drawn in plan metres, so it stays sharp at any size.
 */
function fallFaces(spec: RoofSpec, area: number, minRatio: number) {
  const mesh = figureMesh(spec, area);
  if (!mesh) return { fills: [], flat: "" };
  const groups = new Map<string, string[]>();
  const flat: string[] = [];
  for (let f = 0; f < mesh.indices.length / 3; f++) {
    const ratio = mesh.faceRatio[f];
    const d = tri(mesh.positions, mesh.indices[f * 3], mesh.indices[f * 3 + 1], mesh.indices[f * 3 + 2]);
    const fill = bucketColour(ratio != null && Number.isFinite(ratio) ? ratio : null);
    (groups.get(fill) ?? groups.set(fill, []).get(fill)!).push(d);
    if (ratio == null || !Number.isFinite(ratio) || ratio > minRatio) flat.push(d);
  }
  return { fills: [...groups].map(([fill, ds]) => ({ fill, d: ds.join("") })), flat: flat.join("") };
}

/** Catchments from the engine's mesh (coarsened: the surface does not depend on joist spacing). */
function catchmentFaces(spec: RoofSpec, area: number): FigureData["fills"] {
  const mesh = figureMesh(spec, area);
  if (!mesh) return [];
  const groups = new Map<string, string[]>();
  for (let f = 0; f < mesh.indices.length / 3; f++) {
    const fill = CATCHMENT_FILLS[mesh.faceDrain[f] % CATCHMENT_FILLS.length];
    (groups.get(fill) ?? groups.set(fill, []).get(fill)!).push(
      tri(mesh.positions, mesh.indices[f * 3], mesh.indices[f * 3 + 1], mesh.indices[f * 3 + 2]),
    );
  }
  return [...groups].map(([fill, ds]) => ({ fill, d: ds.join("") }));
}

/** Draws one figure from the engine's output; key figures come from the roof exactly as specified. */
export function buildFigure(figure: Figure): FigureData {
  const base = { caption: figure.caption, view: figure.view, spec: figure.spec as RoofSpec };
  const parsed = parseSpec(figure.spec);
  if (!parsed.ok) return { ...empty(base), error: parsed.error.message };
  const spec = parsed.spec;
  const xs = spec.outline.map((p) => p[0]);
  const ys = spec.outline.map((p) => p[1]);
  const [minX, maxX, minY, maxY] = [Math.min(...xs), Math.max(...xs), Math.min(...ys), Math.max(...ys)];
  const span = Math.max(maxX - minX, maxY - minY, 1);
  const pad = span * 0.06;
  const a = analyse(spec, { traces: false, mesh: false });
  const n = spec.outline.length;
  const kinds = spec.edges ?? [];
  let fills: FigureData["fills"] = [];
  let flat = "";
  if (figure.view === "catchments") fills = catchmentFaces(spec, a.area);
  else if (figure.view === "plan" || figure.view === "3d") ({ fills, flat } = fallFaces(spec, a.area, a.minFall.ratio));
  const line = a.shaped.longestFallLine;
  return {
    ...base,
    viewBox: `${r2(minX - pad)} ${r2(-maxY - pad)} ${r2(maxX - minX + 2 * pad)} ${r2(maxY - minY + 2 * pad)}`,
    unit: span / 60,
    outline: spec.outline.map((pt) => `${r2(pt[0])},${r2(-pt[1])}`).join(" "),
    edges: spec.outline.map((pt, i) => {
      const q = spec.outline[(i + 1) % n];
      return { d: `M${r2(pt[0])} ${r2(-pt[1])}L${r2(q[0])} ${r2(-q[1])}`, eaves: kinds[i] === "eaves" };
    }),
    outlets: spec.outlets.map((o) => [r2(o.at[0]), r2(-o.at[1])]),
    fills,
    flat,
    grid: null,
    longest: line
      ? {
          d: (line.path.length >= 2 ? line.path : [line.from, line.to])
            .map((q, i) => `${i ? "L" : "M"}${r2(q[0])} ${r2(-q[1])}`)
            .join(""),
          label: `${formatRatio(line.ratio)} over ${line.length.toFixed(1)} m`,
        }
      : null,
    minRatio: a.minFall.ratio,
    key: keyFigures(a, spec),
    catchments: a.shaped.catchments.map((c, i) => ({
      label: c.label,
      area: r2(c.area),
      flow: r2(c.flow),
      fill: CATCHMENT_FILLS[i % CATCHMENT_FILLS.length],
    })),
    intensity: a.rainfall.intensity,
    schedule:
      figure.view === "schedule"
        ? a.shaped.joists.flatMap((j) =>
            j.spans.map((s) => ({
              joist: j.index + 1,
              length: r2(s.length),
              startDrop: Math.round(s.startDrop * 1000),
              endDrop: Math.round(s.endDrop * 1000),
              ratio: formatRatio(s.ratio),
            })),
          )
        : [],
    compare:
      figure.view === "compare"
        ? {
            shaped: a.shaped.highLevel,
            gutter: a.gutter.comparable ? a.gutter.highLevel : null,
            openEdge: a.openEdge.highLevel,
            saved: a.comparison.heightSaved,
            reason: a.gutter.comparable ? null : (a.gutter.reason ?? "not comparable"),
            gutterLength: a.gutter.gutterLength,
            detailLength: a.gutter.detailLength,
          }
        : null,
    error: null,
  };
}

function empty(base: Pick<FigureData, "caption" | "view" | "spec">): FigureData {
  return {
    ...base,
    viewBox: "0 0 1 1",
    unit: 1,
    outline: "",
    edges: [],
    outlets: [],
    fills: [],
    flat: "",
    grid: null,
    longest: null,
    minRatio: 100,
    key: [],
    catchments: [],
    intensity: 0,
    schedule: [],
    compare: null,
    error: null,
  };
}

const cache = new Map<string, FigureData>();

/** Figures are pure functions of their block: cached by lesson version and position. */
export function figureFor(version: string, index: number, figure: Figure): FigureData {
  const key = `${version}:${index}`;
  let f = cache.get(key);
  if (!f) {
    f = buildFigure(figure);
    if (cache.size > 500) cache.clear();
    cache.set(key, f);
  }
  return f;
}
