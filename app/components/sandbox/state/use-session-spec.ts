import { useEffect } from "react";
import type { SandboxStore } from "./store";

/** How long the roof may be unchanged before it is written: a drag writes once, not per move. */
export const SESSION_WRITE_DELAY_MS = 300;

/** What keepSpecInSession needs of the browser: its sessionStorage, and where `pagehide` fires. */
export interface SessionPlace {
  storage: Pick<Storage, "getItem" | "setItem">;
  page: Pick<EventTarget, "addEventListener" | "removeEventListener">;
}

/**
 * Keeps an unsaved roof across reloads and trips to the check sheet: the spec is written to
 * sessionStorage (this tab only) once it has rested for SESSION_WRITE_DELAY_MS, and at once when
 * the page goes away (`pagehide`: a reload, a closed tab) or the workspace unmounts (a link to
 * the sheet), so an edit made just before never misses the write. Read back, validated by the
 * engine, when the page opens. Returns the clean-up.
 */
export function keepSpecInSession(store: SandboxStore, key: string, restore: boolean, place: SessionPlace) {
  let saved: unknown = null;
  try {
    saved = restore ? JSON.parse(place.storage.getItem(key) ?? "null") : null;
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
  const write = () => {
    clearTimeout(timer);
    timer = undefined;
    try {
      place.storage.setItem(key, JSON.stringify(store.getState().spec));
    } catch {
      // Full or blocked storage only loses the convenience, never the roof on screen.
    }
  };
  const flush = () => {
    if (timer !== undefined) write();
  };
  const unsubscribe = store.subscribe((state, previous) => {
    if (state.spec === previous.spec) return;
    clearTimeout(timer);
    timer = setTimeout(write, SESSION_WRITE_DELAY_MS);
  });
  place.page.addEventListener("pagehide", flush);
  return () => {
    flush();
    place.page.removeEventListener("pagehide", flush);
    unsubscribe();
    stopWaiting();
  };
}

/** keepSpecInSession for the page's lifetime, in this tab's sessionStorage. */
export function useSessionSpec(store: SandboxStore, key: string | undefined, restore = true) {
  useEffect(() => {
    if (!key) return;
    return keepSpecInSession(store, key, restore, { storage: sessionStorage, page: window });
  }, [store, key, restore]);
}
