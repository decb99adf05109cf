import { useEffect } from "react";
import type { RoofSpec } from "~/engine";
import { EngineClient } from "./engine-client";
import { isSuperseded } from "./engine-server";
import type { SandboxStore } from "../state/store";

/** How long the pointer rests mid-drag before the exact analysis replaces the preview. */
export const REST_MS = 150;

/**
 * Starts the page's engine and keeps the store's analysis in step with its spec. Requests are
 * coalesced to one per animation frame and sent at once; the engine drops an analysis that a
 * newer one has made stale before it started (answered superseded), so a drag never builds a
 * queue, and an answer older than one already shown is never shown. While a gesture (a drag, a
 * held arrow key) goes on, each frame asks for the preview on a coarser mesh; the exact analysis
 * follows when the gesture ends or rests for REST_MS, and replaces the preview in place.
 */
export function useEngine(store: SandboxStore) {
  useEffect(() => {
    const engine = new EngineClient();
    let alive = true;
    let sent = 0;
    let shown = 0;
    let previewShown = false;
    let frame = 0;
    let rest: ReturnType<typeof setTimeout> | undefined;
    store.setState({ engine });
    void engine.ruleSets().then((ruleSets) => alive && store.setState({ ruleSets }));

    const send = (spec: RoofSpec, preview: boolean) => {
      const sequence = ++sent;
      if (spec === store.getState().analysedSpec && (preview || !previewShown)) {
        // Already on screen (an undo back to it): no older answer still on its way may replace it.
        shown = sequence;
        if (!preview) store.getState().setComputing(false);
        return;
      }
      store.getState().setComputing(true);
      void engine.analyse(spec, { preview }).then((outcome) => {
        if (!alive) return;
        if (!isSuperseded(outcome) && sequence > shown) {
          shown = sequence;
          previewShown = outcome.ok && outcome.preview === true;
          const now = store.getState();
          // The roof on screen came with its analysis meanwhile (a live roof): an older answer must not replace it.
          if (!(now.analysedSpec === now.spec && spec !== now.spec)) now.setOutcome(spec, outcome);
        }
        // A preview on screen is not the answer yet: the exact one is on its way.
        if (sequence === sent && !previewShown) store.getState().setComputing(false);
      });
    };

    const request = (spec: RoofSpec) => {
      cancelAnimationFrame(frame);
      clearTimeout(rest);
      const dragging = store.getState().gesture !== null;
      frame = requestAnimationFrame(() => send(spec, dragging));
      if (dragging) rest = setTimeout(() => send(store.getState().spec, false), REST_MS);
    };

    const settle = () => {
      cancelAnimationFrame(frame);
      clearTimeout(rest);
      frame = requestAnimationFrame(() => send(store.getState().spec, false));
    };

    // The first roof is asked for at once, not on the next animation frame: hydration's work
    // would hold that frame back, and nothing is there to coalesce with yet.
    send(store.getState().spec, false);
    const unsubscribe = store.subscribe((state, previous) => {
      if (state.spec !== previous.spec) request(state.spec);
      else if (previous.gesture !== null && state.gesture === null) settle();
    });
    return () => {
      alive = false;
      unsubscribe();
      cancelAnimationFrame(frame);
      clearTimeout(rest);
      engine.dispose();
      store.setState({ engine: null });
    };
  }, [store]);
}
