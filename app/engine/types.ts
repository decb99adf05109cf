import type { Fall } from "./fall";
import type { RuleSetId, UsedRule } from "./rule-sets";

/** A plan point in metres. */
export type Point = [number, number];
export type EdgeKind = "parapet" | "eaves";

/** The roof spec: the request body of POST /api/v1/analyses (docs/roof-method.md §1, §9). */
export interface RoofSpec {
  outline: Point[];
  /** One kind per edge, edge i running from vertex i to vertex i+1. Default: all parapet. */
  edges?: EdgeKind[];
  outlets: { at: Point; level?: number; size?: number }[];
  /** `1:40`, `2°`, `2.5%`, `25 mm/m`, or a number N meaning 1:N. */
  baseFall: string | number;
  highLevel?: number;
  /**
   * fromOutlets: set the first joist's offset so a joist lands on each outlet the spacing allows
   * (the given offset is then ignored); outlets it cannot serve get an "outlet-off-joist" warning.
   */
  joists?: { spacing?: number; direction?: Point; offset?: number; fromOutlets?: boolean };
  minFall?: string | number;
  gutter?: { width?: number; depth?: number; fall?: string | number };
  rainfall?: { intensity: number };
  probes?: Point[];
  ruleSet?: RuleSetId;
  /** Rooflights, hatches, plant bases: holes in the drained deck with an upstand round them (docs/roof-method-plans.md P2). */
  openings?: Opening[];
  /** Ridges dividing the roof into drainage areas, and crickets (docs/roof-method-plans.md P4, P5). */
  ridges?: Ridge[];
  /** Joist settings of the drainage area holding `at` (docs/roof-method-plans.md P4). */
  areas?: AreaSetting[];
}

export interface Ridge {
  line: Point[];
  /** "divide" (default): from wall to wall, level at H; "cricket": a diverting ridge on the deck (P5). */
  kind?: "divide" | "cricket";
}

export interface AreaSetting {
  at: Point;
  joists?: { spacing?: number; direction?: Point; offset?: number };
}

/** One drainage area of the answer (docs/roof-method-plans.md P4). */
export interface DrainageArea {
  id: number;
  /** A point inside it: the settings entry's own, else one found inside. */
  at: Point;
  /** Its outline in plan (request coordinates), counter-clockwise. */
  outline: Point[];
  /** Drained plan area: its outline's less its openings', m². */
  area: number;
  joistDirection: Point;
  /** Request indices of its outlets. */
  outlets: number[];
  /** Its own need: max over its drains of level + base fall × span (§3 on this area alone). */
  highLevel: number;
}

export type OpeningKind = "rooflight" | "hatch" | "plant" | "other";

export interface Opening {
  outline: Point[];
  kind?: OpeningKind;
  /** Upstand height in metres (default 0.15 m, common practice, no source). */
  upstand?: number;
}

export interface Warning {
  code:
    | "twist"
    | "level-joist"
    | "fall-line-too-flat"
    | "base-fall-below-rule"
    | "high-level-below-derived"
    | "ponding"
    | "probe-outside"
    | "mesh-coarsened"
    | "outlet-capacity"
    | "narrow-gutter"
    | "rainfall-assumed"
    | "outlet-parallel-to-joists"
    | "water-held-behind-upstand"
    | "outlet-off-joist";
  message: string;
  at?: Point;
  /** Size of the problem in metres where it has one (twist: level difference). */
  size?: number;
  /** outlet-parallel-to-joists: the outlet (request index) and the plan area it drains (m²). */
  outlet?: number;
  drainedArea?: number;
  /** Ways out, the first the one a client can apply in one click where it has a value. */
  fixes?: WarningFix[];
  /** water-held-behind-upstand: the plan area draining to the held water (m²), and the opening (request index). */
  area?: number;
  opening?: number;
  /** water-held-behind-upstand: the diverting ridge a builder sets there (docs/roof-method-plans.md P5). */
  cricket?: Cricket;
}

/** A cricket (saddle): its crest from the upstand up the fall, level at `crestLevel`. */
export interface Cricket {
  line: [Point, Point];
  crestLevel: number;
  length: number;
  /** Height of the crest above the deck at the upstand. */
  height: number;
}

export type WarningFix = { kind: "turn-joists"; direction: Point } | { kind: "move-outlet" } | { kind: "divide-roof" };

export interface EdgeFall {
  /** Edge index in the request's numbering. */
  edge: number;
  /** Low end of the rising piece. */
  from: Point;
  /** High end. */
  to: Point;
  ratio: number;
  fall: Fall;
}

export interface JoistSpan {
  start: Point;
  end: Point;
  length: number;
  startLevel: number;
  endLevel: number;
  /** Drop below the high level at each end: what a builder sets at the bearing. */
  startDrop: number;
  endDrop: number;
  /** Its own fall as 1:N (docs/roof-method.md §5); null when the span is level. */
  ratio: number | null;
}

export interface Joist {
  index: number;
  /** The drainage area it lies in (docs/roof-method-plans.md P4); 0 on a roof without ridges. */
  area: number;
  /** Across the roof from its extreme edge, metres. */
  offset: number;
  spans: JoistSpan[];
}

/** Where an outlet sits among the joists (docs/roof-method.md §5). */
export interface OutletJoist {
  /** Outlet index in the request's list. */
  outlet: number;
  at: Point;
  /** Joist number (from 1) landing on the outlet, or null when it falls between two. */
  joist: number | null;
  /** Joist numbers either side when no joist lands on it (null past the first or last). */
  between: [number | null, number | null] | null;
  /** Distance to the nearest joist line, metres (0 when one lands on it). */
  gap: number;
}

/** How the joists were set out. */
export interface JoistSetOut {
  spacing: number;
  /** First joist's offset from the extreme edge, metres (given, or found from the outlets). */
  offset: number;
  fromOutlets: boolean;
  outlets: OutletJoist[];
}

export interface FallLine {
  from: Point;
  to: Point;
  length: number;
  drop: number;
  drainLevel: number;
  ratio: number;
  fall: Fall;
  /** The path inside the outline, including both ends. */
  path: Point[];
  drain: string;
}

export interface Band {
  label: string;
  minRatio: number;
  /** null: open-ended (flatter than the last band edge, including level faces). */
  maxRatio: number | null;
  area: number;
}

export interface Catchment {
  /** "outlet-0", "eaves-3" (edge number in the request's numbering). */
  drain: string;
  kind: "outlet" | "eaves";
  index: number;
  label: string;
  area: number;
  /** Design flow in L/s: Q = i·A/3600 (ASCE 7-05 Commentary C8; rational method, C = 1). */
  flow: number;
  /** Outlets only: rough capacity in L/s at the assumed head (weir or orifice, the smaller). */
  capacity?: number;
}

export interface Mesh {
  /** x, y, z per vertex (plan metres, level metres). */
  positions: number[];
  /** Three vertex indices per face, counter-clockwise in plan. */
  indices: number[];
  /** Ratio N of each face's steepest fall; a level face has Infinity, which JSON writes as null. */
  faceRatio: (number | null)[];
  /** Index into `catchments` (or `catchments.length + k` for ponding pit k) per face. */
  faceDrain: number[];
}

/** The same mesh as typed arrays, for a Web Worker to transfer and a 3D view to upload as is. */
export interface MeshBuffers {
  positions: Float64Array;
  indices: Uint32Array;
  /** Ratio N per face; Infinity for a level face. */
  faceRatio: Float64Array;
  faceDrain: Int32Array;
}

export interface FlowTraces {
  /** x, y, z of every trace point, traces one after another (plan to 1 mm, level to 0.1 mm). */
  points: number[];
  /** Start of each trace in points (as a point index), plus one final entry. */
  starts: number[];
  /** Drain label each trace ends in ("pit-k" for ponding). */
  ends: string[];
}

/** One candidate joist direction with the figures it gives (docs/roof-method-plans.md P8). */
export interface JoistDirectionOption {
  /** Unit vector in plan, along the joists. */
  direction: Point;
  highLevel: number;
  /** Ratio N of the longest fall line; null when there is none. */
  longestFallRatio: number | null;
  /** Ratio N of the flattest fall line; null when there is none. */
  worstFallRatio: number | null;
  flatterThanMinimumArea: number;
  meetsMinimumFall: boolean;
  /** Request edges whose inward normal this is (empty for a direction of the user's own). */
  edges: number[];
  /** The direction this analysis used. */
  current: boolean;
  /** The one to choose: meets the minimum fall, then the lowest high level, then the least flat area. */
  best: boolean;
  /**
   * On a roof divided by ridges, the drainage area (`shaped.areas[].id`) the option is for: each
   * area has its own candidates and its own best (docs/roof-method-plans.md P8).
   */
  area?: number;
}

export interface Analysis {
  shaped: {
    highLevel: number;
    /** How the high level was found. */
    highLevelSource: "given" | "derived";
    joistDirection: Point;
    setOut: JoistSetOut;
    edgeFalls: EdgeFall[];
    longestFallLine: FallLine | null;
    worstFallRatio: number | null;
    worstFallLine: FallLine | null;
    fallLines: FallLine[];
    joists: Joist[];
    fallMap: {
      faces: number;
      areaByBand: Band[];
      flatterThanMinimumArea: number;
      area: number;
    };
    catchments: Catchment[];
    ponding: { at: Point; area: number; level: number }[];
    /** Each opening (request order) with its plan area; the drained area is the outline's less these. */
    openings: { index: number; kind: OpeningKind; upstand: number; area: number }[];
    probes: { at: Point; level: number | null }[];
    /** The drainage areas (docs/roof-method-plans.md P4): one, id 0, on a roof without ridges. */
    areas: DrainageArea[];
    /** The ridges drawn (request order) with their kind. */
    ridges: { index: number; kind: "divide" | "cricket"; line: Point[] }[];
    /** Present unless options.mesh is false or "typed". */
    mesh?: Mesh;
    /** Present when options.mesh is "typed". */
    meshBuffers?: MeshBuffers;
    flowTraces?: FlowTraces;
  };
  gutter: {
    comparable: boolean;
    reason?: string;
    highLevel: number | null;
    lipLevel: number | null;
    gutterLength: number;
    soleArea: number;
    detailLength: number;
    width: number;
    depth: number;
    fall: Fall;
    /** Outlets in a gutter narrower than the rule set's minimum (room for a clamped outlet). */
    narrowGutterOutlets: number[];
  };
  openEdge: { highLevel: number; edge: number; span: number };
  comparison: {
    heightSaved: number | null;
    /** Flattest fall on the water's path: gutter sole against the shaped roof's worst fall line. */
    flattestFall: { gutter: number | null; shaped: number | null };
  };
  advice: {
    minimumBaseFall: { ratio: number; degrees: number; percent: number } | null;
    extraOutlet?: { at: Point; edge: number; longestFallRatio: number; currentLongestFallRatio: number };
    /** Each candidate joist direction analysed (docs/roof-method-plans.md P8), the current one first. */
    joistDirections: JoistDirectionOption[];
  };
  warnings: Warning[];
  baseFall: Fall;
  minFall: Fall;
  rainfall: { intensity: number; assumed: boolean };
  ruleSet: { id: RuleSetId; name: string; used: UsedRule[] };
  area: number;
}
