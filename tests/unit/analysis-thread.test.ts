import { describe, expect, it } from "vitest";
import { analyse, parseRoofSpec, parseSpec, type RoofSpec } from "~/engine";
import { analysisAnswer } from "~/lib/analysis-answer";
import { analysedOnRequestThread, ON_REQUEST_THREAD } from "~/lib/analysis-request.server";
import { BENCH_ROOFS, REQUEST_THREAD_ROOF } from "../bench/bench";

// The bench's 15 × 10 m roof with one outlet.
const SMALL: RoofSpec = BENCH_ROOFS[0].spec;
const DEFAULT = { mesh: false, traces: false };

/** The gate's answer for a spec sent as compact JSON. */
function onRequestThread(spec: RoofSpec, options = DEFAULT, bytes = JSON.stringify(spec).length): boolean {
  const parsed = parseRoofSpec(structuredClone(spec));
  if (!parsed.ok) throw new Error(parsed.error.message);
  return analysedOnRequestThread(bytes, parsed.roof, options);
}

const square = (x: number, y: number, s = 1): [number, number][] => [
  [x, y],
  [x + s, y],
  [x + s, y + s],
  [x, y + s],
];

describe("which analyses run on the request's thread (ON_REQUEST_THREAD)", () => {
  it("a small roof's default answer does", () => {
    expect(onRequestThread(SMALL)).toBe(true);
  });

  it("the bench's roof at the bounds is inside them, so its row times the most work let in", () => {
    expect(JSON.stringify(REQUEST_THREAD_ROOF).length).toBeLessThanOrEqual(ON_REQUEST_THREAD.bodyBytes);
    expect(REQUEST_THREAD_ROOF.outline).toHaveLength(ON_REQUEST_THREAD.vertices);
    expect(REQUEST_THREAD_ROOF.outlets).toHaveLength(ON_REQUEST_THREAD.outlets);
    expect(REQUEST_THREAD_ROOF.openings).toHaveLength(ON_REQUEST_THREAD.openings);
    expect(onRequestThread(REQUEST_THREAD_ROOF)).toBe(true);
    // Finer joists push its mesh estimate over the station bound.
    expect(onRequestThread({ ...REQUEST_THREAD_ROOF, joists: { spacing: 0.3 } })).toBe(false);
  });

  it("the 3D mesh, flow traces or a body over 4 kB go to the pool", () => {
    expect(onRequestThread(SMALL, { mesh: true, traces: false })).toBe(false);
    expect(onRequestThread(SMALL, { mesh: false, traces: true })).toBe(false);
    expect(onRequestThread(SMALL, DEFAULT, ON_REQUEST_THREAD.bodyBytes + 1)).toBe(false);
  });

  it("one vertex, outlet or opening over a bound goes to the pool", () => {
    // A 16 × 10 m rectangle whose south wall zigzags, with k vertices in all.
    const zigzag = (k: number): [number, number][] => [
      ...Array.from({ length: k - 2 }, (_, i): [number, number] => [(16 * i) / (k - 3), i % 2 ? 0.3 : 0]),
      [16, 10],
      [0, 10],
    ];
    const walled = (k: number): RoofSpec => ({ ...SMALL, outline: zigzag(k), outlets: [{ at: [8, 10] }] });
    expect(onRequestThread(walled(16))).toBe(true);
    expect(onRequestThread(walled(17))).toBe(false);
    const outlets = (n: number) => Array.from({ length: n }, (_, i) => ({ at: [1 + i, 0] as [number, number] }));
    expect(onRequestThread({ ...SMALL, outlets: outlets(8) })).toBe(true);
    expect(onRequestThread({ ...SMALL, outlets: outlets(9) })).toBe(false);
    const openings = (n: number) => Array.from({ length: n }, (_, i) => ({ outline: square(2 + 3 * i, 4) }));
    expect(onRequestThread({ ...SMALL, openings: openings(2) })).toBe(true);
    expect(onRequestThread({ ...SMALL, openings: openings(3) })).toBe(false);
  });

  it("a roof divided by a ridge goes to the pool (its areas are analysed one by one)", () => {
    const ridged: RoofSpec = {
      ...SMALL,
      outlets: [{ at: [4, 0] }, { at: [11, 0] }],
      ridges: [
        {
          line: [
            [7.5, 0],
            [7.5, 10],
          ],
        },
      ],
    };
    expect(onRequestThread(ridged)).toBe(false);
  });

  it("the answer made on the request's thread is the engine's analysis as JSON bytes", () => {
    const parsed = parseRoofSpec(structuredClone(SMALL));
    if (!parsed.ok) throw new Error(parsed.error.message);
    const answer = analysisAnswer(parsed.roof, { ...DEFAULT, maxBytes: 10 * 1024 * 1024 }, performance.now());
    if (answer.kind !== "bytes") throw new Error(answer.kind);
    const checked = parseSpec(structuredClone(SMALL));
    if (!checked.ok) throw new Error(checked.error.message);
    expect(new TextDecoder().decode(answer.bytes)).toBe(JSON.stringify(analyse(checked.spec, DEFAULT)));
    expect(analysisAnswer(parsed.roof, { ...DEFAULT, maxBytes: 1000 }, performance.now()).kind).toBe("too-large");
  });
});
