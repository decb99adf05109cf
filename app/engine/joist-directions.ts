import { outletsOnEdge } from "./perimeter";
import { withJoistDirection } from "./prepare";
import type { Roof } from "./roof";
import type { Analysis, JoistDirectionOption, Point } from "./types";

/** Work bound on the mesh of each other candidate's analysis (vertices): its figures are a guide. */
export const CANDIDATE_MESH_VERTICES = 30_000;

/** Directions closer than this (1 − |cos|) are one candidate; a direction and its opposite give the same joist lines. */
const SAME = 1e-9;

/** What the advice reads of a candidate direction's analysis. */
export interface CandidateFigures {
  highLevel: number;
  longestFallRatio: number | null;
  worstFallRatio: number | null;
  flatterThanMinimumArea: number;
}

/** The figures the advice reads, from a full analysis (the roof's own direction). */
export function candidateFigures(a: Analysis): CandidateFigures {
  return {
    highLevel: a.shaped.highLevel,
    longestFallRatio: a.shaped.longestFallLine ? a.shaped.longestFallLine.ratio : null,
    worstFallRatio: a.shaped.worstFallRatio,
    flatterThanMinimumArea: a.shaped.fallMap.flatterThanMinimumArea,
  };
}

/**
 * Joist direction advice (docs/roof-method-plans.md P8): the inward normal of every edge that
 * holds an outlet or is eaves, and the roof's own direction, each analysed and listed side by
 * side; the best is flagged. `analyseWith` analyses the roof re-framed along a candidate, as far
 * as the figures compared here.
 */
export function joistDirectionAdvice(
  roof: Roof,
  current: Analysis,
  analyseWith: (candidate: Roof) => CandidateFigures,
): JoistDirectionOption[] {
  const options: { dx: number; dy: number; edges: number[] }[] = [{ dx: roof.dx, dy: roof.dy, edges: [] }];
  const { n, xs, ys, len } = roof;
  const byRequest = [...Array(n).keys()].sort((a, b) => roof.userEdge[a] - roof.userEdge[b]);
  for (const j of byRequest) {
    if (!roof.eaves[j] && outletsOnEdge(roof, j).length === 0) continue;
    const q = (j + 1) % n;
    // Counter-clockwise outline: the inward normal is the edge turned left.
    const dx = -(ys[q] - ys[j]) / len[j] + 0;
    const dy = (xs[q] - xs[j]) / len[j] + 0;
    const same = options.find((o) => 1 - Math.abs(o.dx * dx + o.dy * dy) <= SAME);
    if (same) same.edges.push(roof.userEdge[j]);
    else options.push({ dx, dy, edges: [roof.userEdge[j]] });
  }
  const out: JoistDirectionOption[] = [];
  for (let k = 0; k < options.length; k++) {
    const o = options[k];
    let a: CandidateFigures;
    if (k > 0) {
      const turned = withJoistDirection(roof, o.dx, o.dy);
      if (!turned) continue;
      a = analyseWith(turned);
    } else a = candidateFigures(current);
    const worst = a.worstFallRatio;
    const direction: Point = [o.dx, o.dy];
    out.push({
      direction,
      highLevel: a.highLevel,
      longestFallRatio: a.longestFallRatio,
      worstFallRatio: worst,
      flatterThanMinimumArea: a.flatterThanMinimumArea,
      meetsMinimumFall: worst === null || worst <= roof.minFall.ratio * (1 + 1e-9),
      edges: o.edges.sort((p, q) => p - q),
      current: k === 0,
      best: false,
    });
  }
  // Best: meets the minimum fall, then the lowest high level, then the least flat area; the
  // current direction wins ties, so the advice never asks for a change that gains nothing.
  let best = 0;
  const better = (p: JoistDirectionOption, q: JoistDirectionOption) => {
    if (p.meetsMinimumFall !== q.meetsMinimumFall) return p.meetsMinimumFall;
    const dh = p.highLevel - q.highLevel;
    if (Math.abs(dh) > 1e-6) return dh < 0;
    return p.flatterThanMinimumArea < q.flatterThanMinimumArea - 1e-6 * roof.area - 1e-9;
  };
  for (let k = 1; k < out.length; k++) if (better(out[k], out[best])) best = k;
  if (out.length) out[best].best = true;
  return out;
}
