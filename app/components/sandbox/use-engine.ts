import { useEffect } from "react";
import type { RoofSpec } from "~/engine";
import type { EngineOutcome } from "./run-analysis";
import { runAnalysis } from "./run-analysis";
import type { SandboxStore } from "./store";

type Reply = { id: number; outcome: EngineOutcome; ms: number };

function startWorker(): Worker | null {
  if (typeof Worker === "undefined") return null;
  try {
    return new Worker(new URL("./engine.worker.ts", import.meta.url), { type: "module" });
  } catch {
    return null;
  }
}

/**
 * Keeps the store's analysis in step with its spec. Requests are coalesced to one per animation
 * frame and the worker holds at most one job: while it computes, only the newest spec waits
 * (latest wins), so a drag never builds a queue. Without a worker the engine runs on the main thread.
 */
export function useEngine(store: SandboxStore) {
  useEffect(() => {
    let worker = startWorker();
    let busy = false;
    let waiting: RoofSpec | null = null;
    let frame = 0;
    let sequence = 0;
    const inFlight = new Map<number, RoofSpec>();

    const finish = (spec: RoofSpec, outcome: EngineOutcome) => {
      store.getState().setOutcome(spec, outcome);
      if (waiting) {
        const next = waiting;
        waiting = null;
        send(next);
      } else {
        store.getState().setComputing(false);
      }
    };

    const send = (spec: RoofSpec) => {
      if (spec === store.getState().analysedSpec) return store.getState().setComputing(false);
      store.getState().setComputing(true);
      if (!worker) {
        busy = true;
        // Give the progress indicator a frame to paint before the main thread is busy.
        setTimeout(() => {
          busy = false;
          finish(spec, runAnalysis(spec));
        }, 0);
        return;
      }
      busy = true;
      const id = ++sequence;
      inFlight.set(id, spec);
      worker.postMessage({ id, spec });
    };

    const onMessage = (event: MessageEvent<Reply>) => {
      const spec = inFlight.get(event.data.id);
      inFlight.delete(event.data.id);
      busy = false;
      if (spec) finish(spec, event.data.outcome);
    };
    const onError = () => {
      // A worker that cannot start (old browser, blocked script) falls back to the main thread.
      worker?.terminate();
      worker = null;
      busy = false;
      const pending = [...inFlight.values()].pop() ?? waiting ?? store.getState().spec;
      inFlight.clear();
      waiting = null;
      send(pending);
    };
    worker?.addEventListener("message", onMessage);
    worker?.addEventListener("error", onError);

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
      unsubscribe();
      cancelAnimationFrame(frame);
      worker?.terminate();
    };
  }, [store]);
}
