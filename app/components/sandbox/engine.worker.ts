import { runAnalysis } from "./run-analysis";
import type { RoofSpec } from "~/engine";

/** Runs the roof engine off the main thread: one request in, one outcome out, tagged with its id. */
self.onmessage = (event: MessageEvent<{ id: number; spec: RoofSpec }>) => {
  const { id, spec } = event.data;
  const started = performance.now();
  const outcome = runAnalysis(spec);
  (self as unknown as Worker).postMessage({ id, outcome, ms: performance.now() - started });
};
