import { useRef } from "react";
import type { Point, RoofSpec } from "~/engine";
import { bounds } from "../state/spec-edit";

/**
 * Plan metres → scene: three's X is plan x, Y is level (times the vertical exaggeration), Z is −plan y,
 * all about the outline's centre, so a camera above looking down sees the plan the way the SVG draws it.
 */
export interface SceneFrame {
  cx: number;
  cy: number;
  /** Half the plan diagonal: the scale for cameras, marker sizes and hatch spacing. */
  radius: number;
}

export function sceneFrame(outline: Point[]): SceneFrame {
  const b = bounds(outline);
  return {
    cx: (b.minX + b.maxX) / 2,
    cy: (b.minY + b.maxY) / 2,
    radius: Math.max(1, Math.hypot(b.maxX - b.minX, b.maxY - b.minY) / 2),
  };
}

export function toScene(
  frame: SceneFrame,
  x: number,
  y: number,
  z: number,
  exaggeration: number,
): [number, number, number] {
  return [x - frame.cx, z * exaggeration, -(y - frame.cy)];
}

/**
 * A frame that holds still while the roof is edited (a moving origin would slide the roof under
 * the camera) and moves only when the outline has grown, shrunk or shifted a lot.
 */
export function useStableFrame(outline: Point[] | undefined): SceneFrame {
  const ref = useRef<SceneFrame | null>(null);
  const next = sceneFrame(
    outline && outline.length >= 3
      ? outline
      : [
          [0, 0],
          [1, 0],
          [1, 1],
        ],
  );
  const f = ref.current;
  if (
    !f ||
    next.radius > f.radius * 1.3 ||
    next.radius < f.radius * 0.7 ||
    Math.hypot(next.cx - f.cx, next.cy - f.cy) > f.radius * 0.3
  ) {
    ref.current = next;
  }
  return ref.current!;
}

export const frameKey = (f: SceneFrame) => `${f.cx.toFixed(3)},${f.cy.toFixed(3)},${f.radius.toFixed(3)}`;

/** Where the water goes, roughly: the mean of the outlets, else of the eaves edges' midpoints. */
export function drainCentre(spec: RoofSpec | null): [number, number] | null {
  if (!spec) return null;
  const points: Point[] = spec.outlets.map((o) => o.at);
  if (points.length === 0) {
    spec.outline.forEach((p, i) => {
      if (spec.edges?.[i] !== "eaves") return;
      const q = spec.outline[(i + 1) % spec.outline.length];
      points.push([(p[0] + q[0]) / 2, (p[1] + q[1]) / 2]);
    });
  }
  if (points.length === 0) return null;
  return [points.reduce((s, p) => s + p[0], 0) / points.length, points.reduce((s, p) => s + p[1], 0) / points.length];
}
