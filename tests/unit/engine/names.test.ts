import { describe, expect, it } from "vitest";
import { analyse, drainName, parseSpec } from "~/engine";

describe("one name for an outlet everywhere", () => {
  it("names drains as the plan and tables do: outlet O1, eaves edge 3", () => {
    expect(drainName("outlet-0")).toBe("outlet O1");
    expect(drainName("outlet-11")).toBe("outlet O12");
    expect(drainName("eaves-2")).toBe("eaves edge 3");
  });

  it("warnings, catchments and validation errors never show an internal id", () => {
    // A long roof with one corner outlet and a steep minimum: the far fall lines are too flat,
    // and a small outlet takes more than it passes.
    const parsed = parseSpec({
      outline: [
        [0, 0],
        [60, 0],
        [60, 30],
        [0, 30],
      ],
      outlets: [{ at: [0, 0], size: 0.05 }],
      baseFall: "1:80",
      minFall: "1:40",
      rainfall: { intensity: 200 },
    });
    if (!parsed.ok) throw new Error(parsed.error.message);
    const a = analyse(parsed.spec, { mesh: false, traces: false });
    const text = JSON.stringify([a.warnings.map((w) => w.message), a.shaped.catchments.map((c) => c.label)]);
    expect(a.warnings.map((w) => w.code)).toEqual(expect.arrayContaining(["fall-line-too-flat", "outlet-capacity"]));
    expect(text).not.toMatch(/outlet-\d/);
    expect(text).toContain("to outlet O1 falls");
    expect(text).toContain("Outlet O1 (50 mm)");
    expect(a.shaped.catchments[0].label).toBe("Outlet O1");

    const bad = parseSpec({
      outline: [
        [0, 0],
        [10, 0],
        [10, 10],
        [0, 10],
      ],
      outlets: [{ at: [5, 0] }, { at: [50, 50] }],
      baseFall: "1:40",
    });
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(bad.error.message).toMatch(/outlet O2/);
  });
});
