import { useEffect, useState, type RefObject } from "react";

/** Animate only while the view is on screen and the reader has not asked for reduced motion. */
export function useAnimationAllowed(ref: RefObject<HTMLElement | null>) {
  const [visible, setVisible] = useState(true);
  const [calm, setCalm] = useState(false);
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
  return visible && !calm;
}
