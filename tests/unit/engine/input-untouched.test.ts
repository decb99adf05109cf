import { describe, expect, it } from "vitest";
import { analyse, asBuilt, parseSpec, type RoofSpec } from "~/engine";

// docs/roof-method.md: the engine reads its input and never writes to it, so callers need not copy a
// spec before handing it over. Each input here is frozen all the way down: any write would throw
// in strict mode (ES modules are strict), and the results must equal those of an unfrozen copy.
function deepFreeze<T>(value: T): T {
  if (value && typeof value === "object") {
    for (const v of Object.values(value)) deepFreeze(v);
    Object.freeze(value);
  }
  return value;
}

const L_ROOF: RoofSpec = {
  outline: [
    [0, 0],
    [14, 0],
    [14, 9],
    [6, 9],
    [6, 5],
    [0, 5],
  ],
  outlets: [{ at: [4, 0] }, { at: [14, 7], level: 0.01 }],
  openings: [
    {
      outline: [
        [9, 2],
        [10, 2],
        [10, 3],
        [9, 3],
      ],
      kind: "rooflight",
      upstand: 0.15,
    },
  ],
  probes: [
    [2, 2],
    [12, 6],
  ],
  baseFall: "1:60",
  joists: { spacing: 0.4, fromOutlets: true },
};

describe("the engine never changes its input", () => {
  it("parseSpec and analyse accept a deeply frozen spec and answer as for a fresh copy", () => {
    const frozen = deepFreeze(structuredClone(L_ROOF));
    const parsed = parseSpec(frozen);
    expect(parsed.ok).toBe(true);
    const fromFrozen = analyse(frozen, { traces: true, mesh: true });
    const fromCopy = analyse(structuredClone(L_ROOF), { traces: true, mesh: true });
    expect(fromFrozen.shaped.highLevel).toBe(fromCopy.shaped.highLevel);
    expect(fromFrozen.shaped.probes).toEqual(fromCopy.shaped.probes);
    expect(fromFrozen.shaped.joists).toEqual(fromCopy.shaped.joists);
    expect(frozen).toEqual(L_ROOF);
  });

  it("the as-built check leaves a frozen spec and frozen survey points as they were", () => {
    const spec = deepFreeze(structuredClone(L_ROOF));
    const points = deepFreeze([
      { at: [2, 2] as [number, number], level: 0.05 },
      { at: [12, 6] as [number, number], level: 0.04, label: "P2" },
      { at: [8, 1] as [number, number], level: 0.06 },
    ]);
    const fromFrozen = asBuilt(spec, points);
    const fromCopy = asBuilt(structuredClone(L_ROOF), structuredClone(points));
    expect(fromFrozen).toEqual(fromCopy);
  });
});
