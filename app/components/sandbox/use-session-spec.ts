import { useEffect } from "react";
import { parseSpec } from "~/engine";
import type { SandboxStore } from "./store";

/**
 * Keeps an unsaved roof across reloads and trips to the check sheet: the spec is written to
 * sessionStorage (this tab only) as it changes, and read back, validated, when the page opens.
 */
export function useSessionSpec(store: SandboxStore, key: string | undefined, restore = true) {
  useEffect(() => {
    if (!key) return;
    try {
      const saved = restore ? sessionStorage.getItem(key) : null;
      if (saved) {
        const parsed = parseSpec(JSON.parse(saved));
        if (parsed.ok) store.getState().replaceSpec(parsed.spec, { resetHistory: true });
      }
    } catch {
      // Storage blocked or a stale, unreadable entry: start from the given roof.
    }
    let timer: ReturnType<typeof setTimeout> | undefined;
    const unsubscribe = store.subscribe((state, previous) => {
      if (state.spec === previous.spec) return;
      clearTimeout(timer);
      timer = setTimeout(() => {
        try {
          sessionStorage.setItem(key, JSON.stringify(store.getState().spec));
        } catch {
          // Full or blocked storage only loses the convenience, never the roof on screen.
        }
      }, 300);
    });
    return () => {
      clearTimeout(timer);
      unsubscribe();
    };
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [store, key]);
}
