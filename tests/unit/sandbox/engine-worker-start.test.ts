import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";

/** Stands in for the browser's Worker: counts how many were made and lets a test fail one. */
class FakeWorker extends EventTarget {
  static made: FakeWorker[] = [];
  posted: unknown[] = [];
  terminated = false;
  constructor(
    readonly url: URL | string,
    readonly options?: WorkerOptions,
  ) {
    super();
    FakeWorker.made.push(this);
  }
  postMessage(message: unknown) {
    this.posted.push(message);
  }
  terminate() {
    this.terminated = true;
  }
}

async function freshClientModule() {
  vi.resetModules();
  return import("~/components/sandbox/engine-bridge/engine-client");
}

describe("the engine worker started before hydration", () => {
  beforeEach(() => {
    FakeWorker.made = [];
    vi.stubGlobal("window", globalThis);
    vi.stubGlobal("Worker", FakeWorker);
  });
  afterEach(() => vi.unstubAllGlobals());

  it("is made once, ahead of the client, and the page's first client uses it rather than making another", async () => {
    const { startEngineWorker, EngineClient } = await freshClientModule();
    startEngineWorker();
    startEngineWorker(); // a second call while one waits makes no second worker
    expect(FakeWorker.made).toHaveLength(1);
    const early = FakeWorker.made[0];
    expect(String(early.url)).toMatch(/engine\.worker/);

    const engine = new EngineClient();
    expect(FakeWorker.made).toHaveLength(1);
    expect(engine.offMainThread).toBe(true);
    void engine.ruleSets();
    expect(early.posted).toEqual([{ id: 1, request: { kind: "ruleSets" } }]);

    // It is handed out once: a later client (another workspace) has a worker of its own.
    const second = new EngineClient();
    expect(FakeWorker.made).toHaveLength(2);
    second.dispose();
    engine.dispose();
    expect(early.terminated).toBe(true);
  });

  it("a worker that failed before any client listened is dropped, and the client answers on the main thread", async () => {
    const { startEngineWorker, EngineClient } = await freshClientModule();
    startEngineWorker();
    const early = FakeWorker.made[0];
    early.dispatchEvent(new Event("error"));
    const engine = new EngineClient();
    expect(early.terminated).toBe(true);
    expect(FakeWorker.made).toHaveLength(1);
    expect(engine.offMainThread).toBe(false);
    expect((await engine.ruleSets()).map((r) => r.id)).toContain("common-practice");
  });

  it("does nothing on the server (no window)", async () => {
    vi.stubGlobal("window", undefined);
    const { startEngineWorker } = await freshClientModule();
    startEngineWorker();
    expect(FakeWorker.made).toHaveLength(0);
  });
});
