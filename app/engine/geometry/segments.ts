/** Orientation of c against the line a→b: >0 left, <0 right, 0 on it. */
export function orient(ax: number, ay: number, bx: number, by: number, cx: number, cy: number): number {
  return (bx - ax) * (cy - ay) - (by - ay) * (cx - ax);
}

function onSegment(ax: number, ay: number, bx: number, by: number, px: number, py: number): boolean {
  return Math.min(ax, bx) <= px && px <= Math.max(ax, bx) && Math.min(ay, by) <= py && py <= Math.max(ay, by);
}

/** True when closed segments ab and cd share any point (touching counts). */
export function segmentsTouch(
  ax: number,
  ay: number,
  bx: number,
  by: number,
  cx: number,
  cy: number,
  dx: number,
  dy: number,
): boolean {
  const o1 = Math.sign(orient(ax, ay, bx, by, cx, cy));
  const o2 = Math.sign(orient(ax, ay, bx, by, dx, dy));
  const o3 = Math.sign(orient(cx, cy, dx, dy, ax, ay));
  const o4 = Math.sign(orient(cx, cy, dx, dy, bx, by));
  if (o1 * o2 < 0 && o3 * o4 < 0) return true;
  if (o1 === 0 && onSegment(ax, ay, bx, by, cx, cy)) return true;
  if (o2 === 0 && onSegment(ax, ay, bx, by, dx, dy)) return true;
  if (o3 === 0 && onSegment(cx, cy, dx, dy, ax, ay)) return true;
  if (o4 === 0 && onSegment(cx, cy, dx, dy, bx, by)) return true;
  return false;
}

/** Distance from p to segment ab and the parameter (0..1) of the nearest point. */
export function nearestOnSegment(
  ax: number,
  ay: number,
  bx: number,
  by: number,
  px: number,
  py: number,
): { distance: number; s: number; x: number; y: number } {
  const ex = bx - ax;
  const ey = by - ay;
  const len2 = ex * ex + ey * ey;
  let s = len2 > 0 ? ((px - ax) * ex + (py - ay) * ey) / len2 : 0;
  s = s < 0 ? 0 : s > 1 ? 1 : s;
  const x = ax + s * ex;
  const y = ay + s * ey;
  return { distance: Math.hypot(px - x, py - y), s, x, y };
}
