import { useLayoutEffect, useState } from "react";

/**
 * Keeps a block from shrinking while `key` stays the same: its tallest height so far becomes its
 * minimum, and a new key starts afresh. A follower's live caption changes to a shorter one when the
 * trainer edits the roof; without this, everything under it (the 3D view among it) moved up at that
 * moment, and the whole page was painted again.
 */
export function useSteadyHeight<T extends HTMLElement>(key: string) {
  const [element, ref] = useState<T | null>(null);
  const [held, setHeld] = useState({ key, px: 0 });
  useLayoutEffect(() => {
    if (!element) return;
    const note = () => {
      const height = element.getBoundingClientRect().height;
      setHeld((old) => (old.key === key && height <= old.px + 0.5 ? old : { key, px: height }));
    };
    note();
    const observer = new ResizeObserver(note);
    observer.observe(element);
    return () => observer.disconnect();
  }, [element, key]);
  const px = held.key === key ? held.px : 0;
  return { ref, style: px > 0 ? { minHeight: `${px}px` } : undefined };
}
