import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { asBuilt } from "~/engine";
import { DEMO_ROOF } from "~/components/sandbox/state/demo-roof";
import { measurePlaces, parseMeasuredSchedule, readLevel } from "~/lib/pack/measured-schedule";
import { scheduleCsv } from "~/lib/pack/schedule-csv";
import { packOf, U_ROOF } from "./fixtures";

/**
 * Fill the app's own download as a builder would in a spreadsheet: `fill(label, designCell)`
 * gives the text for each measured cell (joist ends in the table, check points in the header).
 */
function filled(csv: string, fill: (label: string, design: string) => string): string {
  const rows = Papa.parse<string[]>(csv.replace(/^\uFEFF/, "")).data;
  const at = rows.findIndex((r) => r[0] === "joist");
  const h = rows[at];
  const c = (name: RegExp) => h.findIndex((x) => name.test(x));
  const [span, sl, sm, el, em] = [
    c(/^span$/),
    c(/^start_level/),
    c(/^start_measured/),
    c(/^end_level/),
    c(/^end_measured/),
  ];
  return Papa.unparse(
    rows.map((r, i) => {
      const out = [...r];
      if (r[0] === "check_point") out[7] = fill(r[1], r[6]);
      if (i > at && r[0] !== "") {
        const j = `J${r[0]}${span >= 0 && r[span] ? `.${r[span]}` : ""}`;
        out[sm] = fill(`${j} start`, r[sl]);
        out[em] = fill(`${j} end`, r[el]);
      }
      return out;
    }),
  );
}

describe("measured drop schedule round trip", () => {
  const pack = packOf(U_ROOF, "Annex roof");
  const joists = pack.analysis.shaped.joists;
  const csv = scheduleCsv(pack);

  it("the download has an empty measured column beside each end's design level, and check points on long spans", () => {
    const rows = Papa.parse<string[]>(csv).data;
    const header = rows.find((r) => r[0] === "joist")!;
    expect(header.indexOf("start_measured_mm")).toBe(header.indexOf("start_level_mm") + 1);
    expect(header.indexOf("end_measured_mm")).toBe(header.indexOf("end_level_mm") + 1);
    const table = rows.slice(rows.indexOf(header) + 1).filter((r) => r[0] !== "");
    for (const r of table)
      expect([r[header.indexOf("start_measured_mm")], r[header.indexOf("end_measured_mm")]]).toEqual(["", ""]);
    // Joists along x: the 12 m spans below the notch get check points at most 3 m apart (3
    // inside a 12 m span), the 4 m spans either side of the notch one each at mid-span; the
    // joist on the line y = 3 m through the notch's corners, where the surface twists, none.
    // On that line only the point at (6, 3), on the notch's own edge, has the joist's level.
    const checks = rows.filter((r) => r[0] === "check_point");
    expect(checks.filter((c) => Number(c[5]) === 3).map((c) => Number(c[4]))).toEqual([6]);
    const long = joists.flatMap((j) => j.spans).filter((s) => s.length > 3 && Math.abs(s.start[1] - 3) > 1e-9);
    expect(checks).toHaveLength(long.reduce((n, s) => n + Math.ceil(s.length / 3) - 1, 0) + 1);
    const j0 = joists.find((j) => j.spans[0].length > 11 && Math.abs(j.spans[0].start[1] - 3) > 1e-9)!;
    const s0 = j0.spans[0];
    expect(s0.length).toBeCloseTo(12, 9);
    const c1 = checks.find((c) => Number(c[2]) === j0.index + 1)!;
    expect(Number(c1[4])).toBeCloseTo(s0.start[0] + 3, 3);
    // Level linear along the joist (docs/roof-method.md §4): a quarter of the way.
    expect(Number(c1[6])).toBe(Math.round((s0.startLevel + (s0.endLevel - s0.startLevel) / 4) * 1000));
    expect(c1[7]).toBe("");
    // Joists of two spans are read back by joist and span number.
    const back = parseMeasuredSchedule(
      filled(csv, (_, d) => d),
      pack.spec,
      joists,
    );
    expect(back.issues).toEqual([]);
    expect(back.points.map((p) => p.label)).toContain("J1.2 end");
    expect(back.points).toHaveLength(measurePlaces(pack.spec, joists).length);
  });

  it("filled with the design levels it reads back to zero deviation, a pass and no fixes", () => {
    const pack = packOf(DEMO_ROOF, "Depot");
    const joists = pack.analysis.shaped.joists;
    const csv = scheduleCsv(pack);
    const parsed = parseMeasuredSchedule(
      filled(csv, (_, d) => d),
      pack.spec,
      joists,
    );
    expect(parsed.issues).toEqual([]);
    expect(parsed.points).toHaveLength(measurePlaces(pack.spec, joists).length);
    const r = asBuilt(pack.spec, parsed.points);
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    // The file carries whole millimetres: zero to the millimetre.
    for (const d of r.result.deviations) expect(Math.abs(d.delta)).toBeLessThanOrEqual(0.0005 + 1e-9);
    expect(r.result.verdict.passed).toBe(true);
    expect(r.result.fixes).toEqual([]);
  });

  it("one end 15 mm low: the fix packs that end up by 15 mm", () => {
    const pack = packOf(DEMO_ROOF, "Depot");
    const joists = pack.analysis.shaped.joists;
    const csv = scheduleCsv(pack);
    const target = "J5 start";
    const text = filled(csv, (label, d) => (label === target ? String(Number(d) - 15) : d));
    const parsed = parseMeasuredSchedule(text, pack.spec, joists);
    expect(parsed.issues).toEqual([]);
    const r = asBuilt(pack.spec, parsed.points);
    if (!r.ok) throw new Error(JSON.stringify(r.issues));
    expect(r.result.verdict.passed).toBe(false);
    const fix = r.result.fixes.filter((f) => f.joist === 4 && f.end === "start");
    expect(fix).toHaveLength(1);
    // Within the file's whole millimetre of the design level.
    expect(Math.abs(fix[0].change - 0.015)).toBeLessThanOrEqual(0.0005 + 1e-9);
    expect(r.result.fixes).toHaveLength(1);
  });

  it("a US customary download round-trips in inches", () => {
    const pack = packOf(DEMO_ROOF, "Depot");
    const joists = pack.analysis.shaped.joists;
    const us = scheduleCsv({ ...pack, units: "us" });
    expect(us).toContain("start_measured_in");
    const parsed = parseMeasuredSchedule(
      filled(us, (_, d) => d),
      pack.spec,
      joists,
    );
    expect(parsed.units).toBe("us");
    expect(parsed.issues).toEqual([]);
    const r = asBuilt(pack.spec, parsed.points);
    if (!r.ok) throw new Error("unexpected");
    // 1/16 in is 1.5875 mm: half of it at most.
    for (const d of r.result.deviations) expect(Math.abs(d.delta)).toBeLessThanOrEqual(0.0254 / 32 + 1e-9);
    expect(r.result.verdict.passed).toBe(true);
  });

  it("names the row of an unknown joist, a missing value, a wrong unit and a level 10× off, and keeps every value typed", () => {
    const rect = packOf(DEMO_ROOF, "Depot");
    const j = rect.analysis.shaped.joists;
    let text = filled(scheduleCsv(rect), (label, d) =>
      label === "J2 start" ? "" : label === "J3 end" ? '2"' : label === "J4 start" ? String(Number(d) * 10) : d,
    );
    const lines = text.split("\r\n");
    const tableAt = lines.findIndex((l) => l.startsWith("joist,"));
    // Joist 99 does not exist; a spreadsheet row number is the line number from 1.
    lines.push(lines[tableAt + 1].replace(/^1,/, "99,"));
    text = lines.join("\r\n");
    const p = parseMeasuredSchedule(text, rect.spec, j);
    expect(p.ok).toBe(false);
    const byKind = (k: string) => p.issues.filter((i) => i.kind === k);
    expect(byKind("missing").map((i) => i.row)).toEqual([tableAt + 3]);
    expect(byKind("missing")[0].message).toBe(`Row ${tableAt + 3}: J2 start has no measured level.`);
    expect(byKind("units")[0].message).toMatch(
      new RegExp(`^Row ${tableAt + 4}: J3 end "2""" is in feet or inches`.replace('""', '"')),
    );
    expect(byKind("typo")[0].row).toBe(tableAt + 5);
    expect(byKind("typo")[0].message).toContain("10× the design level");
    expect(byKind("unknown")[0].row).toBe(lines.length);
    expect(byKind("unknown")[0].message).toMatch(/joist "99" is not in this roof's drop schedule/);
    // Nothing typed is lost: the bad values are kept as typed, the good ones as points.
    expect(p.entries.find((e) => e.label === "J3 end")).toMatchObject({ raw: '2"', level: null });
    expect(p.entries.find((e) => e.label === "J4 start")?.raw).toMatch(/^\d+$/);
    expect(p.points).toHaveLength(measurePlaces(rect.spec, j).length - 3);
  });

  it("reads levels in the file's units: millimetres or metres with a unit, inches with fractions", () => {
    expect(readLevel("52", "metric")).toBeCloseTo(0.052, 12);
    expect(readLevel("0.052 m", "metric")).toBeCloseTo(0.052, 12);
    expect(readLevel("1-1/2", "us")).toBeCloseTo(0.0381, 12);
    expect(readLevel("0' 1 1/2\"", "us")).toBeCloseTo(0.0381, 12);
    expect(readLevel("38 mm", "us")).toMatch(/metric/);
    expect(readLevel("abc", "metric")).toMatch(/not a number/);
  });
});
