import type { AsBuiltResult, Point } from "~/engine";

/**
 * What the check page and the PDF draw of an as-built check, from the stored result: the
 * triangles with their design and built falls, the outline, the measured points and the ponds.
 * One source for both, so the printed plan is the screen's.
 */
export interface CheckDrawing {
  box: { x: number; y: number; w: number; h: number };
  outline: Point[];
  triangles: { corners: [Point, Point, Point]; designRatio: number | null; builtRatio: number | null }[];
  points: { at: Point; label?: string; design: number; measured: number; delta: number }[];
  ponds: { at: Point; area: number; depth: number }[];
  tolerance: number;
}

/** Fall 1:N of the plane through three (x, y, z) points; null when level. */
function ratioOf(p: [number, number, number][]): number | null {
  const [a, b, c] = p;
  const dx1 = b[0] - a[0],
    dy1 = b[1] - a[1],
    dz1 = b[2] - a[2];
  const dx2 = c[0] - a[0],
    dy2 = c[1] - a[1],
    dz2 = c[2] - a[2];
  const cross = dx1 * dy2 - dx2 * dy1;
  if (cross === 0) return null;
  const gx = (dz1 * dy2 - dz2 * dy1) / cross;
  const gy = (dx1 * dz2 - dx2 * dz1) / cross;
  const g = Math.hypot(gx, gy);
  return g > 0 ? 1 / g : null;
}

export function checkDrawing(outline: Point[], result: AsBuiltResult): CheckDrawing {
  const { xs, ys, zs, triangles } = result.mesh;
  const n = result.deviations.length;
  // The design's levels on the same nodes, as the engine gives them (checks saved before it did:
  // the measured points' design levels; the corners and outlets carry theirs).
  const designZ =
    (result.mesh as { design?: number[] }).design ?? zs.map((z, i) => (i < n ? result.deviations[i].design : z));
  const tris: CheckDrawing["triangles"] = [];
  for (let t = 0; t + 2 < triangles.length; t += 3) {
    const v = [triangles[t], triangles[t + 1], triangles[t + 2]];
    tris.push({
      corners: v.map((i) => [xs[i], ys[i]]) as [Point, Point, Point],
      designRatio: ratioOf(v.map((i) => [xs[i], ys[i], designZ[i]])),
      builtRatio: ratioOf(v.map((i) => [xs[i], ys[i], zs[i]])),
    });
  }
  const allX = outline.map((p) => p[0]),
    allY = outline.map((p) => p[1]);
  const x = Math.min(...allX),
    y = Math.min(...allY);
  return {
    box: { x, y, w: Math.max(...allX) - x || 1, h: Math.max(...allY) - y || 1 },
    outline,
    triangles: tris,
    points: result.deviations.map((d) => ({
      at: d.at,
      ...(d.label ? { label: d.label } : {}),
      design: d.design,
      measured: d.measured,
      delta: d.delta,
    })),
    ponds: result.surface.ponds.map((p) => ({ at: p.at, area: p.area, depth: p.depth })),
    tolerance: result.tolerance.deviation,
  };
}

/** Deviation colour: blue when low past the tolerance, red when high, grey inside it. */
export function deviationColour(delta: number, tolerance: number): string {
  if (delta < -tolerance - 1e-9) return "rgb(37 99 235)";
  if (delta > tolerance + 1e-9) return "rgb(220 38 38)";
  return "rgb(203 213 225)";
}
