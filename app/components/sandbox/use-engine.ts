import { useEffect } from "react";
import type { RoofSpec } from "~/engine";
import { EngineClient } from "./engine-client";
import { isSuperseded } from "./engine-server";
import type { SandboxStore } from "./store";

/**
 * Starts the page's engine and keeps the store's analysis in step with its spec. Requests are
 * coalesced to one per animation frame and sent at once; the engine drops an analysis that a
 * newer one has made stale before it started (answered superseded), so a drag never builds a
 * queue, and an answer older than one already shown is never shown.
 */
export function useEngine(store: SandboxStore) {
  useEffect(() => {
    const engine = new EngineClient();
    let alive = true;
    let sent = 0;
    let shown = 0;
    let frame = 0;
    store.setState({ engine });
    void engine.ruleSets().then((ruleSets) => alive && store.setState({ ruleSets }));

    const send = (spec: RoofSpec) => {
      const sequence = ++sent;
      if (spec === store.getState().analysedSpec) {
        // Back to the roof on screen (an undo): no older answer still on its way may replace it.
        shown = sequence;
        return store.getState().setComputing(false);
      }
      store.getState().setComputing(true);
      void engine.analyse(spec).then((outcome) => {
        if (!alive) return;
        if (!isSuperseded(outcome) && sequence > shown) {
          shown = sequence;
          const now = store.getState();
          // The roof on screen came with its analysis meanwhile (a live roof): an older answer must not replace it.
          if (!(now.analysedSpec === now.spec && spec !== now.spec)) now.setOutcome(spec, outcome);
        }
        if (sequence === sent) store.getState().setComputing(false);
      });
    };

    const request = (spec: RoofSpec) => {
      cancelAnimationFrame(frame);
      frame = requestAnimationFrame(() => send(spec));
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
