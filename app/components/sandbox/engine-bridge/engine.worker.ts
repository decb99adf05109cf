import { handleEngineRequest, prepareEngineRequest, transferablesOf } from "./engine-handlers";
import { createEngineServer, type EngineMessage } from "./engine-server";

/** The roof engine off the main thread: requests in, answers out, tagged with their ids; stale analyses dropped. */
const server = createEngineServer({ prepare: prepareEngineRequest, run: handleEngineRequest }, (reply) =>
  (self as unknown as Worker).postMessage(reply, transferablesOf(reply.answer)),
);

self.onmessage = (event: MessageEvent<EngineMessage>) => server.receive(event.data);
