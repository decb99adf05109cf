import { useRef } from "react";
import type { Point } from "~/engine";
import { bounds } from "../state/spec-edit";
import { underlayBounds, type Underlay } from "./underlay";

export interface PlanFrame {
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
}

function padded(outline: Point[], underlay?: Underlay): PlanFrame {
  const b = bounds(outline);
  if (underlay) {
    const u = underlayBounds(underlay);
    b.minX = Math.min(b.minX, u.minX);
    b.minY = Math.min(b.minY, u.minY);
    b.maxX = Math.max(b.maxX, u.maxX);
    b.maxY = Math.max(b.maxY, u.maxY);
  }
  const span = Math.max(b.maxX - b.minX, b.maxY - b.minY, 1);
  const pad = span * 0.12 + 0.5;
  return { minX: b.minX - pad, minY: b.minY - pad, maxX: b.maxX + pad, maxY: b.maxY + pad };
}

/**
 * The plan's visible window. It holds still while a vertex is dragged (a moving frame would move
 * the vertex under the pointer) and refits afterwards when the outline has left it or shrunk a lot.
 */
export function usePlanFrame(
  outline: Point[],
  underlay: Underlay | undefined,
  dragging: boolean,
  fitRequest: number,
): PlanFrame {
  const ref = useRef<{ frame: PlanFrame; fit: number; underlay?: Underlay } | null>(null);
  const wanted = padded(outline, underlay);
  const current = ref.current;
  if (!current || current.fit !== fitRequest || current.underlay !== underlay) {
    ref.current = { frame: wanted, fit: fitRequest, underlay };
  } else if (!dragging) {
    const f = current.frame;
    const b = bounds(outline);
    const outside = b.minX < f.minX || b.minY < f.minY || b.maxX > f.maxX || b.maxY > f.maxY;
    const shrunk =
      wanted.maxX - wanted.minX < 0.4 * (f.maxX - f.minX) && wanted.maxY - wanted.minY < 0.4 * (f.maxY - f.minY);
    if (outside || shrunk) ref.current = { ...current, frame: wanted };
  }
  return ref.current!.frame;
}
