import type { Fall } from "./fall";
import type { RuleSetId, UsedRule } from "./rule-sets";
import type { Point } from "./types";

/** An outlet snapped onto its parapet edge, in the engine's local frame. */
export interface Outlet {
  /** Position in the request's outlet list. */
  index: number;
  x: number;
  y: number;
  u: number;
  v: number;
  /** Internal edge it sits on, and its distance along that edge. */
  edge: number;
  t: number;
  /** Internal vertex index for a corner outlet, else -1. */
  vertex: number;
  level: number;
  size: number;
  radius: number;
}

/**
 * A validated roof in the engine's frame: counter-clockwise outline about a local origin,
 * with joist-frame coordinates u (across the joists) and v (along them).
 */
export interface Roof {
  n: number;
  xs: Float64Array;
  ys: Float64Array;
  /** Local origin in request coordinates (mean of the vertices). */
  ox: number;
  oy: number;
  /** Internal edge/vertex → request edge/vertex. */
  userEdge: Int32Array;
  userVertex: Int32Array;
  /** 1 where the internal edge is an eaves (open) edge. */
  eaves: Uint8Array;
  len: Float64Array;
  area: number;
  perimeter: number;
  convex: boolean;
  reflex: Uint8Array;
  /** Joist direction (unit, plan). u = x·dy − y·dx, v = x·dx + y·dy. */
  dx: number;
  dy: number;
  us: Float64Array;
  vs: Float64Array;
  umin: number;
  umax: number;
  vmin: number;
  vmax: number;
  outlets: Outlet[];
  baseFall: Fall;
  minFall: Fall;
  gutter: { width: number; depth: number; fall: Fall };
  rainfall: { intensity: number; assumed: boolean };
  ruleSet: RuleSetId;
  used: UsedRule[];
  spacing: number;
  offset: number;
  /** The offset was found from the outlets (spec joists.fromOutlets). */
  fromOutlets: boolean;
  highLevelGiven: number | null;
  probes: Point[];
  /** Length tolerance for coincidence tests, scaled to the roof. */
  tol: number;
}

/** Local (u, v) → request plan coordinates. */
export function toPlan(roof: Roof, u: number, v: number): Point {
  return [roof.ox + u * roof.dy + v * roof.dx, roof.oy - u * roof.dx + v * roof.dy];
}

/** Request plan coordinates → local (u, v). */
export function toFrame(roof: Roof, x: number, y: number): [number, number] {
  const lx = x - roof.ox;
  const ly = y - roof.oy;
  return [lx * roof.dy - ly * roof.dx, lx * roof.dx + ly * roof.dy];
}
