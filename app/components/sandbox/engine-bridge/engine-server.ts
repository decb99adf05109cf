import type { EngineRequest } from "./engine-protocol";

export interface EngineMessage {
  id: number;
  request: EngineRequest;
}

export interface EngineReply {
  id: number;
  answer: unknown;
}

/** The answer to an analysis that a newer one made stale before it started: it was never computed. */
export interface Superseded {
  superseded: true;
}

export const SUPERSEDED: Superseded = Object.freeze({ superseded: true });

export function isSuperseded(answer: unknown): answer is Superseded {
  return typeof answer === "object" && answer !== null && (answer as Partial<Superseded>).superseded === true;
}

/** What the server runs: `prepare` loads what a request needs (the fall unit reader), `run` answers it. */
export interface EngineRunner {
  prepare(request: EngineRequest): Promise<unknown> | void;
  run(request: EngineRequest): unknown;
}

const nextTurn = () => new Promise<void>((resolve) => setTimeout(resolve, 0));

/**
 * The engine's side of the page's requests (in the worker, or on the main thread when there is
 * none). Requests queue as they arrive and are taken one at a time, each after a turn of the event
 * loop so that whatever the page posted meanwhile (during the last analysis) has arrived. An
 * analysis with a newer analysis behind it is stale: it is answered `SUPERSEDED` and never
 * computed, so a drag that outruns the engine costs one analysis per answer, not one per move.
 * Other requests are always answered, in order. An analysis already running is not interrupted.
 */
export function createEngineServer(runner: EngineRunner, reply: (reply: EngineReply) => void, turn = nextTurn) {
  const queue: EngineMessage[] = [];
  let draining = false;
  const stale = (m: EngineMessage) => m.request.kind === "analyse" && queue.some((q) => q.request.kind === "analyse");

  async function drain() {
    try {
      while (queue.length) {
        await turn();
        const message = queue.shift()!;
        if (stale(message)) {
          reply({ id: message.id, answer: SUPERSEDED });
          continue;
        }
        let answer: unknown;
        try {
          await runner.prepare(message.request);
          // A newer analysis may have come in while the reader loaded.
          if (stale(message)) {
            reply({ id: message.id, answer: SUPERSEDED });
            continue;
          }
          answer = runner.run(message.request);
        } catch (error) {
          answer = {
            ok: false,
            error: { status: 500, message: String((error as Error)?.message ?? error), issues: [] },
          };
        }
        reply({ id: message.id, answer });
      }
    } finally {
      draining = false;
    }
  }

  return {
    receive(message: EngineMessage) {
      queue.push(message);
      if (!draining) {
        draining = true;
        void drain();
      }
    },
  };
}
