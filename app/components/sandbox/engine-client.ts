import type { FallResult, ParseSpecResult, RoofSpec } from "~/engine";
import type { EngineAnswers, EngineRequest, RuleSetInfo } from "./engine-protocol";
import type { EngineOutcome } from "./run-analysis";
import type * as EngineHandlers from "./engine-handlers";

type Kind = EngineRequest["kind"];

/**
 * The page's handle on the roof engine. The engine (with its units library and schema) lives in a
 * Web Worker, so it never weighs on the main thread or its bundle; where workers are missing or
 * fail, the same handlers are loaded on demand and run here.
 */
export class EngineClient {
  private worker: Worker | null = null;
  private sequence = 0;
  private readonly waiting = new Map<number, { request: EngineRequest; resolve: (answer: unknown) => void }>();
  private local: Promise<typeof EngineHandlers> | null = null;
  private disposed = false;

  constructor() {
    if (typeof Worker === "undefined") return;
    try {
      this.worker = new Worker(new URL("./engine.worker.ts", import.meta.url), { type: "module" });
      this.worker.addEventListener("message", (event: MessageEvent<{ id: number; answer: unknown }>) => {
        const job = this.waiting.get(event.data.id);
        this.waiting.delete(event.data.id);
        job?.resolve(event.data.answer);
      });
      this.worker.addEventListener("error", () => this.fallBack());
    } catch {
      this.worker = null;
    }
  }

  /** Whether answers come from a worker (false: main-thread fallback). */
  get offMainThread() {
    return this.worker !== null;
  }

  private fallBack() {
    this.worker?.terminate();
    this.worker = null;
    const jobs = [...this.waiting.values()];
    this.waiting.clear();
    for (const job of jobs) void this.runLocally(job.request).then(job.resolve);
  }

  private async runLocally(request: EngineRequest): Promise<unknown> {
    this.local ??= import("./engine-handlers");
    const { handleEngineRequest } = await this.local;
    // Let the progress indicator paint before the main thread is busy.
    await new Promise((r) => setTimeout(r, 0));
    return handleEngineRequest(request);
  }

  private call<K extends Kind>(request: Extract<EngineRequest, { kind: K }>): Promise<EngineAnswers[K]> {
    if (this.disposed) return new Promise(() => {});
    if (!this.worker) return this.runLocally(request) as Promise<EngineAnswers[K]>;
    const id = ++this.sequence;
    return new Promise((resolve) => {
      this.waiting.set(id, { request, resolve: resolve as (answer: unknown) => void });
      this.worker!.postMessage({ id, request });
    });
  }

  analyse(spec: RoofSpec): Promise<EngineOutcome> {
    return this.call({ kind: "analyse", spec });
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
