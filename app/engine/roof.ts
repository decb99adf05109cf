import type { Fall } from "./fall";
import type { RuleSetId, UsedRule } from "./rule-sets";
import type { Point } from "./types";
import { strictlyInside } from "./geometry/inside";

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

/** An opening (a hole with an upstand) in the engine's frame: local plan and joist-frame vertices. */
export interface Hole {
  /** Position in the request's openings list. */
  index: number;
  kind: "rooflight" | "hatch" | "plant" | "other";
  upstand: number;
  xs: Float64Array;
  ys: Float64Array;
  us: Float64Array;
  vs: Float64Array;
  area: number;
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
  /** Openings, strictly inside the outline and apart from each other (docs/roof-method-plans.md P2). */
  holes: Hole[];
  /** Their total plan area. */
  holeArea: number;
  /** Length tolerance for coincidence tests, scaled to the roof. */
  tol: number;
  /** The drainage areas when ridges divide the roof (docs/roof-method-plans.md P4); empty otherwise. */
  parts: AreaPart[];
  /** Crickets on the deck (P5), in the local plan frame (x, y about the origin). */
  crickets: CricketLine[];
  /** Every ridge as drawn, in request order and coordinates. */
  ridges: { index: number; kind: "divide" | "cricket"; line: Point[] }[];
}

/** A drainage area: its own roof, shaped on its own (docs/roof-method-plans.md P4). */
export interface AreaPart {
  id: number;
  /** A point inside it (the settings entry's own when one names it). */
  at: Point;
  /** Counter-clockwise outline, request coordinates. */
  outline: Point[];
  /** Its roof: outlets, openings and eaves edges keep their request numbers. */
  roof: Roof;
  /** Request indices of the probes it answers. */
  probes: number[];
}

/** A cricket's crest from the upstand (x0, y0) up the fall to (x1, y1), local plan frame. */
export interface CricketLine {
  index: number;
  x0: number;
  y0: number;
  x1: number;
  y1: number;
}

/** The opening holding frame point (u, v) strictly inside it, or -1 (its boundary is deck). */
export function holeAt(roof: Roof, u: number, v: number): number {
  const tol = roof.tol * 1000;
  for (let h = 0; h < roof.holes.length; h++)
    if (strictlyInside(roof.holes[h].us, roof.holes[h].vs, u, v, tol)) return h;
  return -1;
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
