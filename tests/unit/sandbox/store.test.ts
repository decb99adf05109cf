import { describe, expect, it } from "vitest";
import { DEMO_ROOF } from "~/components/sandbox/state/demo-roof";
import { moveVertex } from "~/components/sandbox/state/spec-edit";
import { EngineClient } from "~/components/sandbox/engine-bridge/engine-client";
import { isSuperseded } from "~/components/sandbox/engine-bridge/engine-server";
import { formatRatio as localFormatRatio } from "~/lib/units";
import { runAnalysis } from "~/components/sandbox/engine-bridge/run-analysis";
import { handleEngineRequest } from "~/components/sandbox/engine-bridge/engine-handlers";
import { createSandboxStore } from "~/components/sandbox/state/store";
import { formatRatio } from "~/engine";

describe("engine client", () => {
  it("answers without a Worker (here: node) by loading the engine on the main thread", async () => {
    const engine = new EngineClient();
    expect(engine.offMainThread).toBe(false);
    const outcome = await engine.analyse(DEMO_ROOF);
    if (isSuperseded(outcome)) throw new Error("the only analysis was superseded");
    expect(outcome.ok).toBe(true);
    // docs/roof-method.md §4 rectangle: H = base fall × the chord through the outlet (8 m at 2°).
    if (outcome.ok) expect(outcome.analysis.shaped.highLevel).toBeCloseTo(8 * Math.tan((2 * Math.PI) / 180), 9);
    // 2.5 % = 1:40 (docs/check-values.md, trigonometry).
    expect(await engine.parseFall("2.5%")).toMatchObject({ ok: true, ratio: 40 });
    expect((await engine.parseFall("1:abc")).ok).toBe(false);
    expect((await engine.parseSpec({ outline: [] })).ok).toBe(false);
    expect((await engine.ruleSets()).map((r) => r.id)).toContain("common-practice");
  });

  it("drops analyses made stale by a newer one there too, and answers the newest", async () => {
    const engine = new EngineClient();
    const specs = [1, 2, 3].map((k) => ({ ...DEMO_ROOF, baseFall: `1:${40 + k}` }));
    const answers = await Promise.all(specs.map((s) => engine.analyse(s)));
    expect(answers.slice(0, 2).every(isSuperseded)).toBe(true);
    const last = answers[2];
    if (isSuperseded(last) || !last.ok) throw new Error("the newest analysis was not answered");
    // The worker's own answer for that spec (its mesh as typed arrays, as the 3D view takes it).
    const direct = handleEngineRequest({ kind: "analyse", spec: specs[2] }) as { analysis: unknown };
    expect(last.analysis).toEqual(direct.analysis);
  });

  it("the page's 1:N formatting is the engine's", () => {
    for (const r of [null, Infinity, 1, 10, 28.636, 39.97, 40, 40.04, 40.06, 57.29, 99.5, 100, 1234.5]) {
      expect(localFormatRatio(r)).toBe(formatRatio(r));
    }
  });
});

describe("sandbox store", () => {
  it("starts without an analysis on server and browser alike, then takes the engine's outcome", () => {
    const store = createSandboxStore(DEMO_ROOF);
    expect(store.getState().analysis).toBeNull();
    expect(store.getState().computing).toBe(true);
    store.getState().setOutcome(DEMO_ROOF, runAnalysis(DEMO_ROOF));
    expect(store.getState().analysedSpec).toBe(DEMO_ROOF);
    expect(store.getState().analysis!.shaped.highLevel).toBeGreaterThan(0);
  });

  it("undoes and redoes edits, and a drag (one gesture) is one undo step", () => {
    const store = createSandboxStore(DEMO_ROOF);
    const { edit, endGesture } = store.getState();
    edit((s) => moveVertex(s, 2, [12, 9]), { gesture: "vertex-2" });
    edit((s) => moveVertex(s, 2, [12, 10]), { gesture: "vertex-2" });
    edit((s) => moveVertex(s, 2, [12, 11]), { gesture: "vertex-2" });
    endGesture();
    edit((s) => ({ ...s, baseFall: "1:50" }));
    expect(store.getState().past).toHaveLength(2);
    store.getState().undo();
    expect(store.getState().spec.baseFall).toBe(DEMO_ROOF.baseFall);
    expect(store.getState().spec.outline[2]).toEqual([12, 11]);
    store.getState().undo();
    expect(store.getState().spec).toBe(DEMO_ROOF);
    store.getState().redo();
    store.getState().redo();
    expect(store.getState().spec.baseFall).toBe("1:50");
    expect(store.getState().future).toHaveLength(0);
  });

  it("a new edit clears the redo list; replaceSpec is undoable unless it resets the history", () => {
    const store = createSandboxStore(DEMO_ROOF);
    store.getState().edit((s) => ({ ...s, baseFall: "1:50" }));
    store.getState().undo();
    store.getState().edit((s) => ({ ...s, baseFall: "1:60" }));
    expect(store.getState().future).toHaveLength(0);
    const other = { ...DEMO_ROOF, baseFall: "1:70" };
    store.getState().replaceSpec(other);
    expect(store.getState().spec).toBe(other);
    store.getState().undo();
    expect(store.getState().spec.baseFall).toBe("1:60");
    store.getState().replaceSpec(other, { resetHistory: true });
    expect(store.getState().past).toHaveLength(0);
  });

  it("a read-only store refuses edits and undo", () => {
    const store = createSandboxStore(DEMO_ROOF, { readOnly: true });
    store.getState().edit((s) => ({ ...s, baseFall: "1:50" }));
    expect(store.getState().spec).toBe(DEMO_ROOF);
  });

  it("keeps the last good analysis when a spec cannot be built, and says why", () => {
    const store = createSandboxStore(DEMO_ROOF);
    store.getState().setOutcome(DEMO_ROOF, runAnalysis(DEMO_ROOF));
    const good = store.getState().analysis;
    const crossing = {
      ...DEMO_ROOF,
      outline: [
        [0, 0],
        [10, 10],
        [10, 0],
        [0, 10],
      ] as typeof DEMO_ROOF.outline,
    };
    store.getState().setOutcome(crossing, runAnalysis(crossing));
    expect(store.getState().analysis).toBe(good);
    expect(store.getState().analysedSpec).toBe(DEMO_ROOF);
    expect(store.getState().engineError).toMatchObject({ status: 422 });
  });
});
