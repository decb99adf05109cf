import { describe, expect, it } from "vitest";
import { analyse, parseSpec, type Analysis } from "~/engine";
import { Arena } from "~/engine/arena";

/**
 * The engine reuses one block of working memory for the mesh, faces and routing of each analysis
 * (app/engine/arena.ts). Reuse must never leak one roof's numbers into the next one's answer.
 */
function run(spec: unknown, mesh: boolean | "typed" = "typed"): Analysis {
  const parsed = parseSpec(structuredClone(spec));
  if (!parsed.ok) throw new Error(parsed.error.message);
  return analyse(parsed.spec, { mesh, traces: true });
}

const SMALL = {
  outline: [
    [0, 0],
    [15, 0],
    [15, 10],
    [0, 10],
  ],
  outlets: [{ at: [7.5, 0] }],
  baseFall: "1:60",
};
// Larger and differently shaped, so its arrays overrun the block the small roof left behind.
const L_SHAPE = {
  outline: [
    [0, 0],
    [50, 0],
    [50, 21],
    [30, 21],
    [30, 36],
    [0, 36],
  ],
  outlets: [{ at: [12.5, 0] }, { at: [37.5, 0] }],
  baseFall: "1:50",
};
// A level patch and a pit: the level edges and pit search use the block too.
const WITH_PIT = {
  outline: [
    [0, 0],
    [12, 0],
    [12, 8],
    [0, 8],
  ],
  outlets: [{ at: [6, 0] }],
  baseFall: "1:80",
  highLevel: 0.02,
};

describe("working memory reused between analyses", () => {
  it("a roof analysed again after others gives the same answer, mesh included", () => {
    const first = run(SMALL);
    run(L_SHAPE);
    run(WITH_PIT);
    const again = run(SMALL);
    expect(again).toEqual(first);
  });

  it("a larger roof after a smaller one (the block grows) matches a first-time analysis of it", () => {
    const alone = run(L_SHAPE, false);
    run(SMALL);
    expect(run(L_SHAPE, false)).toEqual(alone);
  });

  it("the typed mesh handed out is a copy: the next analysis does not overwrite it", () => {
    const a = run(SMALL);
    const indices = Array.from(a.shaped.meshBuffers!.indices);
    const drains = Array.from(a.shaped.meshBuffers!.faceDrain);
    run(L_SHAPE);
    expect(Array.from(a.shaped.meshBuffers!.indices)).toEqual(indices);
    expect(Array.from(a.shaped.meshBuffers!.faceDrain)).toEqual(drains);
  });

  it("hands out zeroed, non-overlapping arrays, fresh ones past its end, and grows at the next reset", () => {
    const arena = new Arena();
    arena.reset();
    const overflow = arena.take(Float64Array, 4);
    expect(overflow.buffer.byteLength).toBe(32); // nothing kept yet: a fresh array
    arena.take(Int32Array, 10);
    arena.reset(); // grows to what the last analysis wanted
    const a = arena.take(Float64Array, 4);
    const b = arena.take(Int32Array, 10);
    expect(a.buffer).toBe(b.buffer);
    a.fill(7);
    b.fill(-1);
    expect(Array.from(a)).toEqual([7, 7, 7, 7]);
    expect(b.byteOffset).toBeGreaterThanOrEqual(a.byteOffset + a.byteLength);
    arena.reset();
    expect(Array.from(arena.take(Float64Array, 4))).toEqual([0, 0, 0, 0]);
  });
});
