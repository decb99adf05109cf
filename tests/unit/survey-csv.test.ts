import { describe, expect, it } from "vitest";
import { feetInches, parseSurveyCsv } from "~/lib/survey-csv";

describe("survey CSV import", () => {
  it("reads a metric file with a header, in any column order, with labels", () => {
    const r = parseSurveyCsv("label,x,y,level\nJ1 start,0,0,0.050\nJ1 end,0,2,0.05\r\nJ2 start,0.4,0,0.040\n");
    expect(r.ok).toBe(true);
    expect(r.header).toBe(true);
    expect(r.units).toBe("m");
    expect(r.points).toEqual([
      { row: 2, at: [0, 0], level: 0.05, label: "J1 start" },
      { row: 3, at: [0, 2], level: 0.05, label: "J1 end" },
      { row: 4, at: [0.4, 0], level: 0.04, label: "J2 start" },
    ]);
  });

  it("reads a header-less file as x, y, level", () => {
    const r = parseSurveyCsv("0,0,0.05\n4,0,0.05\n2,0,0\n");
    expect(r.ok).toBe(true);
    expect(r.header).toBe(false);
    expect(r.points.map((p) => [p.row, ...p.at, p.level])).toEqual([
      [1, 0, 0, 0.05],
      [2, 4, 0, 0.05],
      [3, 2, 0, 0],
    ]);
  });

  it("reads US customary feet and inches (1 ft = 0.3048 m exactly, 1959 international foot)", () => {
    const r = parseSurveyCsv(`x,y,level\n"10' 0""","5' 6""","0' 1-1/2"""\n`);
    expect(r.ok).toBe(true);
    expect(r.units).toBe("ft-in");
    // 10 ft = 3.048 m; 5 ft 6 in = 66 in = 1.6764 m; 1.5 in = 0.0381 m.
    expect(r.points[0].at[0]).toBeCloseTo(3.048, 9);
    expect(r.points[0].at[1]).toBeCloseTo(1.6764, 9);
    expect(r.points[0].level).toBeCloseTo(0.0381, 9);
    expect(feetInches(`12 ft 6 in`)).toBeCloseTo(3.81, 9);
    expect(feetInches(`-0' 1/4"`)).toBeCloseTo(-0.00635, 9);
    expect(feetInches("nonsense")).toBeNull();
  });

  it("names the bad row, keeps the good ones", () => {
    const r = parseSurveyCsv("x,y,level\n0,0,0.05\n1,1,\n2,abc,0.03\n3,0,0.02\n");
    expect(r.ok).toBe(false);
    expect(r.points.map((p) => p.row)).toEqual([2, 5]);
    expect(r.issues).toEqual([
      { row: 3, column: "level", message: "Row 3: level is missing." },
      expect.objectContaining({ row: 4, column: "y" }),
    ]);
    expect(r.issues[1].message).toMatch(/^Row 4: y "abc" is not a length in metres/);
  });

  it("catches a level typed 10× off, a level in millimetres, an unknown joist, a header without a level, an empty file", () => {
    // Design level 0.02 m at (1.2, 0); 0.2 is ten times it.
    const design = (at: [number, number]) => (at[0] === 1.2 ? 0.02 : 0.05);
    const r = parseSurveyCsv("x,y,level,label\n1.2,0,0.2,J4 start\n0,0,50,J1 start\n0,2,0.05,J99 end\n", {
      designLevel: design,
      labels: new Set(["J1 start", "J4 start"]),
    });
    expect(r.issues.map((i) => [i.row, i.column])).toEqual([
      [2, "level"],
      [3, "level"],
      [4, "label"],
    ]);
    expect(r.issues[0].message).toContain("10× the design level 0.02 m");
    expect(r.issues[1].message).toContain("millimetres");
    expect(r.points).toEqual([]);
    const empty = parseSurveyCsv("x,y,height\n");
    expect(empty.ok).toBe(false);
    expect(empty.issues[0].message).toBe("The file has no measured points.");
    const missing = parseSurveyCsv("x,y,remark\n0,0,a\n");
    expect(missing.ok).toBe(false);
    expect(missing.issues[0]).toMatchObject({ row: 1 });
    expect(missing.issues[0].message).toContain("no level column");
  });
});
