import { describe, expect, it } from "vitest";
import { parseFall } from "~/engine";
import {
  fallDetail,
  formatArea,
  formatFall,
  formatFlow,
  formatLength,
  formatLevel,
  lengthInputText,
  systemFor,
} from "~/lib/units";
import { parseLength } from "~/lib/units-reader";

const metresOf = (text: string, system: "metric" | "us", kind: "length" | "level" = "length") => {
  const r = parseLength(text, system, kind);
  if (!r.ok) throw new Error(`${text}: ${r.error}`);
  return r.metres;
};
const plain = (s: string) => s.replace(/\u00a0/g, " ");

describe("conversions (NIST SP 811 Appendix B; international yard and pound agreement, 1959)", () => {
  it("1 in = 25.4 mm and 1 ft = 0.3048 m exactly", () => {
    expect(metresOf("1 in", "metric")).toBe(0.0254);
    expect(metresOf('1"', "metric")).toBe(0.0254);
    expect(metresOf("1 ft", "metric")).toBeCloseTo(0.3048, 15);
    expect(metresOf("1'", "metric")).toBeCloseTo(0.3048, 15);
    expect(metresOf("25.4 mm", "us")).toBeCloseTo(0.0254, 15);
  });

  it("reads feet and inches with fractions: 12' 6\" = 3.81 m; 6 1/2 in = 165.1 mm", () => {
    for (const text of [`12' 6"`, "12'6\"", "12 ft 6 in", "12 feet 6 inches", "12' 6", "150 in", "12.5 ft"]) {
      expect(metresOf(text, "metric")).toBeCloseTo(3.81, 12);
    }
    expect(metresOf("6 1/2 in", "metric")).toBeCloseTo(0.1651, 12);
    expect(metresOf("6 1/2", "us", "level")).toBeCloseTo(0.1651, 12);
    expect(metresOf('1/4"', "us", "level")).toBeCloseTo(0.00635, 12);
  });

  it("reads a bare number in the field's unit for the system, and metric units in US customary", () => {
    expect(metresOf("3.5", "metric")).toBe(3.5);
    expect(metresOf("150", "metric", "level")).toBeCloseTo(0.15, 12);
    expect(metresOf("150 mm", "us", "level")).toBeCloseTo(0.15, 12);
    expect(metresOf("10", "us")).toBeCloseTo(3.048, 12);
    expect(metresOf("6", "us", "level")).toBeCloseTo(0.1524, 12);
    expect(metresOf("-2.5 m", "us")).toBe(-2.5);
    expect(metresOf("1,5", "metric")).toBe(1.5);
  });

  it("refuses what is not a length, naming why", () => {
    for (const bad of ["", "banana", "2 kg", "3 s", "12 6", "1/0 in", "2 m m m m m m m m m m m m m m m m m m m m"]) {
      const r = parseLength(bad, "metric", "length");
      expect(r.ok, bad).toBe(false);
    }
  });

  it("writes lengths in feet and inches to 1/16 in and levels in inches to 1/16 in", () => {
    expect(plain(formatLength(3.81, "us"))).toBe(`12' 6"`);
    expect(plain(formatLength(0.1651, "us"))).toBe(`6 1/2"`);
    expect(plain(formatLength(12.5, "us"))).toBe(`41' 0 1/8"`); // 12.5 m = 492.126 in = 41 ft 0.126 in
    expect(plain(formatLength(3.81, "metric"))).toBe("3.81 m");
    expect(plain(formatLevel(0.15, "us"))).toBe("5 7/8 in"); // 5.9055 in → 94.49 sixteenths → 94/16
    expect(plain(formatLevel(0.00635, "us"))).toBe("1/4 in");
    expect(plain(formatLevel(0.15, "metric"))).toBe("150 mm");
    expect(plain(formatLevel(-0.0254, "us"))).toBe("−1 in");
  });

  it("what a field shows reads back to the same value within 1/32 in", () => {
    for (const m of [0, 0.3, 3.81, 12.345, -4.2]) {
      const text = lengthInputText(m, "us", "length");
      expect(Math.abs(metresOf(text, "us") - m)).toBeLessThanOrEqual(0.0254 / 32);
    }
    expect(metresOf(lengthInputText(0.15, "us", "level"), "us", "level")).toBeCloseTo(0.149225, 6);
  });

  it("area in square feet (1 ft² = 0.09290304 m², NIST SP 811) and flow in US gpm (1 gal = 3.785411784 L)", () => {
    expect(plain(formatArea(92.90304, "us"))).toBe("1,000 ft²");
    expect(plain(formatFlow(3.785411784 / 60, "us"))).toBe("1.0 gpm");
    expect(plain(formatFlow(1, "us"))).toBe("15.9 gpm"); // 60 / 3.785411784 = 15.85
    expect(plain(formatArea(150, "metric"))).toBe("150.0 m²");
  });
});

describe("falls in both systems", () => {
  it("1/4:12 is 2.083 % and 1:48, and is written 1/4 in per ft (1:48) (IBC 2018 1507.10.1)", () => {
    const f = parseFall("1/4:12");
    if (!f.ok) throw new Error(f.error);
    expect(f.percent).toBeCloseTo(2.0833, 4);
    expect(f.ratio).toBeCloseTo(48, 12);
    expect(plain(formatFall(f.ratio, "us"))).toBe("1/4 in per ft (1:48)");
    expect(plain(formatFall(f.ratio, "metric"))).toBe("1:48");
    expect(plain(fallDetail(48, "metric"))).toBe("1.19° · 2.08 %");
    expect(plain(fallDetail(48, "us"))).toBe("1/4 in per ft · 1.19° · 2.08 %");
  });

  it("every form typed reads as the same fall: 1/4 in/ft, 2.083%, 1:48, 1.19° (to the degree's rounding)", () => {
    for (const text of ["1/4 in/ft", "1/4:12", "1:48", "2.0833333%", "20.833333 mm/m"]) {
      const f = parseFall(text);
      if (!f.ok) throw new Error(f.error);
      expect(f.ratio, text).toBeCloseTo(48, 4);
    }
    const deg = parseFall("1.2°");
    if (!deg.ok) throw new Error(deg.error);
    expect(deg.ratio).toBeCloseTo(1 / Math.tan((1.2 * Math.PI) / 180), 9);
    expect(plain(formatFall(40, "us"))).toBe("0.30 in per ft (1:40)");
    expect(plain(formatFall(96, "us"))).toBe("1/8 in per ft (1:96)");
  });

  it("follows the rule set when the person has not chosen", () => {
    expect(systemFor(null, "us-ibc-2018")).toBe("us");
    expect(systemFor(null, "uk-bs-6229")).toBe("metric");
    expect(systemFor(null, undefined)).toBe("metric");
    expect(systemFor("metric", "us-ibc-2018")).toBe("metric");
    expect(systemFor("us", "de-din-18531")).toBe("us");
  });
});
