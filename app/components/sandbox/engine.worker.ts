import { handleEngineRequest } from "./engine-handlers";
import type { EngineRequest } from "./engine-protocol";

/** The roof engine off the main thread: one request in, one answer out, tagged with its id. */
self.onmessage = (event: MessageEvent<{ id: number; request: EngineRequest }>) => {
  const { id, request } = event.data;
  let answer: unknown;
  try {
    answer = handleEngineRequest(request);
  } catch (error) {
    answer = { ok: false, error: { status: 500, message: String((error as Error)?.message ?? error), issues: [] } };
  }
  (self as unknown as Worker).postMessage({ id, answer });
};
