import { describe, expect, it } from "vitest";
import { ratioSpread } from "../bench/stats";
import { longTaskTime, medianOf, ratio, serverTime, summarise, type LoadTiming } from "../bench/page-timing";

const load = (over: Partial<LoadTiming>): LoadTiming => ({
  ttfb: 100,
  dcl: 500,
  hydrated: 800,
  drawn: null,
  scriptBytes: 100 * 1024,
  longTaskMs: 0,
  serverMs: 50,
  ...over,
});

describe("bench page timing", () => {
  it("takes the median of the measured values only, null when none was measured", () => {
    expect(medianOf([3, null, 1, 2])).toBe(2);
    expect(medianOf([4, 1, 3, 2])).toBe(2.5);
    expect(medianOf([null, null])).toBeNull();
    expect(medianOf([Number.NaN, 5])).toBe(5);
  });

  it("summarises each mark on its own over the loads", () => {
    const s = summarise([
      load({ hydrated: 900, drawn: 4000, phases: { shaderMs: 300 } }),
      load({ hydrated: 700, drawn: 6000, phases: { shaderMs: 100 } }),
      load({ hydrated: 800, drawn: 5000, phases: { shaderMs: 200, gl: 10 } }),
    ]);
    expect(s.loads).toBe(3);
    expect(s.missed).toEqual({ hydrated: 0, drawn: 0 });
    expect(summarise([load({ hydrated: null }), load({ drawn: 5 })]).missed).toEqual({ hydrated: 1, drawn: 1 });
    expect(s.hydrated).toBe(800);
    expect(s.drawn).toBe(5000);
    expect(s.scriptKB).toBe(100);
    expect(s.phases).toEqual({ shaderMs: 200, gl: 10 });
    expect(() => summarise([])).toThrow();
  });

  it("gives ratios to the plain page, and a page that never drew fails rather than passes", () => {
    expect(ratio(1600, 800)).toBe(2);
    expect(ratio(null, 800)).toBe(Infinity);
    expect(() => ratio(100, null)).toThrow();
    expect(() => ratio(100, 0)).toThrow();
  });

  it("sums the long tasks that started before the mark", () => {
    const tasks = [
      { startTime: 10, duration: 60 },
      { startTime: 200, duration: 100 },
      { startTime: 900, duration: 500 },
    ];
    expect(longTaskTime(tasks, 250)).toBe(160);
    expect(longTaskTime(tasks, 5)).toBe(0);
  });

  it("finds a request's server time in the JSON request log by its id", () => {
    const log = [
      "[fallwright] listening",
      '{"level":30,"reqId":"aaa","route":"/login","ms":12.5,"msg":"request"}',
      '{"level":30,"reqId":"bbb","route":"/sandbox","ms":40,"msg":"request"}',
      "not json bbb",
    ].join("\n");
    expect(serverTime(log, "bbb")).toBe(40);
    expect(serverTime(log, "ccc")).toBeNull();
    expect(serverTime(log, undefined)).toBeNull();
  });
});

describe("bench ratio spread", () => {
  it("gives the median of the rounds' ratios with their middle half and range", () => {
    const { median, note } = ratioSpread([0.9, 0.2, 0.5, 0.6, 0.4, 0.55, 0.45, 0.7]);
    expect(median).toBeCloseTo(0.525);
    expect(note).toBe("8 rounds, middle half 0.45–0.70, all 0.20–0.90");
  });
});
