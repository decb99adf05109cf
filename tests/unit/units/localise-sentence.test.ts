import { describe, expect, it } from "vitest";
import { analyse } from "~/engine";
import { localiseSentence } from "~/lib/units";

// Issue 19: warnings read in the chosen units. Factors from the international yard and pound
// agreement (1959) as NIST SP 811 gives them: 1 in = 25.4 mm and 1 ft = 0.3048 m exactly; and
// 1 US gallon = 3.785411784 L (NIST Handbook 44, Appendix C).
const NBSP = "\u00a0";

describe("engine sentences in US customary units", () => {
  it("rewrites each metric quantity and plan point, and leaves metric text alone", () => {
    const text =
      "The fall line from (12.00, 8.00) to outlet O1 falls at 1:135.8, flatter than the minimum 1:100. " +
      "The given high level 254 mm is below the 279 mm the base fall needs. " +
      "2 low points away from any drain hold water (4.9 m² drain to them). " +
      "Outlet O1 (100 mm) takes 3.15 L/s. No rainfall intensity given: flows use 100 mm/h.";
    expect(localiseSentence(text, "metric")).toBe(text);
    const us = localiseSentence(text, "us");
    // 12.00 m = 472.44 in = 39' 4 7/16"; 8.00 m = 314.96 in = 26' 2 15/16".
    expect(us).toContain(`(39'${NBSP}4 7/16", 26'${NBSP}2 15/16")`);
    // 254 mm = 10 in exactly; 279 mm = 10.984 in, which is 11 in to the nearest 1/16 in (175.75 sixteenths).
    expect(us).toContain(`high level 10${NBSP}in is below the 11${NBSP}in`);
    // 4.9 m² / 0.3048² = 52.74 ft².
    expect(us).toContain(`53${NBSP}ft²`);
    // 3.15 L/s × 60 / 3.785411784 = 49.9 gpm.
    expect(us).toContain(`49.9${NBSP}gpm`);
    // 100 mm/h / 25.4 = 3.94 in/h.
    expect(us).toContain(`3.94${NBSP}in/h`);
    expect(us).not.toMatch(/\d[ \u00a0](mm|m|m²|L\/s)\b/);
    // The ratios are the same in either system.
    expect(us).toContain("1:135.8");
  });

  it("turns every warning the engine gives on a roof with a too-flat fall line into US units", () => {
    const a = analyse({
      outline: [
        [0, 0],
        [30, 0],
        [30, 20],
        [0, 20],
      ],
      outlets: [{ at: [15, 0] }],
      baseFall: "1:120",
    });
    expect(a.warnings.length).toBeGreaterThan(0);
    for (const w of a.warnings)
      expect(localiseSentence(w.message, "us")).not.toMatch(/\d[ \u00a0](mm|m|m²|L\/s|mm\/h)\b/);
  });
});
