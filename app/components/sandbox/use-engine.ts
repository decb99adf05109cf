import { useEffect } from "react";
import type { RoofSpec } from "~/engine";
import { EngineClient } from "./engine-client";
import type { SandboxStore } from "./store";

/**
 * Starts the page's engine and keeps the store's analysis in step with its spec. Requests are
 * coalesced to one per animation frame and at most one analysis is in flight: while it runs, only
 * the newest spec waits (latest wins), so a drag never builds a queue.
 */
export function useEngine(store: SandboxStore) {
  useEffect(() => {
    const engine = new EngineClient();
    let alive = true;
    let busy = false;
    let waiting: RoofSpec | null = null;
    let frame = 0;
    store.setState({ engine });
    void engine.ruleSets().then((ruleSets) => alive && store.setState({ ruleSets }));

    const send = (spec: RoofSpec) => {
      if (spec === store.getState().analysedSpec) return store.getState().setComputing(false);
      busy = true;
      store.getState().setComputing(true);
      void engine.analyse(spec).then((outcome) => {
        if (!alive) return;
        busy = false;
        const now = store.getState();
        // The roof on screen came with its analysis meanwhile (a live roof): an older answer must not replace it.
        if (!(now.analysedSpec === now.spec && spec !== now.spec)) now.setOutcome(spec, outcome);
        if (waiting) {
          const next = waiting;
          waiting = null;
          send(next);
        } else {
          store.getState().setComputing(false);
        }
      });
    };

    const request = (spec: RoofSpec) => {
      cancelAnimationFrame(frame);
      frame = requestAnimationFrame(() => {
        if (busy) waiting = spec;
        else send(spec);
      });
    };

    request(store.getState().spec);
    const unsubscribe = store.subscribe((state, previous) => {
      if (state.spec !== previous.spec) request(state.spec);
    });
    return () => {
      alive = false;
      unsubscribe();
      cancelAnimationFrame(frame);
      engine.dispose();
      store.setState({ engine: null });
    };
  }, [store]);
}
