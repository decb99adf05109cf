import { formatRatio } from "./fall";
import type { AreaPart, Roof } from "./roof";
import type { Analysis, Catchment, FallLine, Mesh, MeshBuffers, Warning } from "./types";
import { drainName } from "./names";

/** Warnings the whole roof gives once (from the merged figures), not once per area. */
const ONCE = new Set<Warning["code"]>([
  "base-fall-below-rule",
  "rainfall-assumed",
  "high-level-below-derived",
  "mesh-coarsened",
  "fall-line-too-flat",
  "ponding",
  "narrow-gutter",
]);

/**
 * One answer from the analyses of a roof's drainage areas (docs/roof-method-plans.md P4): every
 * area shaped on its own up to the one high level H; joists, fall lines, catchments, ponding,
 * mesh and traces put side by side (joists numbered on through the areas, each with its area);
 * the fall map summed; the gutter comparison and open-edge option from the whole roof.
 */
export function mergeAreas(
  roof: Roof,
  whole: Analysis,
  parts: { part: AreaPart; analysis: Analysis; ownHighLevel: number }[],
  H: number,
): Analysis {
  const shaped = whole.shaped;
  // The whole roof's own (the gutter comparison's); then each area's, those of the roof as a whole once.
  const warnings: Warning[] = [...whole.warnings];
  const again = new Set<Warning["code"]>(["fall-line-too-flat", "ponding", "narrow-gutter"]);
  const catchments: Catchment[] = [];
  const byDrain = new Map<string, number>();
  const ponding: Analysis["shaped"]["ponding"] = [];
  const fallLines: FallLine[] = [];
  const joists: Analysis["shaped"]["joists"] = [];
  const outletsOnJoists: Analysis["shaped"]["setOut"]["outlets"] = [];
  const edgeFalls: Analysis["shaped"]["edgeFalls"] = [];
  const probes: Analysis["shaped"]["probes"] = roof.probes.map((at) => ({ at, level: null }));
  const bands = shaped.fallMap.areaByBand.map((b) => ({ ...b, area: 0 }));
  let faces = 0;
  let flatArea = 0;
  let mapArea = 0;
  let minBase: Analysis["advice"]["minimumBaseFall"] = null;
  const meshes: { mesh: Mesh | undefined; buffers: MeshBuffers | undefined; drainOf: (d: number) => number }[] = [];
  const traceCoords = parts.reduce((n, { analysis }) => n + (analysis.shaped.flowTraces?.points.length ?? 0), 0);
  // Filled before writing, so the array stays packed (see meshArrays in mesh-out.ts).
  const traces: NonNullable<Analysis["shaped"]["flowTraces"]> = {
    points: new Array<number>(traceCoords).fill(0),
    starts: [0],
    ends: [],
  };
  let traceAt = 0;
  let anyTraces = false;

  // Catchments first, so every mesh face can be pointed at the merged list.
  for (const { analysis } of parts) {
    for (const c of analysis.shaped.catchments) {
      const k = byDrain.get(c.drain);
      if (k === undefined) {
        byDrain.set(c.drain, catchments.length);
        catchments.push({ ...c });
      } else {
        // One eaves edge cut by a ridge drains in both areas: one catchment.
        catchments[k].area += c.area;
        catchments[k].flow += c.flow;
      }
    }
  }
  let pitOffset = 0;
  parts.forEach(({ part, analysis }) => {
    const s = analysis.shaped;
    const localCatchments = s.catchments.map((c) => byDrain.get(c.drain)!);
    // A face's drain is a catchment index, or catchments.length + k for pit k (pits with area).
    const pitIds = new Set<number>();
    const faceDrain = s.mesh?.faceDrain ?? s.meshBuffers?.faceDrain ?? [];
    for (let f = 0; f < faceDrain.length; f++) if (faceDrain[f] >= s.catchments.length) pitIds.add(faceDrain[f]);
    const pitRank = new Map([...pitIds].sort((a, b) => a - b).map((d, r) => [d, r]));
    const offset = pitOffset;
    meshes.push({
      mesh: s.mesh,
      buffers: s.meshBuffers,
      drainOf: (d) =>
        d < 0 ? d : d < s.catchments.length ? localCatchments[d] : catchments.length + offset + (pitRank.get(d) ?? 0),
    });
    pitOffset += s.ponding.length;
    ponding.push(...s.ponding);
    fallLines.push(...s.fallLines);
    const first = joists.length;
    for (const j of s.joists) joists.push({ ...j, index: joists.length, area: part.id });
    for (const o of s.setOut.outlets)
      outletsOnJoists.push({
        ...o,
        joist: o.joist === null ? null : o.joist + first,
        between: o.between ? [shift(o.between[0], first), shift(o.between[1], first)] : null,
      });
    edgeFalls.push(...s.edgeFalls);
    part.probes.forEach((i, k) => (probes[i] = s.probes[k]));
    s.fallMap.areaByBand.forEach((b, k) => (bands[k].area += b.area));
    faces += s.fallMap.faces;
    flatArea += s.fallMap.flatterThanMinimumArea;
    mapArea += s.fallMap.area;
    const mb = analysis.advice.minimumBaseFall;
    if (mb && (!minBase || mb.ratio < minBase.ratio)) minBase = mb;
    for (const w of analysis.warnings) {
      if (!ONCE.has(w.code)) warnings.push(w);
      else if (!again.has(w.code) && !warnings.some((x) => x.code === w.code)) warnings.push(w);
    }
    if (s.flowTraces) {
      anyTraces = true;
      const base = traceAt / 3;
      // A loop, not push(...points): spreading tens of thousands of arguments is slow, and past
      // the engine's argument limit it throws.
      const from = s.flowTraces.points;
      for (let k = 0; k < from.length; k++) traces.points[traceAt + k] = from[k];
      traceAt += from.length;
      for (let k = 1; k < s.flowTraces.starts.length; k++) traces.starts.push(base + s.flowTraces.starts[k]);
      traces.ends.push(
        ...s.flowTraces.ends.map((e) => e.replace(/^pit-(\d+)$/, (_, d: string) => `pit-${offset + Number(d)}`)),
      );
    }
  });
  edgeFalls.sort((a, b) => a.edge - b.edge);

  let longest: FallLine | null = null;
  let worst: FallLine | null = null;
  for (const l of fallLines) {
    if (!longest || l.length > longest.length) longest = l;
    if (!worst || l.ratio > worst.ratio) worst = l;
  }
  if (worst && worst.ratio > roof.minFall.ratio * (1 + 1e-9)) {
    warnings.push({
      code: "fall-line-too-flat",
      message: `The fall line from ${pt(worst.from)} to ${drainName(worst.drain)} falls at ${formatRatio(worst.ratio)}, flatter than the minimum ${formatRatio(roof.minFall.ratio)}.`,
      at: worst.from,
    });
  }
  const outside = probes.flatMap((p) => (p.level === null ? [p] : []));
  for (const p of outside) {
    if (!warnings.some((w) => w.code === "probe-outside" && w.at?.[0] === p.at[0] && w.at?.[1] === p.at[1]))
      warnings.push({
        code: "probe-outside",
        message: `Probe ${pt(p.at)} is outside the outline${roof.holes.length ? " or in an opening" : ""}.`,
        at: p.at,
      });
  }
  if (ponding.length) {
    const total = ponding.reduce((sum, p) => sum + p.area, 0);
    warnings.push({
      code: "ponding",
      message: `${ponding.length} low point${ponding.length > 1 ? "s" : ""} away from any drain hold water (${total.toFixed(1)} m² drain to them).`,
      at: ponding[0].at,
    });
  }

  const out: Analysis["shaped"] = {
    ...shaped,
    highLevel: H,
    setOut: { ...shaped.setOut, outlets: outletsOnJoists.sort((a, b) => a.outlet - b.outlet) },
    edgeFalls,
    longestFallLine: longest,
    worstFallRatio: worst ? worst.ratio : null,
    worstFallLine: worst,
    fallLines,
    joists,
    fallMap: { faces, areaByBand: bands, flatterThanMinimumArea: flatArea, area: mapArea },
    catchments,
    ponding,
    probes,
    areas: parts.map(({ part, analysis, ownHighLevel }) => ({
      id: part.id,
      at: part.at,
      outline: part.outline,
      area: part.roof.area - part.roof.holeArea,
      joistDirection: analysis.shaped.joistDirection,
      outlets: part.roof.outlets.map((o) => o.index).sort((a, b) => a - b),
      highLevel: ownHighLevel,
    })),
  };
  delete out.mesh;
  delete out.meshBuffers;
  delete out.flowTraces;
  if (meshes.some((m) => m.mesh)) out.mesh = joinMeshes(meshes);
  if (meshes.some((m) => m.buffers)) out.meshBuffers = joinBuffers(meshes);
  if (anyTraces) out.flowTraces = traces;

  return {
    ...whole,
    shaped: out,
    comparison: {
      heightSaved: whole.gutter.highLevel === null ? null : whole.gutter.highLevel - H,
      flattestFall: { gutter: whole.comparison.flattestFall.gutter, shaped: worst ? worst.ratio : null },
    },
    advice: { minimumBaseFall: minBase, joistDirections: [] },
    warnings,
  };
}

const shift = (k: number | null, by: number) => (k === null ? null : k + by);
const pt = (p: [number, number]) => `(${p[0].toFixed(2)}, ${p[1].toFixed(2)})`;

function joinMeshes(meshes: { mesh: Mesh | undefined; drainOf: (d: number) => number }[]): Mesh {
  const list = meshes.flatMap((m) => (m.mesh ? [{ mesh: m.mesh, drainOf: m.drainOf }] : []));
  const size = (key: keyof Mesh) => list.reduce((s, m) => s + m.mesh[key].length, 0);
  // Filled before writing, so the arrays stay packed (see meshArrays).
  const out: Mesh = {
    positions: new Array<number>(size("positions")).fill(0),
    indices: new Array<number>(size("indices")).fill(0),
    faceRatio: new Array<number>(size("faceRatio")).fill(0),
    faceDrain: new Array<number>(size("faceDrain")).fill(0),
  };
  let v = 0,
    i = 0,
    f = 0;
  for (const { mesh, drainOf } of list) {
    for (let k = 0; k < mesh.positions.length; k++) out.positions[v + k] = mesh.positions[k];
    for (let k = 0; k < mesh.indices.length; k++) out.indices[i + k] = v / 3 + mesh.indices[k];
    for (let k = 0; k < mesh.faceRatio.length; k++) {
      out.faceRatio[f + k] = mesh.faceRatio[k];
      out.faceDrain[f + k] = drainOf(mesh.faceDrain[k]);
    }
    v += mesh.positions.length;
    i += mesh.indices.length;
    f += mesh.faceRatio.length;
  }
  return out;
}

function joinBuffers(meshes: { buffers: MeshBuffers | undefined; drainOf: (d: number) => number }[]): MeshBuffers {
  const list = meshes.flatMap((m) => (m.buffers ? [m] : []));
  const V = list.reduce((s, m) => s + m.buffers!.positions.length, 0);
  const I = list.reduce((s, m) => s + m.buffers!.indices.length, 0);
  const F = list.reduce((s, m) => s + m.buffers!.faceRatio.length, 0);
  const out: MeshBuffers = {
    positions: new Float64Array(V),
    indices: new Uint32Array(I),
    faceRatio: new Float64Array(F),
    faceDrain: new Int32Array(F),
  };
  let v = 0,
    i = 0,
    f = 0;
  for (const { buffers, drainOf } of list) {
    const b = buffers!;
    out.positions.set(b.positions, v);
    for (let k = 0; k < b.indices.length; k++) out.indices[i + k] = v / 3 + b.indices[k];
    out.faceRatio.set(b.faceRatio, f);
    for (let k = 0; k < b.faceDrain.length; k++) out.faceDrain[f + k] = drainOf(b.faceDrain[k]);
    v += b.positions.length;
    i += b.indices.length;
    f += b.faceRatio.length;
  }
  return out;
}
