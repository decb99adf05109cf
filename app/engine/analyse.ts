import { bestExtraOutlet, minimumBaseFall } from "./advice";
import { Arena } from "./arena";
import { CANDIDATE_MESH_VERTICES, joistDirectionAdvice, type CandidateFigures } from "./joist-directions";
import { dropSchedule, joistPositions } from "./joists";
import { edgeFalls } from "./edge-falls";
import { formatRatio } from "./fall";
import { fallLines } from "./fall-lines";
import { DEFAULT_BAND_EDGES, fallMap } from "./fall-map";
import { faceData } from "./faces";
import { routeWater } from "./flow";
import { Geodesic } from "./geodesic";
import { gutterLayout, openEdgeOption } from "./gutter";
import { drainSpans, highLevelFor } from "./high-level";
import { catchmentsOf } from "./catchments";
import { buildMesh } from "./mesh";
import { meshArrays, meshBuffers } from "./mesh-out";
import { outletParallelWarnings } from "./outlet-reach";
import { perimeterLevels } from "./perimeter";
import { heldWaterWarnings } from "./upstands";
import { prepareRoof } from "./prepare";
import { toFrame, toPlan, type Roof } from "./roof";
import { outletJoists, trimWarnings } from "./setout";
import { RULE_SETS, ruleValue } from "./rule-sets";
import { levelAt } from "./surface";
import { flowTraces } from "./traces";
import { twistWarnings } from "./twist";
import type { Analysis, FallLine, Point, RoofSpec, Warning } from "./types";
import { pointInside } from "./areas";
import { raiseCrickets } from "./crickets";
import { mergeAreas } from "./merge-areas";
import { drainName, outletName } from "./names";

export interface AnalyseOptions {
  /**
   * The mesh for the 3D view: true (default) as plain arrays in `shaped.mesh`, which serialise
   * to JSON; "typed" as typed arrays in `shaped.meshBuffers` (no copying, transferable); false: none.
   */
  mesh?: boolean | "typed";
  /** Include flow traces for the plan view (default true). */
  traces?: boolean;
  /** Fall map band edges as ratios N (default 40, 60, 80, 100). */
  bandEdges?: number[];
  /** Work bound for the mesh; above it the mesh is coarsened and a warning says so. */
  maxMeshVertices?: number;
}

/** Default work bound on mesh vertices (a 10,000 m² roof at 0.4 m joists needs about 63,000). */
export const MAX_MESH_VERTICES = 250_000;

/**
 * Work bound for a drag preview: the same method on a mesh of every k-th joist with a longer
 * station step, sized so the large bench roof (10,000 m²) analyses well inside one 16.7 ms frame.
 * The high level does not depend on the mesh; levels elsewhere agree with the full analysis to
 * within the tolerance tests/unit/engine/preview.test.ts states.
 */
export const PREVIEW_MESH_VERTICES = 8_000;

/**
 * Shapes and checks a parapet roof (docs/roof-method.md): the level-rim boundary, the high level,
 * the chord-rule surface, joists, mesh and fall map, water (catchments, ponding, fall lines),
 * advice, and the gutter and open-edge layouts to compare with. Expects a spec that passed
 * `parseSpec`; throws with the validation message otherwise.
 */
export function analyse(spec: RoofSpec, options: AnalyseOptions = {}): Analysis {
  const prepared = prepareRoof(spec);
  if (!prepared.ok) throw new Error(prepared.issues.map((i) => `${i.path}: ${i.message}`).join("; "));
  return analyseRoof(prepared.roof, options);
}

/**
 * About how many mesh stations an analysis of a one-area roof builds, whichever joist direction it
 * is shaped or compared in: `buildMesh`'s own estimate (joist and vertex lines × stations per
 * line) with the bounding box's diagonal for both extents. An analysis's work grows with it; the
 * API analyses roofs under a threshold on the request's own thread (app/lib/analysis-request.server.ts).
 * Multi-area roofs and crickets do more work per station and have no estimate here (Infinity).
 */
export function meshStationEstimate(roof: Roof): number {
  if (roof.parts.length || roof.crickets.length) return Infinity;
  const d = Math.hypot(roof.umax - roof.umin, roof.vmax - roof.vmin);
  const lines = roof.n + roof.holes.reduce((sum, h) => sum + h.us.length, 0);
  return (d / roof.spacing + 1 + lines) * (d / roof.spacing + 2);
}

// One analysis runs at a time on a thread; its mesh and routing arrays live here between runs.
const arena = new Arena();

/** The analysis of a roof already normalised and checked by `prepareRoof`. */
export function analyseRoof(roof: Roof, options: AnalyseOptions = {}): Analysis {
  if (arena.busy) return analyseWithAdvice(new Arena(), roof, options);
  try {
    return analyseWithAdvice(arena, roof, options);
  } finally {
    arena.release();
  }
}

/**
 * The analysis, then the other joist directions analysed in turn on the same memory (the answer
 * holds copies only, so the next reset cannot reach it), on a coarser mesh, without advice of
 * their own.
 */
function analyseWithAdvice(memory: Arena, roof: Roof, options: AnalyseOptions): Analysis {
  if (roof.parts.length) return analyseAreas(memory, roof, options);
  const analysis = analyseWith(memory, roof, options, false);
  const light: AnalyseOptions = {
    mesh: false,
    traces: false,
    bandEdges: options.bandEdges,
    maxMeshVertices: Math.min(options.maxMeshVertices ?? MAX_MESH_VERTICES, CANDIDATE_MESH_VERTICES),
  };
  analysis.advice.joistDirections = joistDirectionAdvice(roof, analysis, (turned) =>
    candidateWith(memory, turned, light),
  );
  return analysis;
}

/**
 * A roof divided by ridges (docs/roof-method-plans.md P4): H is the highest of the areas' own
 * needs (or the given level), each area is shaped on its own up to it, and the answers are put
 * together. The joist direction advice is given area by area (P8).
 */
function analyseAreas(memory: Arena, roof: Roof, options: AnalyseOptions): Analysis {
  const slope = 1 / roof.baseFall.ratio;
  const own = roof.parts.map((p) => highLevelFor(drainSpans(p.roof), slope));
  const H = roof.highLevelGiven ?? Math.max(...own);
  const parts = roof.parts.map((part, k) => ({
    part,
    analysis: analyseWith(memory, { ...part.roof, highLevelGiven: H }, options, true),
    ownHighLevel: own[k],
  }));
  const first = parts[0].analysis;
  const gutter = gutterLayout(roof);
  const warnings: Warning[] = [];
  if (gutter.comparable && gutter.narrowGutterOutlets.length) {
    warnings.push({
      code: "narrow-gutter",
      message: `In the gutter layout, a ${mm(gutter.width)} gutter is too narrow for a clamped outlet at outlet ${gutter.narrowGutterOutlets.map(outletName).join(", ")}.`,
    });
  }
  const whole: Analysis = {
    ...first,
    shaped: {
      ...first.shaped,
      highLevelSource: roof.highLevelGiven === null ? "derived" : "given",
      joistDirection: [roof.dx, roof.dy],
      setOut: { ...first.shaped.setOut, spacing: roof.spacing, fromOutlets: roof.fromOutlets },
      openings: roof.holes.map((h) => ({ index: h.index, kind: h.kind, upstand: h.upstand, area: h.area })),
      ridges: roof.ridges,
    },
    gutter,
    openEdge: openEdgeOption(roof),
    comparison: {
      heightSaved: null,
      flattestFall: { gutter: gutter.comparable ? gutter.fall.ratio : null, shaped: null },
    },
    warnings,
    area: roof.area,
  };
  const merged = mergeAreas(roof, whole, parts, H);
  merged.advice.joistDirections = areaJoistAdvice(memory, roof, parts, own, slope, options);
  return merged;
}

/**
 * Joist direction advice for each drainage area (docs/roof-method-plans.md P8): an area's
 * candidates are those of its own walls, each analysed on that area alone up to the H the whole
 * roof would then need (the given level, else the largest of this area's need along the candidate
 * and the other areas' own needs). The candidates share the undivided roof's work bound.
 */
function areaJoistAdvice(
  memory: Arena,
  roof: Roof,
  parts: { part: Roof["parts"][number]; analysis: Analysis }[],
  own: number[],
  slope: number,
  options: AnalyseOptions,
): Analysis["advice"]["joistDirections"] {
  const light: AnalyseOptions = {
    mesh: false,
    traces: false,
    bandEdges: options.bandEdges,
    maxMeshVertices: Math.max(
      1000,
      Math.floor(Math.min(options.maxMeshVertices ?? MAX_MESH_VERTICES, CANDIDATE_MESH_VERTICES) / parts.length),
    ),
  };
  return parts.flatMap(({ part, analysis }, k) => {
    const others = own.reduce((m, h, j) => (j === k ? m : Math.max(m, h)), -Infinity);
    const advice = joistDirectionAdvice(part.roof, analysis, (turned) => {
      const H = roof.highLevelGiven ?? Math.max(others, highLevelFor(drainSpans(turned), slope));
      return candidateWith(memory, { ...turned, highLevelGiven: H }, light);
    });
    return advice.map((o) => ({ ...o, area: part.id }));
  });
}

/**
 * The figures the joist direction advice compares for a candidate direction (high level, longest
 * and worst fall line, area flatter than the minimum): the same steps as `analyseWith` up to them,
 * without the drop schedule, catchments, warnings and other parts of an answer it never reads.
 */
function candidateWith(memory: Arena, roof: Roof, options: AnalyseOptions): CandidateFigures {
  memory.reset();
  const H = roof.highLevelGiven ?? highLevelFor(drainSpans(roof), 1 / roof.baseFall.ratio);
  const levels = perimeterLevels(roof, H);
  const joistU = joistPositions(roof);
  const mesh = buildMesh(roof, levels, joistU, { maxVertices: options.maxMeshVertices ?? MAX_MESH_VERTICES, memory });
  raiseCrickets(roof, levels, mesh);
  const routing = routeWater(roof, mesh, memory);
  const faces = faceData(mesh, routing.vertexDrain, routing.drains.length, memory);
  const { longest, worst } = longestAndWorst(fallLines(roof, levels, mesh, routing, new Geodesic(roof)));
  return {
    highLevel: H,
    longestFallRatio: longest ? longest.ratio : null,
    worstFallRatio: worst ? worst.ratio : null,
    flatterThanMinimumArea: fallMap(faces, roof.minFall.ratio, options.bandEdges ?? DEFAULT_BAND_EDGES)
      .flatterThanMinimumArea,
  };
}

function longestAndWorst(lines: FallLine[]): { longest: FallLine | null; worst: FallLine | null } {
  let longest: FallLine | null = null;
  let worst: FallLine | null = null;
  for (const l of lines) {
    if (!longest || l.length > longest.length) longest = l;
    if (!worst || l.ratio > worst.ratio) worst = l;
  }
  return { longest, worst };
}

function analyseWith(memory: Arena, roof: Roof, options: AnalyseOptions, candidate: boolean): Analysis {
  memory.reset();
  const warnings: Warning[] = [];
  const spans = drainSpans(roof);
  const slope = 1 / roof.baseFall.ratio;
  const derivedH = highLevelFor(spans, slope);
  const H = roof.highLevelGiven ?? derivedH;
  if (roof.highLevelGiven !== null && roof.highLevelGiven < derivedH - 1e-9) {
    warnings.push({
      code: "high-level-below-derived",
      message: `The given high level ${mm(H)} is below the ${mm(derivedH)} the base fall ${formatRatio(roof.baseFall.ratio)} needs, so some joists fall less than the base fall.`,
    });
  }
  const field = ruleValue(roof.ruleSet, "fieldFall");
  if (field && roof.baseFall.ratio > field.value * (1 + 1e-9)) {
    warnings.push({
      code: "base-fall-below-rule",
      message: `The base fall ${formatRatio(roof.baseFall.ratio)} is flatter than ${formatRatio(field.value)} (${cite(field)}).`,
    });
  }

  const levels = perimeterLevels(roof, H);
  const joistU = joistPositions(roof);
  const joists = dropSchedule(roof, levels, joistU);
  const onJoists = outletJoists(roof, joistU, (u, v) => toPlan(roof, u, v));
  warnings.push(...trimWarnings(onJoists, roof.fromOutlets));
  const sunk = joists.flatMap((j) =>
    j.spans.filter((s) => s.ratio === null && Math.max(s.startDrop, s.endDrop) > 1e-9),
  );
  if (sunk.length) {
    const s = sunk[Math.floor(sunk.length / 2)];
    warnings.push({
      code: "level-joist",
      message: `${sunk.length} joist span${sunk.length > 1 ? "s lie" : " lies"} level below the high level (${mm(s.startLevel)}), between two drains or low points: water stands along ${sunk.length > 1 ? "them" : "it"}. Stagger facing outlets or change the joist direction.`,
      at: [(s.start[0] + s.end[0]) / 2, (s.start[1] + s.end[1]) / 2],
    });
  }
  const mesh = buildMesh(roof, levels, joistU, { maxVertices: options.maxMeshVertices ?? MAX_MESH_VERTICES, memory });
  raiseCrickets(roof, levels, mesh);
  if (mesh.coarsened) {
    warnings.push({
      code: "mesh-coarsened",
      message: `The roof is large for its joist spacing: the fall map uses every ${mesh.stride} joist line and ${mm(mesh.step)} stations.`,
    });
  }
  const routing = routeWater(roof, mesh, memory);
  const faces = faceData(mesh, routing.vertexDrain, routing.drains.length, memory);
  const geodesic = new Geodesic(roof);

  const lines = fallLines(roof, levels, mesh, routing, geodesic);
  const { longest, worst } = longestAndWorst(lines);
  if (worst && worst.ratio > roof.minFall.ratio * (1 + 1e-9)) {
    warnings.push({
      code: "fall-line-too-flat",
      message: `The fall line from ${pt(worst.from)} to ${drainName(worst.drain)} falls at ${formatRatio(worst.ratio)}, flatter than the minimum ${formatRatio(roof.minFall.ratio)}.`,
      at: worst.from,
    });
  }

  const { catchments, ponding } = catchmentsOf(roof, mesh, routing, faces, warnings);
  warnings.push(...outletParallelWarnings(roof, levels, catchments));
  warnings.push(...heldWaterWarnings(roof, levels, mesh, routing, faces));
  if (ponding.length) {
    const total = ponding.reduce((s, p) => s + p.area, 0);
    warnings.push({
      code: "ponding",
      message: `${ponding.length} low point${ponding.length > 1 ? "s" : ""} away from any drain hold water (${total.toFixed(1)} m² drain to them).`,
      at: ponding[0].at,
    });
  }
  if (roof.rainfall.assumed) {
    warnings.push({
      code: "rainfall-assumed",
      message: `No rainfall intensity given: flows use ${roof.rainfall.intensity} mm/h, an assumption. Give the site's design intensity.`,
    });
  }

  const probes = roof.probes.map((p) => {
    const [u, v] = toFrame(roof, p[0], p[1]);
    const level = levelAt(roof, levels, u, v);
    if (level === null)
      warnings.push({
        code: "probe-outside",
        message: `Probe ${pt(p)} is outside the outline${roof.holes.length ? " or in an opening" : ""}.`,
        at: p,
      });
    return { at: p, level };
  });

  warnings.push(...twistWarnings(roof, levels, joistU));

  const gutter = gutterLayout(roof);
  if (gutter.comparable && gutter.narrowGutterOutlets.length) {
    warnings.push({
      code: "narrow-gutter",
      message: `In the gutter layout, a ${mm(gutter.width)} gutter is too narrow for a clamped outlet at outlet ${gutter.narrowGutterOutlets.map(outletName).join(", ")}.`,
    });
  }
  const openEdge = openEdgeOption(roof);
  const minBase = minimumBaseFall(spans, lines, roof.minFall.ratio);
  const extra = candidate ? undefined : bestExtraOutlet(roof, levels, spans, geodesic);

  const fallMapResult = fallMap(faces, roof.minFall.ratio, options.bandEdges ?? DEFAULT_BAND_EDGES);
  const shaped: Analysis["shaped"] = {
    highLevel: H,
    highLevelSource: roof.highLevelGiven === null ? "derived" : "given",
    joistDirection: [roof.dx, roof.dy],
    setOut: {
      spacing: roof.spacing,
      offset: joistU.length ? joistU[0] - roof.umin : 0,
      fromOutlets: roof.fromOutlets,
      outlets: onJoists,
    },
    edgeFalls: edgeFalls(roof, levels),
    longestFallLine: longest,
    worstFallRatio: worst ? worst.ratio : null,
    worstFallLine: worst,
    fallLines: lines,
    joists,
    fallMap: fallMapResult,
    catchments,
    ponding,
    openings: roof.holes.map((h) => ({ index: h.index, kind: h.kind, upstand: h.upstand, area: h.area })),
    probes,
    areas: [
      {
        id: 0,
        at: roof.parts.length ? roof.parts[0].at : pointInside(outlineOf(roof)),
        outline: outlineOf(roof),
        area: roof.area - roof.holeArea,
        joistDirection: [roof.dx, roof.dy],
        outlets: roof.outlets.map((o) => o.index).sort((a, b) => a - b),
        highLevel: derivedH,
      },
    ],
    ridges: roof.ridges,
  };
  if (options.mesh === "typed") shaped.meshBuffers = meshBuffers(roof, mesh, faces.slope2, faces.drain);
  else if (options.mesh !== false) shaped.mesh = meshArrays(roof, mesh, faces.slope2, faces.drain);
  if (options.traces !== false) shaped.flowTraces = flowTraces(roof, mesh, routing);

  return {
    shaped,
    gutter,
    openEdge,
    comparison: {
      heightSaved: gutter.highLevel === null ? null : gutter.highLevel - H,
      flattestFall: { gutter: gutter.comparable ? gutter.fall.ratio : null, shaped: worst ? worst.ratio : null },
    },
    advice: {
      minimumBaseFall: minBase ? { ratio: minBase.ratio, degrees: minBase.degrees, percent: minBase.percent } : null,
      ...(extra ? { extraOutlet: extra } : {}),
      joistDirections: [],
    },
    warnings,
    baseFall: roof.baseFall,
    minFall: roof.minFall,
    rainfall: roof.rainfall,
    ruleSet: { id: roof.ruleSet, name: RULE_SETS[roof.ruleSet].name, used: roof.used },
    area: roof.area,
  };
}

/** The outline in request coordinates, counter-clockwise. */
const outlineOf = (roof: Roof): Point[] => Array.from(roof.xs, (x, i): Point => [x + roof.ox, roof.ys[i] + roof.oy]);

const mm = (m: number) => `${Math.round(m * 1000)} mm`;
const pt = (p: [number, number]) => `(${p[0].toFixed(2)}, ${p[1].toFixed(2)})`;
const cite = (r: { document: string; clause: string | null }) => (r.clause ? `${r.document}, ${r.clause}` : r.document);
