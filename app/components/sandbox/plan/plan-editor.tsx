import { useEffect, useId, useRef, useState, type KeyboardEvent, type PointerEvent } from "react";
import { PLAN_SHORTCUTS, shortcutSentence, UNDO_SHORTCUTS } from "~/lib/shortcuts";
import { Lock, Maximize2, SquareDashed, Spline, ZoomIn, ZoomOut } from "lucide-react";
import type { Point, RoofSpec } from "~/engine";
// The geometry module itself, not `~/engine`: the engine's face brings mathjs onto the page.
import { pointsSignedArea } from "~/engine/geometry/area";
import { PlanGrid } from "./plan-grid";
import { PlanOverlays } from "./plan-overlays";
import { DrawPreview, PlanFeatures } from "./plan-features";
import { usePlanFrame } from "./plan-frame";
import { snapFree, snapOnSegment, snapOnWalls, snapVertex, type SnapOptions } from "./snap";
import {
  addOpeningRect,
  addOutlet,
  addRidge,
  deleteOpening,
  deleteOutlet,
  deleteRidge,
  deleteRidgePoint,
  deleteVertex,
  edgeEnds,
  edgeKindsOf,
  insertRidgePoint,
  insertVertex,
  moveOpening,
  moveOpeningCorner,
  moveVertex,
  nudgeOutlet,
  placeOpening,
  placeOutlet,
  projectOnSegment,
  setEdgeKind,
  setRidgePoint,
} from "../state/spec-edit";
import { useSandbox, useSandboxStore } from "../state/store";
import type { Underlay } from "./underlay";
import { useFormat } from "../format";
import { usePointerWords } from "~/components/use-pointer-words";

type Drag =
  | { kind: "vertex"; index: number }
  | { kind: "outlet"; index: number }
  /** An opening's body: it moves by the pointer's travel from `from`, starting from `outline`. */
  | { kind: "opening"; index: number; from: Point; outline: Point[] }
  | { kind: "opening-corner"; index: number; sub: number }
  | { kind: "ridge-point"; index: number; sub: number };
/** A handle on the plan: `sub` is the corner of an opening or the point of a ridge. */
type Focus = {
  kind: "vertex" | "outlet" | "edge" | "opening" | "opening-corner" | "ridge-point";
  index: number;
  sub?: number;
};
/** What a press on the plan does: edit what is there, or draw a new ridge or opening. */
type Tool = "select" | "ridge" | "opening";

const handleId = (f: Focus) => (f.sub == null ? `${f.kind}-${f.index}` : `${f.kind}-${f.index}-${f.sub}`);
const isOutlineHandle = (f: Focus): f is { kind: "vertex" | "outlet" | "edge"; index: number } =>
  f.kind === "vertex" || f.kind === "outlet" || f.kind === "edge";

const ARROWS: Record<string, Point> = { ArrowLeft: [-1, 0], ArrowRight: [1, 0], ArrowUp: [0, 1], ArrowDown: [0, -1] };

/** Half the side of a handle's touch area, in screen px: 44 × 44 CSS px (WCAG 2.2 2.5.8 asks 24; platforms ask 44). */
export const HIT = 22;
const MIN_ZOOM = 0.5;
const MAX_ZOOM = 20;

/** Zoomed in or out of the fitted plan: `k` times, centred on (cx, cy) in SVG coordinates. */
type Zoom = { k: number; cx: number; cy: number };
type Gesture = {
  /** Pointers down on the plan's background (not on a handle), by id, in client px. */
  pointers: Map<number, { x: number; y: number }>;
  start: { zoom: Zoom; box: Box; pointers: Map<number, { x: number; y: number }> } | null;
  moved: boolean;
};
type Box = { x: number; y: number; w: number; h: number };

/**
 * The plan: draw and edit the outline over a drafting grid. Drag vertices (snapping to the grid and
 * to right angles), double-click an edge to add a vertex, click an edge to place an outlet and drag
 * it along. Every handle takes focus and the same edits from the keyboard.
 */
export function PlanEditor({ underlay }: { underlay?: Underlay }) {
  const store = useSandboxStore();
  const spec = useSandbox((s) => s.spec);
  const selection = useSandbox((s) => s.selection);
  const readOnly = useSandbox((s) => s.readOnly);
  const view = useSandbox((s) => s.view);
  const hasError = useSandbox((s) => s.engineError !== null);
  const dragging = useSandbox((s) => s.gesture !== null);
  const { metres: len_, mm: level_ } = useFormat();
  const { click, Click } = usePointerWords();
  const helpId = useId();
  const svgRef = useRef<SVGSVGElement>(null);
  const drag = useRef<Drag | null>(null);
  const clickTimer = useRef<number | undefined>(undefined);
  const pendingFocus = useRef<Focus | null>(null);
  const [size, setSize] = useState({ w: 480, h: 360 });
  const [fit, setFit] = useState(0);
  const [zoom, setZoom] = useState<Zoom | null>(null);
  const gesture = useRef<Gesture>({ pointers: new Map(), start: null, moved: false });
  const [cursor, setCursor] = useState<Point | null>(null);
  const locks = useSandbox((s) => s.locks);
  const outlineLocked = !!locks?.parts.includes("outline");
  const outletsLocked = !!locks?.parts.includes("outlets");
  /** A tap on a crowded spot: the handles under it, to choose from. */
  const [choice, setChoice] = useState<{ left: number; top: number; items: Focus[] } | null>(null);
  const pressed = useRef<{ x: number; y: number; moved: boolean; crowd: Focus[] } | null>(null);
  /** The opening or ridge handle last pressed or focused (the outline's own handles use the store's selection). */
  const [active, setActive] = useState<string | null>(null);
  const [tool, setTool] = useState<Tool>("select");
  /** The new ridge's points so far, or the new opening's first corner. */
  const [draft, setDraft] = useState<Point[]>([]);
  /** Where the next point of the drawing would land (snapped), under the pointer. */
  const [hover, setHover] = useState<Point | null>(null);
  const toolPress = useRef<{ x: number; y: number; at: Point } | null>(null);

  useEffect(() => {
    const svg = svgRef.current;
    if (!svg || typeof ResizeObserver === "undefined") return;
    const observer = new ResizeObserver(([entry]) =>
      setSize({ w: entry.contentRect.width || 1, h: entry.contentRect.height || 1 }),
    );
    observer.observe(svg);
    return () => observer.disconnect();
  }, []);

  useEffect(() => {
    const want = pendingFocus.current;
    if (!want || !svgRef.current) return;
    pendingFocus.current = null;
    const el = svgRef.current.querySelector<SVGElement>(`[data-handle="${handleId(want)}"]`);
    el?.focus();
  });

  useEffect(() => () => window.clearTimeout(clickTimer.current), []);

  // While drawing: Escape takes back the last point (or leaves the tool), Enter ends a ridge.
  useEffect(() => {
    if (tool === "select") return;
    const onKey = (e: globalThis.KeyboardEvent) => {
      if (e.key === "Escape") {
        e.preventDefault();
        if (draft.length) {
          setDraft([]);
          announce(tool === "ridge" ? "Ridge drawing cancelled." : "Opening drawing cancelled.");
        } else leaveTool();
      } else if (e.key === "Enter" && tool === "ridge" && draft.length >= 2) {
        e.preventDefault();
        finishRidge(draft);
      }
    };
    window.addEventListener("keydown", onKey);
    return () => window.removeEventListener("keydown", onKey);
  });

  const frame = usePlanFrame(spec.outline, underlay, dragging, fit);
  // The fitted frame grown to the element's shape (so the grid fills it), then zoomed.
  const fitted = growToAspect(
    { x: frame.minX, y: -frame.maxY, w: frame.maxX - frame.minX, h: frame.maxY - frame.minY },
    size.w / size.h,
  );
  const box = zoomed(fitted, zoom);
  // Metres per screen pixel.
  const px = box.w / size.w;
  const kinds = edgeKindsOf(spec);
  const n = spec.outline.length;
  const ccw = pointsSignedArea(spec.outline) > 0;
  const snap: SnapOptions = {
    grid: view.snapToGrid,
    step: view.gridStep,
    rightAngles: view.snapRightAngles,
    tolerance: 10 * px,
  };

  function toPlan(clientX: number, clientY: number): Point {
    const svg = svgRef.current!;
    const m = svg.getScreenCTM();
    if (!m) return [0, 0];
    const p = new DOMPoint(clientX, clientY).matrixTransform(m.inverse());
    return [p.x, -p.y];
  }

  function announce(text: string) {
    store.getState().setNotice(text);
  }

  // ── pointer: vertices and outlets ────────────────────────────────────────────
  /** Every handle within reach of a plan point (outlets first: they are what tasks are about). */
  function handlesAt(p: Point): Focus[] {
    const s = store.getState().spec;
    const reach = HIT * px;
    const near = (q: Point) => Math.hypot(q[0] - p[0], q[1] - p[1]) <= reach;
    return [
      ...s.outlets.flatMap((o, k) => (near(o.at) ? [{ kind: "outlet" as const, index: k }] : [])),
      ...(s.ridges ?? []).flatMap((r, k) =>
        r.line.flatMap((q, j) => (near(q) ? [{ kind: "ridge-point" as const, index: k, sub: j }] : [])),
      ),
      ...s.outline.flatMap((q, i) => (near(q) ? [{ kind: "vertex" as const, index: i }] : [])),
    ];
  }

  /** Where a handle stands: the spot whose crowd of handles a tap offers to choose from. */
  function anchorOf(target: Drag): Point | undefined {
    const s = store.getState().spec;
    if (target.kind === "outlet") return s.outlets[target.index]?.at;
    if (target.kind === "vertex") return s.outline[target.index];
    if (target.kind === "ridge-point") return s.ridges?.[target.index]?.line[target.sub];
    return undefined;
  }

  function focusHandle(f: Focus) {
    if (isOutlineHandle(f)) {
      store.getState().select(f);
      setActive(null);
    } else {
      store.getState().select(null);
      setActive(handleId(f));
    }
  }

  function startDrag(e: PointerEvent<SVGElement>, target: Drag) {
    e.stopPropagation();
    setChoice(null);
    focusHandle(target.kind === "opening" ? { kind: "opening", index: target.index } : target);
    const at = anchorOf(target);
    pressed.current = { x: e.clientX, y: e.clientY, moved: false, crowd: at ? handlesAt(at) : [] };
    if (readOnly || e.button !== 0) return;
    if (target.kind === "vertex" && outlineLocked) return;
    if (target.kind === "outlet" && outletsLocked) return;
    e.currentTarget.setPointerCapture(e.pointerId);
    drag.current = target;
  }

  function moveDrag(e: PointerEvent<SVGElement>) {
    const d = drag.current;
    if (!d) return;
    const press = pressed.current;
    if (press && !press.moved) {
      // A tap is not a drag: the handle moves only once the pointer has travelled a few pixels.
      if (Math.hypot(e.clientX - press.x, e.clientY - press.y) < 4) return;
      press.moved = true;
    }
    const p = toPlan(e.clientX, e.clientY);
    const gesture = { gesture: handleId(d) };
    if (d.kind === "vertex") {
      store.getState().edit((s) => moveVertex(s, d.index, snapVertex(p, s.outline, d.index, snap)), gesture);
    } else if (d.kind === "outlet") {
      store.getState().edit((s) => {
        // The outlet follows the pointer along the nearest parapet edge, so it can turn a corner.
        const edge = nearestParapetEdge(s.outline, edgeKindsOf(s), p);
        if (edge < 0) return s;
        const [a, b] = edgeEnds(s.outline, edge);
        return placeOutlet(s, d.index, edge, snapOnSegment(p, a, b, snap).t);
      }, gesture);
    } else if (d.kind === "opening") {
      const [dx, dy] = snapFree([p[0] - d.from[0], p[1] - d.from[1]], snap);
      store.getState().edit((s) => placeOpening(s, d.index, d.outline, dx, dy), gesture);
    } else if (d.kind === "opening-corner") {
      store.getState().edit((s) => moveOpeningCorner(s, d.index, d.sub, snapFree(p, snap)), gesture);
    } else {
      store.getState().edit((s) => setRidgePoint(s, d.index, d.sub, ridgePointAt(s, d.index, d.sub, p)), gesture);
    }
  }

  /**
   * Where point `point` of ridge `index` lands when dropped at `p`: an end goes onto the wall, a
   * corner or an earlier ridge within reach (as outlets ride on walls; a cricket's end onto an
   * upstand too, docs/roof-method-plans.md P4, P5); a bend, or an end with no wall near, on the grid.
   */
  function ridgePointAt(s: RoofSpec, index: number, point: number, p: Point): Point {
    const line = s.ridges?.[index]?.line;
    const end = !line || point === 0 || point === line.length - 1;
    if (end) {
      const hit = snapOnWalls(p, ridgeWalls(s, index), HIT * px, snap);
      if (hit) return hit.point;
    }
    return snapFree(p, snap);
  }

  function endDrag(e: PointerEvent<SVGElement>) {
    const press = pressed.current;
    pressed.current = null;
    if (press && !press.moved && press.crowd.length > 1) {
      const box = svgRef.current?.getBoundingClientRect();
      if (box) setChoice({ left: press.x - box.left, top: press.y - box.top, items: press.crowd });
    }
    if (!drag.current) return;
    if (e.currentTarget.hasPointerCapture(e.pointerId)) e.currentTarget.releasePointerCapture(e.pointerId);
    drag.current = null;
    store.getState().endGesture();
  }

  // ── pointer: zoom and pan (two fingers pinch, one finger or the mouse drags the background) ──
  function snapshot(): Gesture["start"] {
    return {
      zoom: zoom ?? { k: 1, cx: fitted.x + fitted.w / 2, cy: fitted.y + fitted.h / 2 },
      box,
      pointers: new Map(gesture.current.pointers),
    };
  }

  function backgroundDown(e: PointerEvent<SVGSVGElement>) {
    store.getState().select(null);
    setActive(null);
    setChoice(null);
    const g = gesture.current;
    g.pointers.set(e.pointerId, { x: e.clientX, y: e.clientY });
    if (g.pointers.size === 1) g.moved = false;
    e.currentTarget.setPointerCapture?.(e.pointerId);
    g.start = snapshot();
  }

  function backgroundMove(e: PointerEvent<SVGSVGElement>) {
    const g = gesture.current;
    if (!g.pointers.has(e.pointerId)) return setCursor(toPlan(e.clientX, e.clientY));
    g.pointers.set(e.pointerId, { x: e.clientX, y: e.clientY });
    const start = g.start;
    const rect = svgRef.current?.getBoundingClientRect();
    if (!start || !rect || rect.width === 0) return;
    const ids = [...g.pointers.keys()].filter((id) => start.pointers.has(id)).slice(0, 2);
    if (ids.length === 0) return;
    const mid = (m: Map<number, { x: number; y: number }>) => ({
      x: ids.reduce((t, id) => t + m.get(id)!.x, 0) / ids.length,
      y: ids.reduce((t, id) => t + m.get(id)!.y, 0) / ids.length,
    });
    const a = mid(start.pointers);
    const b = mid(g.pointers);
    let k = start.zoom.k;
    if (ids.length === 2) {
      const d = (m: Map<number, { x: number; y: number }>) =>
        Math.hypot(m.get(ids[0])!.x - m.get(ids[1])!.x, m.get(ids[0])!.y - m.get(ids[1])!.y);
      const d0 = d(start.pointers);
      if (d0 > 0) k = clamp(start.zoom.k * (d(g.pointers) / d0), MIN_ZOOM, MAX_ZOOM);
    } else if (!g.moved && Math.hypot(b.x - a.x, b.y - a.y) < 4) {
      return;
    }
    g.moved = true;
    // The plan point that was under the fingers' midpoint stays under it.
    const px0 = start.box.x + ((a.x - rect.left) / rect.width) * start.box.w;
    const py0 = start.box.y + ((a.y - rect.top) / rect.height) * start.box.h;
    const w = fitted.w / k;
    const h = fitted.h / k;
    const x = px0 - ((b.x - rect.left) / rect.width) * w;
    const y = py0 - ((b.y - rect.top) / rect.height) * h;
    setZoom({ k, cx: x + w / 2, cy: y + h / 2 });
  }

  function backgroundUp(e: PointerEvent<SVGSVGElement>) {
    const g = gesture.current;
    if (!g.pointers.delete(e.pointerId)) return;
    g.start = g.pointers.size ? snapshot() : null;
  }

  function zoomBy(factor: number) {
    const c = zoom ?? { k: 1, cx: fitted.x + fitted.w / 2, cy: fitted.y + fitted.h / 2 };
    setZoom({ ...c, k: clamp(c.k * factor, MIN_ZOOM, MAX_ZOOM) });
  }

  // ── pointer: edges ──────────────────────────────────────────────────────────
  function placeOutletOnEdge(edge: number, p: Point) {
    const s = store.getState().spec;
    if (edgeKindsOf(s)[edge] === "eaves") {
      store.getState().select({ kind: "edge", index: edge });
      announce(
        `Edge ${edge + 1} is an eaves edge: water leaves along all of it. Set it to parapet to put an outlet there.`,
      );
      return;
    }
    const [a, b] = edgeEnds(s.outline, edge);
    const { t } = snapOnSegment(p, a, b, snap);
    store.getState().edit((x) => addOutlet(x, edge, t));
    const index = store.getState().spec.outlets.length - 1;
    store.getState().select({ kind: "outlet", index });
    announce(`Outlet O${index + 1} placed on edge ${edge + 1}.`);
  }

  function clickEdge(e: React.MouseEvent<SVGElement>, edge: number) {
    e.stopPropagation();
    if (readOnly) {
      store.getState().select({ kind: "edge", index: edge });
      return;
    }
    const p = toPlan(e.clientX, e.clientY);
    window.clearTimeout(clickTimer.current);
    // Wait a moment: a double-click inserts a vertex instead.
    clickTimer.current = window.setTimeout(() => placeOutletOnEdge(edge, p), 230);
  }

  function doubleClickEdge(e: React.MouseEvent<SVGElement>, edge: number) {
    e.stopPropagation();
    window.clearTimeout(clickTimer.current);
    if (readOnly) return;
    const raw = toPlan(e.clientX, e.clientY);
    store.getState().edit((s) => {
      const [a, b] = edgeEnds(s.outline, edge);
      const { t, point } = snapOnSegment(raw, a, b, snap);
      if (t <= 0 || t >= 1) return s;
      return insertVertex(s, edge, point);
    });
    store.getState().select({ kind: "vertex", index: edge + 1 });
    announce(`Vertex ${edge + 2} added on edge ${edge + 1}.`);
  }

  // ── keyboard ────────────────────────────────────────────────────────────────
  function keyStep(e: KeyboardEvent) {
    return e.altKey ? 0.01 : e.shiftKey ? view.gridStep * 4 : view.gridStep;
  }

  function vertexKey(e: KeyboardEvent<SVGElement>, i: number) {
    if (readOnly) return;
    const dir = ARROWS[e.key];
    if (dir) {
      e.preventDefault();
      const step = keyStep(e);
      store
        .getState()
        .edit((s) => moveVertex(s, i, [s.outline[i][0] + dir[0] * step, s.outline[i][1] + dir[1] * step]), {
          gesture: `key-vertex-${i}`,
        });
    } else if (e.key === "Delete" || e.key === "Backspace") {
      e.preventDefault();
      if (store.getState().spec.outline.length <= 3) return announce("A roof needs at least 3 vertices.");
      store.getState().edit((s) => deleteVertex(s, i));
      const left = store.getState().spec.outline.length;
      const next = Math.min(i, left - 1);
      store.getState().select({ kind: "vertex", index: next });
      pendingFocus.current = { kind: "vertex", index: next };
      announce(`Vertex ${i + 1} deleted.`);
    } else if (e.key === "Insert" || e.key === "+" || e.key === "=") {
      e.preventDefault();
      store.getState().edit((s) => insertVertex(s, i));
      store.getState().select({ kind: "vertex", index: i + 1 });
      pendingFocus.current = { kind: "vertex", index: i + 1 };
      announce(`Vertex ${i + 2} added half-way along edge ${i + 1}.`);
    }
  }

  function outletKey(e: KeyboardEvent<SVGElement>, k: number) {
    if (readOnly) return;
    const dir = ARROWS[e.key];
    if (dir) {
      e.preventDefault();
      const sign = dir[0] + dir[1];
      const step = keyStep(e);
      store.getState().edit((s) => nudgeOutlet(s, k, sign * step), { gesture: `key-outlet-${k}` });
    } else if (e.key === "Delete" || e.key === "Backspace") {
      e.preventDefault();
      store.getState().edit((s) => deleteOutlet(s, k));
      store.getState().select(null);
      announce(`Outlet O${k + 1} deleted.`);
    }
  }

  function edgeKey(e: KeyboardEvent<SVGElement>, edge: number) {
    if (readOnly) return;
    if (e.key === "Enter" || e.key === " ") {
      e.preventDefault();
      const [a, b] = edgeEnds(store.getState().spec.outline, edge);
      placeOutletOnEdge(edge, [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2]);
    } else if (e.key === "e" || e.key === "E") {
      e.preventDefault();
      const kind = edgeKindsOf(store.getState().spec)[edge] === "eaves" ? "parapet" : "eaves";
      store.getState().edit((s) => setEdgeKind(s, edge, kind));
      announce(`Edge ${edge + 1} is now ${kind}.`);
    } else if (e.key === "Insert" || e.key === "+" || e.key === "=") {
      e.preventDefault();
      store.getState().edit((s) => insertVertex(s, edge));
      pendingFocus.current = { kind: "vertex", index: edge + 1 };
      announce(`Vertex ${edge + 2} added half-way along edge ${edge + 1}.`);
    }
  }

  function openingKey(e: KeyboardEvent<SVGElement>, i: number) {
    if (readOnly) return;
    const dir = ARROWS[e.key];
    if (dir) {
      e.preventDefault();
      const step = keyStep(e);
      store.getState().edit((s) => moveOpening(s, i, dir[0] * step, dir[1] * step), { gesture: `key-opening-${i}` });
    } else if (e.key === "Delete" || e.key === "Backspace") {
      e.preventDefault();
      store.getState().edit((s) => deleteOpening(s, i));
      setActive(null);
      announce(`Opening ${i + 1} deleted.`);
    }
  }

  function openingCornerKey(e: KeyboardEvent<SVGElement>, i: number, c: number) {
    if (readOnly) return;
    const dir = ARROWS[e.key];
    if (!dir) return;
    e.preventDefault();
    const step = keyStep(e);
    store.getState().edit(
      (s) => {
        const q = s.openings?.[i]?.outline[c];
        return q ? moveOpeningCorner(s, i, c, [q[0] + dir[0] * step, q[1] + dir[1] * step]) : s;
      },
      { gesture: `key-opening-corner-${i}-${c}` },
    );
  }

  function ridgePointKey(e: KeyboardEvent<SVGElement>, i: number, j: number) {
    if (readOnly) return;
    const line = store.getState().spec.ridges?.[i]?.line;
    if (!line) return;
    const end = j === 0 || j === line.length - 1;
    const dir = ARROWS[e.key];
    if (dir) {
      e.preventDefault();
      const step = keyStep(e);
      store.getState().edit(
        (s) => {
          const q = s.ridges?.[i]?.line[j];
          return q ? setRidgePoint(s, i, j, [q[0] + dir[0] * step, q[1] + dir[1] * step]) : s;
        },
        { gesture: `key-ridge-point-${i}-${j}` },
      );
    } else if (e.key === "Delete" || e.key === "Backspace") {
      e.preventDefault();
      // A ridge ends on walls: taking an end away would leave it hanging, so the whole ridge goes.
      if (end || line.length <= 2) {
        store.getState().edit((s) => deleteRidge(s, i));
        setActive(null);
        announce(`Ridge ${i + 1} deleted.`);
      } else {
        store.getState().edit((s) => deleteRidgePoint(s, i, j));
        pendingFocus.current = { kind: "ridge-point", index: i, sub: j - 1 };
        announce(`Bend ${j} of ridge ${i + 1} removed.`);
      }
    } else if (e.key === "Insert" || e.key === "+" || e.key === "=") {
      e.preventDefault();
      const piece = j === line.length - 1 ? j - 1 : j;
      const [a, b] = [line[piece], line[piece + 1]];
      store.getState().edit((s) => insertRidgePoint(s, i, piece, [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2]));
      pendingFocus.current = { kind: "ridge-point", index: i, sub: piece + 1 };
      announce(`Bend added half-way along piece ${piece + 1} of ridge ${i + 1}.`);
    }
  }

  function doubleClickRidge(e: React.MouseEvent<SVGElement>, i: number, piece: number) {
    e.stopPropagation();
    if (readOnly) return;
    const p = snapFree(toPlan(e.clientX, e.clientY), snap);
    store.getState().edit((s) => insertRidgePoint(s, i, piece, p));
    pendingFocus.current = { kind: "ridge-point", index: i, sub: piece + 1 };
    announce(`Bend added to ridge ${i + 1}: drag it to shape the ridge.`);
  }

  // ── drawing a new ridge or opening (a tap or click per point; the mouse may drag an opening out) ──
  const openingHowTo = `drag from one corner to the opposite one, or ${click} both`;
  function chooseTool(next: Tool) {
    setDraft([]);
    setHover(null);
    setChoice(null);
    setTool((t) => (t === next ? "select" : next));
    if (next === "ridge" && tool !== "ridge")
      announce(`Drawing a ridge: ${click} a wall to start it, then each bend, and end it on a wall. Esc stops.`);
    if (next === "opening" && tool !== "opening") announce(`Drawing an opening: ${openingHowTo}. Esc stops.`);
  }

  function leaveTool() {
    setTool("select");
    setDraft([]);
    setHover(null);
  }

  /** Where the drawing's next point lands: a ridge's end on a wall within reach, else the grid. */
  function drawPoint(p: Point): { point: Point; onWall: boolean } {
    const s = store.getState().spec;
    if (tool === "ridge") {
      const hit = snapOnWalls(p, ridgeWalls(s, s.ridges?.length ?? 0), HIT * px, snap);
      if (hit) return { point: hit.point, onWall: true };
    }
    return { point: snapFree(p, snap), onWall: false };
  }

  function finishRidge(points: Point[]) {
    const before = store.getState().spec.ridges?.length ?? 0;
    store.getState().edit((s) => addRidge(s, { line: points }));
    leaveTool();
    if ((store.getState().spec.ridges?.length ?? 0) === before) return announce("No room for another ridge.");
    const from = points[0];
    const to = points[points.length - 1];
    announce(
      `Ridge ${before + 1} drawn from x ${len_(from[0])}, y ${len_(from[1])} to x ${len_(to[0])}, y ${len_(to[1])}. Each area it leaves needs an outlet or an eaves edge.`,
    );
  }

  function finishOpening(a: Point, b: Point) {
    const before = store.getState().spec;
    const next = addOpeningRect(before, a, b);
    if (next === before) {
      setDraft([]);
      return announce("Too small for an opening: drag out a rectangle at least 50 mm each way.");
    }
    store.getState().edit(() => next);
    leaveTool();
    const k = next.openings!.length;
    announce(
      `Opening ${k} (rooflight, ${len_(Math.abs(b[0] - a[0]))} × ${len_(Math.abs(b[1] - a[1]))}) drawn: set its kind and upstand in the Openings list.`,
    );
  }

  function drawDown(e: PointerEvent<SVGRectElement>) {
    e.stopPropagation();
    if (e.button !== 0) return;
    e.currentTarget.setPointerCapture(e.pointerId);
    toolPress.current = { x: e.clientX, y: e.clientY, at: drawPoint(toPlan(e.clientX, e.clientY)).point };
  }

  function drawMove(e: PointerEvent<SVGRectElement>) {
    e.stopPropagation();
    setHover(drawPoint(toPlan(e.clientX, e.clientY)).point);
  }

  function drawUp(e: PointerEvent<SVGRectElement>) {
    e.stopPropagation();
    const press = toolPress.current;
    toolPress.current = null;
    if (!press) return;
    if (e.currentTarget.hasPointerCapture(e.pointerId)) e.currentTarget.releasePointerCapture(e.pointerId);
    const dragged = Math.hypot(e.clientX - press.x, e.clientY - press.y) >= 6;
    const { point, onWall } = drawPoint(toPlan(e.clientX, e.clientY));
    if (tool === "opening") {
      if (draft.length) return finishOpening(draft[0], point);
      if (dragged) return finishOpening(press.at, point);
      setDraft([press.at]);
      return announce(`First corner at x ${len_(press.at[0])}, y ${len_(press.at[1])}: now the opposite corner.`);
    }
    if (dragged) return;
    if (draft.length === 0) {
      if (!onWall) return announce(`A ridge starts on a wall: ${click} on or near one.`);
      setDraft([point]);
      return announce(
        `Ridge started at x ${len_(point[0])}, y ${len_(point[1])}: now each bend, and end it on a wall.`,
      );
    }
    const last = draft[draft.length - 1];
    if (Math.hypot(point[0] - last[0], point[1] - last[1]) < 1e-9) return;
    if (onWall) return finishRidge([...draft, point]);
    setDraft([...draft, point]);
    announce(`Bend ${draft.length} at x ${len_(point[0])}, y ${len_(point[1])}.`);
  }

  const keyUp = () => store.getState().endGesture();

  const isSelected = (kind: Focus["kind"], index: number) => selection?.kind === kind && selection.index === index;
  const handle = 6 * px;
  const outletR = 7 * px;
  const font = 11 * px;
  const sp = (p: Point) => [p[0], -p[1]] as const;
  const poly = spec.outline.map((p) => `${p[0]},${-p[1]}`).join(" ");

  const lockedWords = (locks?.parts ?? []).map((k) => LOCK_WORDS[k] ?? k);
  return (
    <div className="relative">
      {locks && lockedWords.length ? (
        <p
          className="mb-2 flex items-start gap-2 rounded border border-rule bg-paper px-2 py-1 text-sm"
          data-testid="task-locks"
        >
          <Lock aria-hidden="true" className="mt-0.5 h-4 w-4 shrink-0" />
          <span>
            <strong>Fixed by this task:</strong> {lockedWords.join(", ")}. {locks.why}
          </span>
        </p>
      ) : null}
      <svg
        ref={svgRef}
        role="group"
        aria-label="Roof plan editor"
        aria-describedby={helpId}
        viewBox={`${box.x} ${box.y} ${box.w} ${box.h}`}
        className="block aspect-[4/3] w-full touch-none select-none rounded border border-rule bg-sheet"
        onPointerDown={backgroundDown}
        onPointerMove={backgroundMove}
        onPointerUp={backgroundUp}
        onPointerCancel={backgroundUp}
        onPointerLeave={() => setCursor(null)}
        data-testid="plan"
      >
        <PlanGrid frame={{ x: box.x, y: box.y, width: box.w, height: box.h }} step={view.gridStep} />
        {underlay && (
          <image
            href={underlay.url}
            x={underlay.originX}
            y={-underlay.originY}
            width={underlay.widthPx * underlay.metresPerPixel}
            height={underlay.heightPx * underlay.metresPerPixel}
            opacity={underlay.opacity}
            preserveAspectRatio="none"
            pointerEvents="none"
          />
        )}
        <polygon points={poly} fill="var(--color-paper)" fillOpacity={underlay ? 0.35 : 0.75} stroke="none" />
        <PlanOverlays px={px} />

        {spec.outline.map((a, i) => {
          const b = spec.outline[(i + 1) % n];
          const eaves = kinds[i] === "eaves";
          const len = Math.hypot(b[0] - a[0], b[1] - a[1]);
          const [mx, my] = [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2];
          const nx = len ? ((ccw ? 1 : -1) * (b[1] - a[1])) / len : 0;
          const ny = len ? ((ccw ? -1 : 1) * (b[0] - a[0])) / len : 0;
          const d = `M${a[0]} ${-a[1]}L${b[0]} ${-b[1]}`;
          const selected = isSelected("edge", i);
          return (
            <g key={`e${i}`}>
              <path
                d={d}
                stroke={hasError ? "var(--color-bad)" : "var(--color-ink)"}
                strokeWidth={eaves ? 1.5 : 3.5}
                strokeDasharray={eaves ? "7 4" : undefined}
                vectorEffect="non-scaling-stroke"
                strokeLinecap="square"
                pointerEvents="none"
              />
              {selected && (
                <path
                  d={d}
                  stroke="var(--color-accent)"
                  strokeWidth={7}
                  strokeOpacity={0.45}
                  vectorEffect="non-scaling-stroke"
                  pointerEvents="none"
                />
              )}
              <text
                x={mx + nx * font * 1.2}
                y={-(my + ny * font * 1.2)}
                // Along the edge (turned to read left to right), so a side's label never runs out of the frame.
                transform={`rotate(${readable(a, b)} ${mx + nx * font * 1.2} ${-(my + ny * font * 1.2)})`}
                fontSize={font}
                textAnchor="middle"
                dominantBaseline="middle"
                fill="var(--color-ink-soft)"
                pointerEvents="none"
              >
                {len_(len)}
                {eaves ? " · eaves" : ""}
              </text>
              <path
                d={d}
                data-handle={`edge-${i}`}
                stroke="transparent"
                strokeWidth={16}
                vectorEffect="non-scaling-stroke"
                className={`${readOnly ? "" : "cursor-copy"} outline-none focus-visible:stroke-accent/30`}
                tabIndex={0}
                role="button"
                aria-label={`Edge ${i + 1} to ${((i + 1) % n) + 1}, ${kinds[i]}, ${len_(len)}`}
                aria-describedby={helpId}
                onPointerDown={(e) => e.stopPropagation()}
                onClick={(e) => clickEdge(e, i)}
                onDoubleClick={(e) => doubleClickEdge(e, i)}
                onFocus={() => store.getState().select({ kind: "edge", index: i })}
                onKeyDown={(e) => edgeKey(e, i)}
                data-testid={`edge-${i}`}
              />
            </g>
          );
        })}

        {spec.outline.map((p, i) => {
          const [x, y] = sp(p);
          const selected = isSelected("vertex", i);
          return (
            <g
              key={`v${i}`}
              data-handle={`vertex-${i}`}
              tabIndex={0}
              role="button"
              aria-label={`Vertex ${i + 1} at x ${len_(p[0])}, y ${len_(p[1])}${outlineLocked ? ", fixed by this task" : ""}`}
              aria-describedby={helpId}
              aria-disabled={outlineLocked || undefined}
              data-locked={outlineLocked || undefined}
              className={`${readOnly ? "" : outlineLocked ? "cursor-not-allowed" : "cursor-move"} outline-none`}
              onPointerDown={(e) => startDrag(e, { kind: "vertex", index: i })}
              onPointerMove={moveDrag}
              onPointerUp={endDrag}
              onPointerCancel={endDrag}
              onFocus={() => store.getState().select({ kind: "vertex", index: i })}
              onKeyDown={(e) => vertexKey(e, i)}
              onKeyUp={keyUp}
              data-testid={`vertex-${i}`}
            >
              <rect x={x - HIT * px} y={y - HIT * px} width={2 * HIT * px} height={2 * HIT * px} fill="transparent" />
              <rect
                x={x - handle}
                y={y - handle}
                width={handle * 2}
                height={handle * 2}
                fill={
                  selected ? "var(--color-accent)" : outlineLocked ? "var(--color-paper-deep)" : "var(--color-sheet)"
                }
                stroke={outlineLocked ? "var(--color-ink-soft)" : "var(--color-ink)"}
                strokeWidth={2}
                strokeDasharray={outlineLocked ? "2 2" : undefined}
                vectorEffect="non-scaling-stroke"
              />
              {outlineLocked ? (
                <Lock
                  x={x - handle * 0.8}
                  y={y - handle * 0.8}
                  width={handle * 1.6}
                  height={handle * 1.6}
                  strokeWidth={3}
                  color="var(--color-ink-soft)"
                  aria-hidden="true"
                />
              ) : null}
              <text
                x={x - handle * 1.4}
                y={y - handle * 1.4}
                fontSize={font}
                textAnchor="end"
                fill="var(--color-ink)"
                pointerEvents="none"
              >
                {i + 1}
              </text>
            </g>
          );
        })}
        {!readOnly && (
          <PlanFeatures
            spec={spec}
            px={px}
            active={active}
            label={len_}
            onStart={startDrag}
            onMove={moveDrag}
            onEnd={endDrag}
            onFocus={focusHandle}
            onOpeningKey={openingKey}
            onCornerKey={openingCornerKey}
            onRidgePointKey={ridgePointKey}
            onRidgeDoubleClick={doubleClickRidge}
            onKeyUp={keyUp}
            toPlan={toPlan}
            helpId={helpId}
          />
        )}
        {/* Outlets are drawn last, over corners: where the two overlap, the outlet is what a drag takes. */}
        {spec.outlets.map((o, k) => {
          const [x, y] = sp(o.at);
          const selected = isSelected("outlet", k);
          return (
            <g
              key={`o${k}`}
              data-handle={`outlet-${k}`}
              tabIndex={0}
              role="button"
              aria-label={`Outlet O${k + 1} at x ${len_(o.at[0])}, y ${len_(o.at[1])}`}
              aria-describedby={helpId}
              className={`${readOnly ? "" : "cursor-grab"} outline-none`}
              onPointerDown={(e) => startDrag(e, { kind: "outlet", index: k })}
              onPointerMove={moveDrag}
              onPointerUp={endDrag}
              onPointerCancel={endDrag}
              onFocus={() => store.getState().select({ kind: "outlet", index: k })}
              onKeyDown={(e) => outletKey(e, k)}
              onKeyUp={keyUp}
              data-testid={`outlet-${k}`}
            >
              <circle cx={x} cy={y} r={HIT * px} fill="transparent" />
              {selected && <circle cx={x} cy={y} r={outletR * 1.8} fill="var(--color-accent)" fillOpacity={0.25} />}
              <circle
                cx={x}
                cy={y}
                r={outletR}
                fill="var(--color-accent)"
                stroke="var(--color-ink)"
                strokeWidth={2}
                vectorEffect="non-scaling-stroke"
              />
              <circle cx={x} cy={y} r={outletR * 0.35} fill="var(--color-ink)" />
              <text
                x={x + outletR * 1.4}
                y={y - outletR * 1.2}
                fontSize={font}
                fill="var(--color-accent-deep)"
                fontWeight={700}
                pointerEvents="none"
              >
                O{k + 1}
              </text>
            </g>
          );
        })}
        {tool !== "select" && (
          <>
            <DrawPreview tool={tool} draft={draft} hover={hover} px={px} />
            <rect
              x={box.x}
              y={box.y}
              width={box.w}
              height={box.h}
              fill="transparent"
              className="cursor-crosshair"
              onPointerDown={drawDown}
              onPointerMove={drawMove}
              onPointerUp={drawUp}
              onPointerCancel={() => (toolPress.current = null)}
              data-testid="plan-draw-surface"
            />
          </>
        )}
      </svg>
      {tool !== "select" && (
        <p className="mt-1 rounded border border-accent bg-paper px-2 py-1 text-sm" data-testid="plan-tool-hint">
          {tool === "ridge"
            ? draft.length === 0
              ? `Drawing a ridge: ${click} a wall where it starts.`
              : `Ridge: ${draft.length} point${draft.length > 1 ? "s" : ""}. ${Click} each bend, and a wall to end it${draft.length >= 2 ? " (Enter ends it here)" : ""}.`
            : draft.length === 0
              ? `Drawing an opening: ${openingHowTo}.`
              : `Opening: now ${click} the opposite corner.`}{" "}
          Esc stops.
        </p>
      )}
      <div className="mt-1 flex flex-wrap items-center justify-between gap-2">
        <div className="min-w-0 truncate text-[11px] tabular-nums text-ink-soft" aria-hidden="true">
          {cursor
            ? `x ${len_(cursor[0])} · y ${len_(cursor[1])}`
            : `grid ${view.gridStep >= 1 ? len_(view.gridStep) : level_(view.gridStep)}`}
        </div>
        {!readOnly && (
          <div className="flex shrink-0 gap-1" role="group" aria-label="Draw on the plan">
            <button
              type="button"
              className={`btn px-2 py-1 text-sm ${tool === "ridge" ? "bg-accent text-sheet" : ""}`}
              aria-pressed={tool === "ridge"}
              title="Draw a ridge: from a wall, through its bends, to a wall"
              onClick={() => chooseTool("ridge")}
              data-testid="draw-ridge"
            >
              <Spline size={16} aria-hidden="true" /> Ridge
            </button>
            <button
              type="button"
              className={`btn px-2 py-1 text-sm ${tool === "opening" ? "bg-accent text-sheet" : ""}`}
              aria-pressed={tool === "opening"}
              title={`Draw an opening (rooflight, hatch, plant base): drag or ${click} two corners`}
              onClick={() => chooseTool("opening")}
              data-testid="draw-opening"
            >
              <SquareDashed size={16} aria-hidden="true" /> Opening
            </button>
          </div>
        )}
        <div className="flex shrink-0 gap-1" role="group" aria-label="Plan zoom">
          <button
            type="button"
            className="btn px-2 py-1 text-sm"
            aria-label="Zoom in the plan"
            title="Zoom in (or pinch)"
            onClick={() => zoomBy(1.5)}
            disabled={(zoom?.k ?? 1) >= MAX_ZOOM}
            data-testid="plan-zoom-in"
          >
            <ZoomIn size={14} aria-hidden="true" />
          </button>
          <button
            type="button"
            className="btn px-2 py-1 text-sm"
            aria-label="Zoom out of the plan"
            title="Zoom out (or pinch)"
            onClick={() => zoomBy(1 / 1.5)}
            disabled={(zoom?.k ?? 1) <= MIN_ZOOM}
            data-testid="plan-zoom-out"
          >
            <ZoomOut size={14} aria-hidden="true" />
          </button>
          <button
            type="button"
            className="btn px-2 py-1 text-sm"
            title="Fit the roof in the plan"
            onClick={() => {
              setZoom(null);
              setFit((f) => f + 1);
            }}
            data-testid="plan-fit"
          >
            <Maximize2 size={14} aria-hidden="true" /> Fit
          </button>
        </div>
      </div>
      {choice ? (
        <div
          role="menu"
          aria-label="Several handles here: choose one"
          className="absolute z-10 grid gap-1 rounded border border-rule bg-sheet p-1 text-sm shadow"
          style={{ left: choice.left + 8, top: choice.top + 8 }}
          data-testid="handle-choice"
        >
          {choice.items.map((h) => {
            const locked = (h.kind === "vertex" && outlineLocked) || (h.kind === "outlet" && outletsLocked);
            const name =
              h.kind === "ridge-point"
                ? `Ridge ${h.index + 1} point ${(h.sub ?? 0) + 1}`
                : `${h.kind === "outlet" ? "Outlet" : "Corner"} ${h.index + 1}`;
            const label = `${name}${locked ? " (fixed by this task)" : ""}`;
            return (
              <button
                key={handleId(h)}
                type="button"
                role="menuitem"
                className="btn justify-start px-2 py-0.5 text-left text-xs"
                onClick={() => {
                  setChoice(null);
                  focusHandle(h);
                  svgRef.current?.querySelector<SVGElement>(`[data-handle="${handleId(h)}"]`)?.focus();
                }}
              >
                {label}
              </button>
            );
          })}
          <button type="button" className="px-2 py-0.5 text-left text-xs underline" onClick={() => setChoice(null)}>
            Cancel
          </button>
        </div>
      ) : null}
      <p className="sr-only" aria-live="polite" data-testid="plan-zoom">
        {zoom ? `Plan zoom ${Math.round(zoom.k * 100)} %` : ""}
      </p>
      <p id={helpId} className="sr-only">
        {shortcutSentence(PLAN_SHORTCUTS)} {shortcutSentence(UNDO_SHORTCUTS)} Press ? for the list of shortcuts.
      </p>
    </div>
  );
}

const LOCK_WORDS: Record<string, string> = {
  outline: "the outline (corners)",
  edges: "the edge kinds",
  outlets: "the outlets",
  outletLevels: "outlet levels",
  baseFall: "the base fall",
  joists: "the joists",
  highLevel: "the high level",
};

/**
 * What a ridge's end may land on (docs/roof-method-plans.md P4, P5): the walls, every dividing
 * ridge drawn before it, and for a cricket the upstands too.
 */
function ridgeWalls(s: RoofSpec, index: number): [Point, Point][] {
  const ring = (pts: Point[]) => pts.map((a, k) => [a, pts[(k + 1) % pts.length]] as [Point, Point]);
  const walls = ring(s.outline);
  (s.ridges ?? []).forEach((r, k) => {
    if (k >= index || r.kind === "cricket") return;
    for (let j = 0; j + 1 < r.line.length; j++) walls.push([r.line[j], r.line[j + 1]]);
  });
  if (s.ridges?.[index]?.kind === "cricket") for (const o of s.openings ?? []) walls.push(...ring(o.outline));
  return walls;
}

function nearestParapetEdge(outline: Point[], kinds: string[], p: Point): number {
  let best = -1;
  let bestDistance = Infinity;
  for (let e = 0; e < outline.length; e++) {
    if (kinds[e] === "eaves") continue;
    const [a, b] = edgeEnds(outline, e);
    const { distance } = projectOnSegment(p, a, b);
    if (distance < bestDistance) {
      bestDistance = distance;
      best = e;
    }
  }
  return best;
}

function clamp(v: number, lo: number, hi: number) {
  return Math.min(hi, Math.max(lo, v));
}

/** The box grown (about its centre) to the given width/height ratio. */
export function growToAspect(b: Box, aspect: number): Box {
  if (!(aspect > 0) || !(b.w > 0) || !(b.h > 0)) return b;
  let { w, h } = b;
  if (w / h < aspect) w = h * aspect;
  else h = w / aspect;
  return { x: b.x - (w - b.w) / 2, y: b.y - (h - b.h) / 2, w, h };
}

function zoomed(b: Box, z: Zoom | null): Box {
  if (!z) return b;
  const w = b.w / z.k;
  const h = b.h / z.k;
  return { x: z.cx - w / 2, y: z.cy - h / 2, w, h };
}

/** The angle (degrees, SVG's clockwise) that lays text along the edge a→b and still reads left to right. */
function readable(a: Point, b: Point): number {
  let deg = (Math.atan2(-(b[1] - a[1]), b[0] - a[0]) * 180) / Math.PI;
  if (deg > 90) deg -= 180;
  if (deg <= -90) deg += 180;
  return Math.round(deg * 100) / 100;
}
