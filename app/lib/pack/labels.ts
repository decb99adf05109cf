import type { Point } from "~/engine";

/** An axis-aligned box in plan units (y up). */
export interface Box {
  x0: number;
  y0: number;
  x1: number;
  y1: number;
}

export interface LabelRequest {
  /** Width and height of the text's box, in plan units. */
  width: number;
  height: number;
  /** Centres to try, best first (the first free one is taken). */
  candidates: Point[];
}

export interface PlacedLabel {
  box: Box;
  centre: Point;
  /** False when every candidate touched something and the least-bad one was taken. */
  clear: boolean;
}

const boxAt = (c: Point, w: number, h: number): Box => ({
  x0: c[0] - w / 2,
  y0: c[1] - h / 2,
  x1: c[0] + w / 2,
  y1: c[1] + h / 2,
});

export const boxesOverlap = (a: Box, b: Box) => a.x0 < b.x1 && b.x0 < a.x1 && a.y0 < b.y1 && b.y0 < a.y1;

/** Whether segment pq crosses or lies in the box (Liang–Barsky clipping). */
export function segmentHitsBox(p: Point, q: Point, b: Box): boolean {
  let t0 = 0;
  let t1 = 1;
  const dx = q[0] - p[0];
  const dy = q[1] - p[1];
  const edges: [number, number][] = [
    [-dx, p[0] - b.x0],
    [dx, b.x1 - p[0]],
    [-dy, p[1] - b.y0],
    [dy, b.y1 - p[1]],
  ];
  for (const [pp, qq] of edges) {
    if (pp === 0) {
      if (qq < 0) return false;
    } else {
      const r = qq / pp;
      if (pp < 0) t0 = Math.max(t0, r);
      else t1 = Math.min(t1, r);
      if (t0 > t1) return false;
    }
  }
  return true;
}

/**
 * Places labels one after another, each at its first candidate that touches neither a line nor
 * a label already placed (nor a keep-out box); when none is free, at the candidate touching
 * the fewest. Greedy, in the order given: put the labels that matter most first.
 */
export function placeLabels(
  requests: LabelRequest[],
  lines: [Point, Point][],
  keepOut: Box[] = [],
  pad = 0,
): PlacedLabel[] {
  const placed: Box[] = [...keepOut];
  return requests.map((r) => {
    let best: { box: Box; centre: Point; hits: number } | null = null;
    for (const c of r.candidates) {
      const box = boxAt(c, r.width + 2 * pad, r.height + 2 * pad);
      let hits = 0;
      for (const b of placed) if (boxesOverlap(box, b)) hits++;
      for (const [p, q] of lines) if (segmentHitsBox(p, q, box)) hits++;
      if (!best || hits < best.hits) best = { box, centre: c, hits };
      if (hits === 0) break;
    }
    if (!best) best = { box: boxAt([0, 0], r.width, r.height), centre: [0, 0], hits: 1 };
    placed.push(best.box);
    const box = boxAt(best.centre, r.width, r.height);
    return { box, centre: best.centre, clear: best.hits === 0 };
  });
}

/** Candidate centres in a ring around a point: 8 directions at each of the given distances, starting from `first` (radians). */
export function ringCandidates(at: Point, w: number, h: number, distances: number[], first = Math.PI / 4): Point[] {
  const out: Point[] = [];
  for (const d of distances) {
    for (let k = 0; k < 8; k++) {
      const a = first + (k * Math.PI) / 4;
      // Distance to the box's edge, not its centre: push out by half the box along the direction.
      const ox = Math.cos(a) * (d + w / 2);
      const oy = Math.sin(a) * (d + h / 2);
      out.push([at[0] + ox, at[1] + oy]);
    }
  }
  return out;
}
