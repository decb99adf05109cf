import { describe, expect, it } from "vitest";
import { DEMO_ROOF } from "~/components/sandbox/demo-roof";
import { moveVertex } from "~/components/sandbox/spec-edit";
import { createSandboxStore } from "~/components/sandbox/store";

describe("sandbox store", () => {
  it("analyses the opening roof at once, so the server-rendered page has figures", () => {
    const store = createSandboxStore(DEMO_ROOF);
    const { analysis, engineError, analysedSpec } = store.getState();
    expect(engineError).toBeNull();
    expect(analysedSpec).toBe(DEMO_ROOF);
    // ROOF-METHOD.md §4 rectangle: H = base fall × the chord through the outlet (8 m at 2°).
    expect(analysis!.shaped.highLevel).toBeCloseTo(8 * Math.tan((2 * Math.PI) / 180), 9);
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
    const store = createSandboxStore({ ...DEMO_ROOF, outline: [[0, 0], [10, 10], [10, 0], [0, 10]] });
    expect(store.getState().analysis).toBeNull();
    expect(store.getState().engineError).toMatchObject({ status: 422 });
  });
});
