import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { analyse, parseSpec } from "~/engine";

const rect = [
  [0, 0],
  [20, 0],
  [20, 10],
  [0, 10],
];
const good = { outline: rect, outlets: [{ at: [10, 0] }], baseFall: "1:40" };

function refused(input: unknown) {
  const r = parseSpec(input);
  if (r.ok) throw new Error("expected a refusal");
  return r;
}

describe("malformed specs → 400 with the bad field's path", () => {
  it.each([
    ["not an object", null, "(spec)"],
    ["no outline", { outlets: [], baseFall: "1:40" }, "outline"],
    [
      "a coordinate that is not a number",
      {
        ...good,
        outline: [
          [0, 0],
          [1, "a"],
          [2, 2],
        ],
      },
      "outline.1.1",
    ],
    [
      "a two-vertex outline",
      {
        ...good,
        outline: [
          [0, 0],
          [1, 1],
        ],
      },
      "outline",
    ],
    ["an unreadable fall", { ...good, baseFall: "steep-ish" }, "baseFall"],
    ["a fall with a length unit", { ...good, baseFall: "25 mm" }, "baseFall"],
    ["an unknown edge kind", { ...good, edges: ["gutter", "parapet", "parapet", "parapet"] }, "edges.0"],
    ["the wrong number of edge kinds", { ...good, edges: ["parapet"] }, "edges"],
    ["an outlet without a position", { ...good, outlets: [{ level: 0 }] }, "outlets.0.at"],
    ["a negative gutter width", { ...good, gutter: { width: -1 } }, "gutter.width"],
    ["a zero joist direction", { ...good, joists: { direction: [0, 0] } }, "joists.direction"],
    ["a tiny joist spacing", { ...good, joists: { spacing: 0.001 } }, "joists.spacing"],
    ["too many probes", { ...good, probes: Array.from({ length: 1001 }, () => [1, 1]) }, "probes"],
    ["an unknown rule set", { ...good, ruleSet: "mars" }, "ruleSet"],
    ["infinite rainfall", { ...good, rainfall: { intensity: Infinity } }, "rainfall.intensity"],
    [
      "201 distinct vertices",
      { ...good, outline: Array.from({ length: 201 }, (_, i) => [Math.cos(i / 32), Math.sin(i / 32)]) },
      "outline",
    ],
  ])("%s", (_, input, path) => {
    const r = refused(input);
    expect(r.status).toBe(400);
    expect(r.error.issues.map((i) => i.path)).toContain(path);
    expect(r.error.message).toMatch(/malformed/);
  });
});

describe("well-formed specs that cannot be built → 422", () => {
  it.each([
    [
      "a self-crossing outline",
      {
        ...good,
        outline: [
          [0, 0],
          [10, 10],
          [10, 0],
          [0, 10],
        ],
      },
      "outline",
      /cross/,
    ],
    [
      "a zero-length edge",
      {
        ...good,
        outline: [
          [0, 0],
          [0, 0],
          [20, 0],
          [20, 10],
          [0, 10],
        ],
      },
      "outline.0",
      /zero length/,
    ],
    ["an outlet 5 mm inside the roof", { ...good, outlets: [{ at: [10, 0.005] }] }, "outlets.0.at", /5 mm/],
    [
      "an outlet on an eaves edge",
      { ...good, edges: ["eaves", "parapet", "parapet", "parapet"] },
      "outlets.0.at",
      /eaves/,
    ],
    ["no outlet and no eaves", { ...good, outlets: [] }, "outlets", /nowhere/],
    [
      "an area over 100,000 m²",
      {
        ...good,
        outline: [
          [0, 0],
          [400, 0],
          [400, 300],
          [0, 300],
        ],
      },
      "outline",
      /100000/,
    ],
    [
      "more than 5,000 joists",
      {
        ...good,
        outline: [
          [0, 0],
          [300, 0],
          [300, 10],
          [0, 10],
        ],
        outlets: [{ at: [150, 0] }],
        joists: { spacing: 0.05 },
      },
      "joists.spacing",
      /5000/,
    ],
    [
      "a high level below the outlet",
      { ...good, outlets: [{ at: [10, 0], level: 0.2 }], highLevel: 0.1 },
      "highLevel",
      /above/,
    ],
    [
      "a spike folding back along an edge",
      {
        ...good,
        outline: [
          [0, 0],
          [20, 0],
          [25, 0],
          [22, 0],
          [22, 10],
          [0, 10],
        ],
      },
      "outline",
      /fold back/,
    ],
  ])("%s", (_, input, path, message) => {
    const r = refused(input);
    expect(r.status).toBe(422);
    expect(r.error.issues[0].path).toBe(path);
    expect(r.error.issues[0].message).toMatch(message);
  });

  it("accepts an outlet within 1 mm of the edge and snaps it on", () => {
    const r = parseSpec({ ...good, outlets: [{ at: [10, 0.0009] }] });
    expect(r.ok).toBe(true);
  });

  it("drops a repeated closing point and reads either winding", () => {
    const closed = parseSpec({ ...good, outline: [...rect, [0, 0]] });
    expect(closed.ok && closed.spec.outline.length).toBe(4);
    const cw = parseSpec({ ...good, outline: [...rect].reverse() });
    expect(cw.ok).toBe(true);
  });
});

describe("never throws", () => {
  it("for any value at all (fast-check anything)", () => {
    fc.assert(
      fc.property(
        fc.anything({
          withBigInt: true,
          withBoxedValues: true,
          withMap: true,
          withSet: true,
          withTypedArray: true,
          withSparseArray: true,
        }),
        (input) => {
          const r = parseSpec(input);
          expect(r.ok ? 200 : r.status).toBeOneOf([200, 400, 422]);
        },
      ),
      { numRuns: 1000 },
    );
  });

  it("for hostile near-roofs: odd numbers, odd lengths; anything accepted also analyses", () => {
    const num = fc.oneof(
      fc.double({ noNaN: false }),
      fc.integer({ min: -30, max: 30 }),
      fc.constantFrom(0, -0, 1e-300, 1e300, 0.1),
    );
    const pt = fc.tuple(num, num);
    const spec = fc.record(
      {
        outline: fc.array(pt, { minLength: 0, maxLength: 12 }),
        outlets: fc.array(
          fc.record({ at: pt, level: fc.option(num, { nil: undefined }), size: fc.option(num, { nil: undefined }) }),
          { maxLength: 3 },
        ),
        baseFall: fc.oneof(fc.string({ maxLength: 12 }), num, fc.constantFrom("1:40", "2°", "3%", "1:0", "1e999 deg")),
        edges: fc.option(fc.array(fc.constantFrom("parapet", "eaves"), { maxLength: 12 }), { nil: undefined }),
        joists: fc.option(fc.record({ spacing: num, direction: pt, offset: num }, { requiredKeys: [] }), {
          nil: undefined,
        }),
        highLevel: fc.option(num, { nil: undefined }),
        probes: fc.option(fc.array(pt, { maxLength: 4 }), { nil: undefined }),
      },
      { requiredKeys: ["outline", "outlets", "baseFall"] },
    );
    fc.assert(
      fc.property(spec, (input) => {
        const r = parseSpec(input);
        if (!r.ok) {
          expect([400, 422]).toContain(r.status);
          expect(r.error.issues.length).toBeGreaterThan(0);
          return;
        }
        const a = analyse(r.spec, { mesh: false, traces: false });
        expect(Number.isFinite(a.shaped.highLevel)).toBe(true);
      }),
      { numRuns: 500 },
    );
  });
});
