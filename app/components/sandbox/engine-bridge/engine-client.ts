import type { FallResult, ParseSpecResult, RoofSpec } from "~/engine";
import type { EngineAnswers, EngineRequest, RuleSetInfo } from "./engine-protocol";
import type { EngineOutcome } from "./analysis-outcome";
import type * as EngineHandlers from "./engine-handlers";
import { createEngineServer, type EngineReply, type Superseded } from "./engine-server";

type Kind = EngineRequest["kind"];

const makeWorker = () => new Worker(new URL("./engine.worker.ts", import.meta.url), { type: "module" });

/** A worker started ahead of the page's first EngineClient (startEngineWorker), and whether it failed meanwhile. */
let early: { worker: Worker; failed: boolean } | null = null;

/**
 * Starts the engine's worker now, in the browser, so that it fetches and evaluates the engine
 * while the page is still hydrating; the next EngineClient takes it instead of making its own.
 * Called when the workspace's module is evaluated, which is before React hydrates the page (the
 * worker was made in the workspace's effect, after hydration, and answered 0.4 s after that).
 * Does nothing on the server or where workers are missing, or while one is already waiting.
 */
export function startEngineWorker() {
  if (early || typeof Worker === "undefined" || typeof window === "undefined") return;
  try {
    const started = { worker: makeWorker(), failed: false };
    // A failure before any client listens would be lost: kept, so the client falls back at once.
    started.worker.addEventListener("error", () => (started.failed = true));
    early = started;
  } catch {
    early = null;
  }
}

/** The early worker if one is waiting (it is handed out once), else a new one. */
function takeWorker(): Worker | null {
  const taken = early;
  early = null;
  if (!taken) return makeWorker();
  if (!taken.failed) return taken.worker;
  taken.worker.terminate();
  return null;
}

/**
 * The page's handle on the roof engine. The engine (with its units library and schema) lives in a
 * Web Worker, so it never weighs on the main thread or its bundle; where workers are missing or
 * fail, the same handlers are loaded on demand and run here.
 */
export class EngineClient {
  private worker: Worker | null = null;
  private sequence = 0;
  private readonly waiting = new Map<number, { request: EngineRequest; resolve: (answer: unknown) => void }>();
  private local: ReturnType<typeof createEngineServer> | null = null;
  private disposed = false;

  constructor() {
    if (typeof Worker === "undefined") return;
    try {
      this.worker = takeWorker();
      if (!this.worker) return;
      this.worker.addEventListener("message", (event: MessageEvent<EngineReply>) => this.answer(event.data));
      this.worker.addEventListener("error", () => this.fallBack());
    } catch {
      this.worker = null;
    }
  }

  /** Whether answers come from a worker (false: main-thread fallback). */
  get offMainThread() {
    return this.worker !== null;
  }

  private answer({ id, answer }: EngineReply) {
    const job = this.waiting.get(id);
    this.waiting.delete(id);
    job?.resolve(answer);
  }

  private fallBack() {
    this.worker?.terminate();
    this.worker = null;
    for (const [id, job] of this.waiting) this.localServer().receive({ id, request: job.request });
  }

  /** The same server as the worker's, on this thread; the handlers load on demand. */
  private localServer() {
    if (this.local) return this.local;
    let handlers: typeof EngineHandlers | null = null;
    this.local = createEngineServer(
      {
        prepare: async (request) => {
          handlers ??= await import("./engine-handlers");
          return handlers.prepareEngineRequest(request);
        },
        run: (request) => handlers!.handleEngineRequest(request),
      },
      (reply) => this.answer(reply),
    );
    return this.local;
  }

  private call<K extends Kind>(request: Extract<EngineRequest, { kind: K }>): Promise<EngineAnswers[K]> {
    if (this.disposed) return new Promise(() => {});
    const id = ++this.sequence;
    return new Promise((resolve) => {
      this.waiting.set(id, { request, resolve: resolve as (answer: unknown) => void });
      if (this.worker) this.worker.postMessage({ id, request });
      else this.localServer().receive({ id, request });
    });
  }

  /** An analysis; Superseded when a newer one came in before it started (it was not computed). */
  analyse(spec: RoofSpec, options: { preview?: boolean } = {}): Promise<EngineOutcome | Superseded> {
    return this.call({ kind: "analyse", spec, ...(options.preview ? { preview: true } : {}) });
  }

  parseFall(text: string): Promise<FallResult> {
    return this.call({ kind: "parseFall", text });
  }

  parseSpec(input: unknown): Promise<ParseSpecResult> {
    return this.call({ kind: "parseSpec", input });
  }

  ruleSets(): Promise<RuleSetInfo[]> {
    return this.call({ kind: "ruleSets" });
  }

  dispose() {
    this.disposed = true;
    this.worker?.terminate();
    this.worker = null;
    this.waiting.clear();
  }
}
