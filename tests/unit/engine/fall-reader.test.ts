import { describe, expect, it, vi } from "vitest";
import { parseFall } from "~/engine";
import { normaliseFallText, plainSlope } from "~/engine/fall";
import { unitSlope } from "~/engine/fall-units";

// Falls people type as plain numbers: a ratio, a percent, degrees or a bare N.
function plainFalls(): string[] {
  const out = ["1:40", "1 : 60", "1 in 80", "1in40", "2.5%", "2.5 %", "2°", "2 °", "2deg", "2 deg", "1.5 degrees"];
  out.push("1 degree", "40", "0", "1:0", "0:40", "3:1", "12.5", "100000", "0.001%", "89.9°");
  let seed = 7;
  const random = () => ((seed = (seed * 16807) % 2147483647) - 1) / 2147483646;
  for (let i = 0; i < 1500; i++) {
    const v = (random() * 120).toFixed(i % 4);
    const w = (1 + random() * 200).toFixed(i % 3);
    out.push(`${v}:${w}`, `1 in ${w}`, `${v}%`, `${v} %`, `${v}°`, `${v} deg`, `${v} degrees`, w);
  }
  return out;
}

describe("the fall reader's plain fast path (docs/decisions/0015-lazy-unit-reader.md)", () => {
  it("gives bit for bit the slope mathjs units give, for every plain form", () => {
    let compared = 0;
    for (const text of plainFalls()) {
      const s = normaliseFallText(text);
      const fast = plainSlope(s);
      if (fast === undefined) continue;
      compared++;
      expect([text, fast]).toEqual([text, unitSlope(s)]);
    }
    expect(compared).toBeGreaterThan(10_000);
  });

  it("leaves fractions and units to mathjs", () => {
    for (const text of ["1/4:12", "1/4 in/ft", "25 mm/m", "1 1/2:12", "0.5 rad", "2 %%", "1:40 m", "-2°", "+40"])
      expect(plainSlope(normaliseFallText(text))).toBeUndefined();
  });

  it("a fresh engine core reads plain falls without mathjs and loads it for a unit fall, with the same answers", async () => {
    vi.resetModules();
    const core = await import("~/engine/core");
    expect(
      core.needsFallUnits({ baseFall: "1:40", gutter: { fall: "2.5%" }, minFall: 80, ruleSet: "uk-bs-6229" }),
    ).toBe(false);
    expect(core.parseFall("1:40")).toEqual(parseFall("1:40"));
    expect(core.needsFallUnits({ baseFall: "1:40", areas: [{ minFall: "1/4 in/ft" }] })).toBe(true);
    expect(core.needsFallUnits("25 mm/m")).toBe(true);
    expect(() => core.parseFall("25 mm/m")).toThrow(/unit reader is not loaded/);
    await core.loadFallUnits();
    expect(core.needsFallUnits("25 mm/m")).toBe(false);
    for (const text of ["25 mm/m", "1/4 in/ft", "1/4:12", "2 m", "1:abc"])
      expect(core.parseFall(text)).toEqual(parseFall(text));
  });
});
