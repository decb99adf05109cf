import { useEffect, useState, useSyncExternalStore, type RefObject } from "react";
import { cpuDrawing, WATER_IDLE_MS, watchIdle } from "./cpu-drawing";

export interface AnimationState {
  /** The water moves now. */
  animate: boolean;
  /** It would, but is paused because the page's 3D is drawn on the CPU and nobody has touched it for a while. */
  paused: boolean;
  /** The same for the view's `data-water` attribute (tests and anyone timing the view read it). */
  water: "moving" | "paused" | "still";
}

/**
 * The water of a view that `wouldMove` (shown, and not in a section) moves only while the view is
 * on screen, the reader has not asked for reduced motion and, where the 3D is drawn on the CPU,
 * someone has used the page in the last WATER_IDLE_MS.
 */
export function useAnimationAllowed(ref: RefObject<HTMLElement | null>, wouldMove: boolean): AnimationState {
  const [visible, setVisible] = useState(true);
  const [calm, setCalm] = useState(false);
  const [idle, setIdle] = useState(false);
  const cpu = useSyncExternalStore(cpuDrawing.subscribe, cpuDrawing.get, () => false);
  useEffect(() => {
    const el = ref.current;
    if (!el || typeof IntersectionObserver === "undefined") return;
    const observer = new IntersectionObserver(([entry]) => setVisible(entry.isIntersecting));
    observer.observe(el);
    return () => observer.disconnect();
  }, [ref]);
  useEffect(() => {
    const query = window.matchMedia?.("(prefers-reduced-motion: reduce)");
    if (!query) return;
    setCalm(query.matches);
    const change = () => setCalm(query.matches);
    query.addEventListener("change", change);
    return () => query.removeEventListener("change", change);
  }, []);
  useEffect(() => {
    if (!cpu) return;
    const stop = watchIdle(window, WATER_IDLE_MS, setIdle);
    return () => {
      stop();
      setIdle(false);
    };
  }, [cpu]);
  const may = wouldMove && visible && !calm;
  const animate = may && !idle;
  const paused = may && idle;
  return { animate, paused, water: animate ? "moving" : paused ? "paused" : "still" };
}
