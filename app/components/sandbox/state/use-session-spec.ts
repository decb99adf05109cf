import { useEffect } from "react";
import type { SandboxStore } from "./store";

/**
 * Keeps an unsaved roof across reloads and trips to the check sheet: the spec is written to
 * sessionStorage (this tab only) as it changes, and read back, validated, when the page opens.
 */
export function useSessionSpec(store: SandboxStore, key: string | undefined, restore = true) {
  useEffect(() => {
    if (!key) return;
    let saved: unknown = null;
    try {
      saved = restore ? JSON.parse(sessionStorage.getItem(key) ?? "null") : null;
    } catch {
      // Storage blocked or a stale, unreadable entry: start from the given roof.
    }
    // The engine checks the kept roof before it replaces the one on screen (and only if nobody edited meanwhile).
    const opening = store.getState().spec;
    const check = (engine: NonNullable<ReturnType<SandboxStore["getState"]>["engine"]>) =>
      void engine.parseSpec(saved).then((parsed) => {
        if (parsed.ok && store.getState().spec === opening)
          store.getState().replaceSpec(parsed.spec, { resetHistory: true });
      });
    let stopWaiting = () => {};
    if (saved != null) {
      const engine = store.getState().engine;
      if (engine) check(engine);
      else
        stopWaiting = store.subscribe((state) => {
          if (!state.engine) return;
          stopWaiting();
          check(state.engine);
        });
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
      stopWaiting();
    };
  }, [store, key, restore]);
}
