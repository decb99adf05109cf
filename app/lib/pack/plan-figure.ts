import { pointsSignedArea, type EdgeKind, type Point } from "~/engine";
import { openingsOf, ridgesOf } from "./extras";
import { mmOf, type PackRoof } from "./facts";
import { placeLabels, ringCandidates, type Box } from "./labels";

/**
 * The check sheet's plan, worked out once for both the page (SVG) and the PDF: lines, outlets
 * and labels in plan metres (y up), the labels placed by a collision pass so that none sits on
 * a wall, the fall line, an outlet or another label.
 */
export interface PlanFigure {
  bounds: { minX: number; minY: number; maxX: number; maxY: number };
  /** Drawing unit: a sixtieth of the roof's larger side (line widths and text sizes scale with it). */
  u: number;
  edges: { from: Point; to: Point; kind: EdgeKind }[];
  joists: [Point, Point][];
  fallLine: Point[] | null;
  openings: Point[][];
  ridges: Point[][];
  outlets: { at: Point; r: number }[];
  corners: Point[];
  labels: PlanLabel[];
  /** The lines labels keep off (walls, fall line, openings, ridges, outlet marks as boxes' edges). */
  obstacles: [Point, Point][];
  scale: { at: Point; length: number };
}

export interface PlanLabel {
  text: string;
  kind: "edge" | "corner" | "outlet";
  size: number;
  centre: Point;
  box: Box;
  clear: boolean;
}

/** Width of a text at a size, in the same units as the size (each renderer measures its own font). */
export type Measure = (text: string, size: number) => number;

const segmentsOf = (path: Point[], closed: boolean): [Point, Point][] => {
  const out: [Point, Point][] = [];
  for (let i = 0; i + 1 < path.length; i++) out.push([path[i], path[i + 1]]);
  if (closed && path.length > 2) out.push([path[path.length - 1], path[0]]);
  return out;
};

export function planLabels(
  p: PackRoof,
  measure: Measure,
  levelAt: (x: number, y: number) => number | null = () => null,
): PlanFigure {
  const { spec, analysis } = p;
  const outline = spec.outline;
  const n = outline.length;
  const xs = outline.map((q) => q[0]);
  const ys = outline.map((q) => q[1]);
  const bounds = { minX: Math.min(...xs), minY: Math.min(...ys), maxX: Math.max(...xs), maxY: Math.max(...ys) };
  const span = Math.max(bounds.maxX - bounds.minX, bounds.maxY - bounds.minY, 1);
  const u = span / 60;
  const kinds: EdgeKind[] = outline.map((_, i) => spec.edges?.[i] ?? "parapet");
  const out = pointsSignedArea(outline) > 0 ? 1 : -1;
  const edges = outline.map((a, i) => ({ from: a, to: outline[(i + 1) % n], kind: kinds[i] }));
  const joists = analysis.shaped.joists.flatMap((j) => j.spans.map((s) => [s.start, s.end] as [Point, Point]));
  const line = analysis.shaped.longestFallLine;
  const fallLine = line ? (line.path.length >= 2 ? line.path : [line.from, line.to]) : null;
  const openings = openingsOf(spec);
  const ridges = ridgesOf(spec, analysis);
  const outlets = spec.outlets.map((o) => ({ at: o.at, r: u * 0.9 }));

  const obstacles: [Point, Point][] = [
    ...edges.map((e) => [e.from, e.to] as [Point, Point]),
    ...(fallLine ? segmentsOf(fallLine, false) : []),
    ...openings.flatMap((o) => segmentsOf(o, true)),
    ...ridges.flatMap((r) => segmentsOf(r, false)),
  ];
  // Outlet marks and corner dots as boxes labels keep off.
  const keepOut: Box[] = [
    ...outlets.map((o) => ({ x0: o.at[0] - o.r, y0: o.at[1] - o.r, x1: o.at[0] + o.r, y1: o.at[1] + o.r })),
    ...outline.map((c) => ({ x0: c[0] - u * 0.35, y0: c[1] - u * 0.35, x1: c[0] + u * 0.35, y1: c[1] + u * 0.35 })),
  ];
  // Inside the outline labels would sit on the joists: keep them outside, in this order of importance.
  const requests: {
    text: string;
    kind: PlanLabel["kind"];
    size: number;
    width: number;
    height: number;
    candidates: Point[];
  }[] = [];
  spec.outlets.forEach((o, k) => {
    const size = u * 1.5;
    const text = `O${k + 1} · ${mmOf(o.level ?? 0)}`;
    const w = measure(text, size);
    const h = size * 1.2;
    requests.push({
      text,
      kind: "outlet",
      size,
      width: w,
      height: h,
      candidates: ringCandidates(o.at, w, h, [u * 1.2, u * 2.6, u * 4.5], Math.PI / 4),
    });
  });
  outline.forEach((c, i) => {
    const z = levelAt(c[0], c[1]);
    if (z == null) return;
    const size = u * 1.4;
    const text = String(mmOf(z));
    const w = measure(text, size);
    const h = size * 1.2;
    // Start from the outward bisector of the corner.
    const prev = outline[(i + n - 1) % n];
    const next = outline[(i + 1) % n];
    const a1 = Math.atan2(c[1] - prev[1], c[0] - prev[0]);
    const a2 = Math.atan2(next[1] - c[1], next[0] - c[0]);
    const bis = Math.atan2(Math.sin(a1) - Math.sin(a2), Math.cos(a1) - Math.cos(a2));
    requests.push({
      text,
      kind: "corner",
      size,
      width: w,
      height: h,
      candidates: ringCandidates(c, w, h, [u * 0.8, u * 2, u * 3.5], bis),
    });
  });
  edges.forEach((e) => {
    const len = Math.hypot(e.to[0] - e.from[0], e.to[1] - e.from[1]);
    if (len < u) return;
    const size = u * 1.4;
    const text = `${len.toFixed(2)} m${e.kind === "eaves" ? " eaves" : ""}`;
    const w = measure(text, size);
    const h = size * 1.2;
    const nx = (out * (e.to[1] - e.from[1])) / len;
    const ny = (-out * (e.to[0] - e.from[0])) / len;
    const tx = (e.to[0] - e.from[0]) / len;
    const ty = (e.to[1] - e.from[1]) / len;
    // Outward from the midpoint, clear of the wall by the box's half-extent along the normal.
    const reach = Math.abs(nx) * (w / 2) + Math.abs(ny) * (h / 2);
    const candidates: Point[] = [];
    for (const d of [u * 0.8, u * 2.2, u * 3.6]) {
      for (const along of [0, 0.25, -0.25, 0.4, -0.4]) {
        candidates.push([
          (e.from[0] + e.to[0]) / 2 + tx * along * len + nx * (reach + d),
          (e.from[1] + e.to[1]) / 2 + ty * along * len + ny * (reach + d),
        ]);
      }
    }
    requests.push({ text, kind: "edge", size, width: w, height: h, candidates });
  });
  // The scale bar sits under the plan; keep labels off it.
  const scaleLength = [1, 2, 5, 10, 20, 50, 100].find((s) => s >= span / 5) ?? 100;
  const scaleAt: Point = [bounds.minX, bounds.minY - span * 0.14 * 0.55 - u * 6];
  keepOut.push({
    x0: scaleAt[0] - u,
    y0: scaleAt[1] - u * 1.5,
    x1: scaleAt[0] + scaleLength + u * 6,
    y1: scaleAt[1] + u * 1.5,
  });
  const placed = placeLabels(requests, obstacles, keepOut, u * 0.15);
  const labels = placed.map((pl, i) => ({
    text: requests[i].text,
    kind: requests[i].kind,
    size: requests[i].size,
    ...pl,
  }));
  return {
    bounds,
    u,
    edges,
    joists,
    fallLine,
    openings,
    ridges,
    outlets,
    corners: outline,
    labels,
    obstacles,
    scale: { at: scaleAt, length: scaleLength },
  };
}

/** The plan's extent with its labels and scale bar, padded, for a view box. */
export function figureExtent(f: PlanFigure): { minX: number; minY: number; maxX: number; maxY: number } {
  let { minX, minY, maxX, maxY } = f.bounds;
  for (const l of f.labels) {
    minX = Math.min(minX, l.box.x0);
    minY = Math.min(minY, l.box.y0);
    maxX = Math.max(maxX, l.box.x1);
    maxY = Math.max(maxY, l.box.y1);
  }
  minY = Math.min(minY, f.scale.at[1] - f.u * 2);
  maxX = Math.max(maxX, f.scale.at[0] + f.scale.length + f.u * 6);
  const pad = f.u * 1.5;
  return { minX: minX - pad, minY: minY - pad, maxX: maxX + pad, maxY: maxY + pad };
}
