import { fallFromRatio } from "./fall";
import { outletsOnEdge } from "./perimeter";
import type { Roof } from "./roof";
import { ruleValue } from "./rule-sets";
import type { Analysis } from "./types";

/** Inward unit normal of internal edge e (the outline is counter-clockwise) and its line offset. */
function edgeLine(roof: Roof, e: number): { nx: number; ny: number; c: number } {
  const q = (e + 1) % roof.n;
  const nx = -(roof.ys[q] - roof.ys[e]) / roof.len[e];
  const ny = (roof.xs[q] - roof.xs[e]) / roof.len[e];
  return { nx, ny, c: nx * roof.xs[e] + ny * roof.ys[e] };
}

/** Furthest distance of the outline from edge e's line, measured inward. */
function depthFrom(roof: Roof, e: number): number {
  const { nx, ny, c } = edgeLine(roof, e);
  let best = 0;
  for (let i = 0; i < roof.n; i++) best = Math.max(best, nx * roof.xs[i] + ny * roof.ys[i] - c);
  return best;
}

/**
 * The gutter-based layout for comparison (docs/roof-method.md §8): an internal gutter along each
 * outlet edge, its sole falling at the gutter fall to each outlet, a level lip at the highest
 * sole point plus the gutter depth, and a plane field falling at the base fall to the lip.
 * The field's span is the outline's depth from the gutter line less the gutter width (the chord
 * through the outlet on a rectangle); with gutters on two facing edges the field ridges half-way.
 * detailLength counts what the gutter adds to the membrane: per gutter the sole-to-side corner and
 * the lip (2 × length) and, at each end, the sole's width and the side's height against the end
 * wall. The sole-to-parapet corner is not counted: the shaped roof meets that parapet too.
 */
export function gutterLayout(roof: Roof): Analysis["gutter"] {
  const { width, depth, fall } = roof.gutter;
  const base = {
    comparable: false,
    highLevel: null,
    lipLevel: null,
    gutterLength: 0,
    soleArea: 0,
    detailLength: 0,
    width,
    depth,
    fall,
    narrowGutterOutlets: [] as number[],
  };
  const edges = [...new Set(roof.outlets.map((o) => o.edge))].sort((a, b) => a - b);
  if (edges.length === 0)
    return { ...base, reason: "There are no outlets: the roof drains to its eaves, so there is no gutter to compare." };

  const lines = edges.map((e) => edgeLine(roof, e));
  const first = lines[0];
  const sameLine = (l: typeof first) => l.nx * first.nx + l.ny * first.ny > 1 - 1e-9 && Math.abs(l.c - first.c) <= 1e-3;
  const facing = (l: typeof first) => l.nx * first.nx + l.ny * first.ny < -1 + 1e-9;
  let fieldSpan: number;
  if (lines.every(sameLine)) {
    fieldSpan = depthFrom(roof, edges[0]) - width;
  } else if (lines.every((l) => sameLine(l) || facing(l))) {
    const other = lines.find(facing)!;
    if (!lines.every((l) => sameLine(l) || (facing(l) && Math.abs(l.c - other.c) <= 1e-3))) {
      return { ...base, reason: "The outlet edges lie on more than two lines: one gutter layout cannot serve them." };
    }
    // Facing gutters: n2 = -n1, so the lines are n1·p = c1 and n1·p = -c2.
    fieldSpan = Math.abs(-other.c - first.c) / 2 - width;
  } else {
    return {
      ...base,
      reason: "The outlets are on edges that are not parallel, so a simple gutter layout cannot be built.",
    };
  }

  let highestSole = -Infinity;
  let gutterLength = 0;
  const ends: number[] = [];
  const gutterSlope = 1 / fall.ratio;
  for (const e of edges) {
    const on = outletsOnEdge(roof, e);
    const L = roof.len[e];
    gutterLength += L;
    // Sole level at the edge's two ends, and the highest point of each rising piece.
    ends.push(on[0][1] + on[0][0] * gutterSlope, on[on.length - 1][1] + (L - on[on.length - 1][0]) * gutterSlope);
    highestSole = Math.max(highestSole, ...ends.slice(-2));
    for (let k = 1; k < on.length; k++) {
      const half = (on[k][0] - on[k - 1][0]) / 2;
      highestSole = Math.max(highestSole, on[k - 1][1] + half * gutterSlope, on[k][1] + half * gutterSlope);
    }
  }
  const lipLevel = highestSole + depth;
  const highLevel = lipLevel + Math.max(0, fieldSpan) / roof.baseFall.ratio;
  let detailLength = 2 * gutterLength;
  for (const sole of ends) detailLength += width + (lipLevel - sole);
  const minWidth = ruleValue(roof.ruleSet, "gutterWidth")?.value ?? 0;
  const narrow = roof.outlets.filter((o) => width < minWidth || width < o.size).map((o) => o.index);
  return {
    ...base,
    comparable: true,
    highLevel,
    lipLevel,
    gutterLength,
    soleArea: gutterLength * width,
    detailLength,
    narrowGutterOutlets: narrow,
    fall: fallFromRatio(fall.ratio),
  };
}

/**
 * The option to weigh first (docs/roof-method.md §8): the whole roof as one plane falling at the base
 * fall to an open edge, here the edge of the first outlet (else the first eaves edge).
 */
export function openEdgeOption(roof: Roof): Analysis["openEdge"] {
  let e = roof.outlets.length ? roof.outlets[0].edge : -1;
  if (e < 0) {
    for (let j = 0; j < roof.n; j++) if (roof.eaves[j] && (e < 0 || roof.userEdge[j] < roof.userEdge[e])) e = j;
  }
  const span = depthFrom(roof, e);
  return { highLevel: span / roof.baseFall.ratio, edge: roof.userEdge[e], span };
}
