/** Shapes the lesson pages receive from their loaders (safe for the browser: no answers, no reference roofs). */
import type { RoofSpec } from "../../engine";
import type { FindingKind } from "./as-built-task";
import type { CriterionKindId } from "./criteria";
import type { Figure } from "./schema";

/** A lesson figure, drawn from the engine's output on the server and sent as plain shapes. */
export interface FigureData {
  caption: string;
  view: Figure["view"];
  spec: RoofSpec;
  /** SVG user space: plan metres with y flipped (y down). */
  viewBox: string;
  unit: number;
  outline: string;
  edges: { d: string; eaves: boolean }[];
  outlets: [number, number][];
  /** Faces grouped by colour (fall map) or by catchment. */
  fills: { fill: string; d: string }[];
  /** Faces flatter than the minimum fall (hatched). */
  flat: string;
  /** When set, `fills` and `flat` are in grid cells: x, y of the grid's top-left in SVG space, cell size in metres. */
  grid: { x: number; y: number; cell: number } | null;
  longest: { d: string; label: string } | null;
  minRatio: number;
  key: { label: string; value: string }[];
  catchments: { label: string; area: number; flow: number; fill: string }[];
  intensity: number;
  schedule: { joist: number; length: number; startDrop: number; endDrop: number; ratio: string }[];
  compare: {
    shaped: number;
    gutter: number | null;
    openEdge: number;
    saved: number | null;
    reason: string | null;
    gutterLength: number;
    detailLength: number;
  } | null;
  error: string | null;
}

/** What the browser may see of a lesson: no answers, no explanations, no reference roof. */
export interface LessonView extends LessonSummary {
  objectives: string[];
  blocks: ({ type: "html"; html: string } | { type: "caution"; html: string } | { type: "roof"; figure: FigureData })[];
  quiz: {
    id: string;
    kind: "numeric" | "ratio" | "choice";
    promptHtml: string;
    /** Shown on request: the way to the answer, not the answer. */
    hintHtml: string;
    weight: number;
    options?: { id: string; html: string }[];
    multiple?: boolean;
    placeholder?: string;
  }[];
  task: RoofTaskView | AsBuiltTaskView;
}

/** A roof task: the roof to start from and what it is marked on. */
export interface RoofTaskView {
  kind: "roof";
  title: string;
  goalHtml: string;
  start: RoofSpec;
  editable: string[];
  criteria: { id: string; kind: CriterionKindId; limit: number; label: string; weight: number; required: boolean }[];
  hints: string[];
}

/** An as-built task: the design, the survey to read against it, and what to find (no answers). */
export interface AsBuiltTaskView {
  kind: "as-built";
  title: string;
  goalHtml: string;
  design: RoofSpec;
  /** The design's plan, drawn like a lesson figure. */
  figure: FigureData;
  /** Each point with its measured and design level (metres). */
  survey: { label: string; at: [number, number]; level: number; design: number }[];
  tolerance: { deviation: number; pondDepth: number };
  findings: {
    id: string;
    kind: FindingKind;
    label: string;
    weight: number;
    required: boolean;
    options?: { id: string; text: string }[];
    placeholder?: string;
  }[];
  hints: string[];
}

/** A lesson's line in the course list. */
export interface LessonSummary {
  slug: string;
  title: string;
  summary: string;
  minutes: number;
  position: number;
  version: string;
  questions: number;
  criteria: number;
  passMark: number;
}
