import { useEffect, useState } from "react";

/**
 * Whether an element has come within `margin` of the screen (it stays true once it has).
 * Returns a callback ref for the element and the flag.
 */
export function useNearViewport(margin = "600px") {
  const [element, setElement] = useState<HTMLElement | null>(null);
  const [near, setNear] = useState(false);
  useEffect(() => {
    if (near || !element) return;
    if (typeof IntersectionObserver === "undefined") {
      setNear(true);
      return;
    }
    const observer = new IntersectionObserver(([entry]) => entry.isIntersecting && setNear(true), {
      rootMargin: margin,
    });
    observer.observe(element);
    return () => observer.disconnect();
  }, [element, margin, near]);
  return [setElement, near] as const;
}
