import { useEffect, useState, useSyncExternalStore, type RefObject } from "react";
import { cpuDrawing, WATER_IDLE_MS, watchIdle } from "./cpu-drawing";

export interface AnimationState {
  /** The water may move now. */
  allowed: boolean;
  /** It would, but is paused because the page's 3D is drawn on the CPU and nobody has touched it for a while. */
  pausedIdle: boolean;
}

/**
 * Animate only while the view is on screen, the reader has not asked for reduced motion and, where
 * the 3D is drawn on the CPU, someone has used the page in the last WATER_IDLE_MS.
 */
export function useAnimationAllowed(ref: RefObject<HTMLElement | null>): AnimationState {
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
  const other = visible && !calm;
  return { allowed: other && !idle, pausedIdle: other && idle };
}
