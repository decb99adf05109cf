import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { scheduleCsv as cliScheduleCsv } from "~/cli/analyse";
import { DEMO_ROOF } from "~/components/sandbox/state/demo-roof";
import { CAUTION_LINE } from "~/lib/caution";
import { directionDegrees, packFileName } from "~/lib/pack/facts";
import { scheduleCsv, scheduleFileName } from "~/lib/pack/schedule-csv";
import { scheduleRows } from "~/lib/pack/schedule-rows";
import { NASTY_NAME, packOf, U_ROOF } from "./fixtures";

/** The CSV read back with papaparse: the header block as key → values, then the table. */
function readBack(csv: string) {
  const rows = Papa.parse<string[]>(csv.replace(/^\uFEFF/, ""), { skipEmptyLines: false }).data;
  const blank = rows.findIndex((r) => r.every((c) => c === ""));
  const header = new Map<string, string[]>();
  const outlets: string[][] = [];
  for (const r of rows.slice(0, blank)) {
    const cells = r.filter((c, i) => i === 0 || c !== "" || r.slice(i).some((x) => x !== ""));
    if (cells[0] === "outlet") outlets.push(cells.slice(1));
    else header.set(cells[0], cells.slice(1));
  }
  const table = Papa.parse<Record<string, string>>(
    rows
      .slice(blank + 1)
      .map((r) => Papa.unparse([r]))
      .join("\n"),
    { header: true, skipEmptyLines: true },
  );
  return { header, outlets, table: table.data, fields: table.meta.fields ?? [] };
}

describe("drop schedule CSV", () => {
  const pack = packOf(U_ROOF, "Annex roof");
  const a = pack.analysis;
  const csv = scheduleCsv(pack);
  const back = readBack(csv);

  it("has a header block whose values equal the analysis", () => {
    expect(back.header.get("roof")).toEqual(["Annex roof"]);
    expect(back.header.get("date")).toEqual(["2026-12-04"]);
    expect(back.header.get("units")?.[0]).toMatch(/metres.*millimetres/);
    expect(Number(back.header.get("high_level_H_mm")![0])).toBe(Math.round(a.shaped.highLevel * 1000));
    expect(back.header.get("datum")![0]).toContain(`H = ${Math.round(a.shaped.highLevel * 1000)} mm`);
    expect(Number(back.header.get("joist_spacing_mm")![0])).toBe(500);
    // Joists along x: 0° from the x axis (the settings panel enters degrees the same way).
    expect(Number(back.header.get("joist_direction_deg")![0])).toBe(0);
    expect(back.header.get("caution")).toEqual([CAUTION_LINE]);
    expect(back.outlets.map((o) => o.slice(0, 4).map(Number))).toEqual([
      [1, 0, 2, 0],
      [2, 12, 6, -20],
    ]);
    // Set out from the outlets: outlet 1 (y = 2) and outlet 2 (y = 6) are 4 m = 8 × 0.5 m apart, both on joists.
    expect(back.outlets.map((o) => o[4])).toEqual(a.shaped.setOut.outlets.map((o) => `on joist ${o.joist}`));
  });

  it("has one row per joist span whose levels and drops equal the analysis", () => {
    const spans = a.shaped.joists.flatMap((j) => j.spans.map((s) => ({ j, s })));
    const mm = (m: number) => Math.round(m * 1000) + 0;
    expect(back.table).toHaveLength(spans.length);
    back.table.forEach((row, i) => {
      const { j, s } = spans[i];
      expect(Number(row.joist)).toBe(j.index + 1);
      expect(Number(row.start_level_mm)).toBe(mm(s.startLevel));
      expect(Number(row.end_level_mm)).toBe(mm(s.endLevel));
      expect(Number(row.start_drop_below_H_mm)).toBe(mm(s.startDrop));
      expect(Number(row.end_drop_below_H_mm)).toBe(mm(s.endDrop));
      expect(Number(row.start_x_m)).toBeCloseTo(s.start[0], 3);
      expect(Number(row.end_y_m)).toBeCloseTo(s.end[1], 3);
    });
  });

  it("numbers spans only where a joist has more than one, and drops the column when none has", () => {
    expect(back.fields[1]).toBe("span");
    const two = a.shaped.joists.find((j) => j.spans.length === 2)!;
    const one = a.shaped.joists.find((j) => j.spans.length === 1)!;
    expect(back.table.filter((r) => Number(r.joist) === two.index + 1).map((r) => r.span)).toEqual(["1", "2"]);
    expect(back.table.filter((r) => Number(r.joist) === one.index + 1).map((r) => r.span)).toEqual([""]);
    const rect = readBack(scheduleCsv(packOf(DEMO_ROOF)));
    expect(rect.fields).not.toContain("span");
    expect(rect.fields).toContain("end_drop_below_H_mm");
  });

  it("keeps a name with commas, quotes and a leading = as text a spreadsheet will not run", () => {
    const nasty = scheduleCsv(packOf(U_ROOF, NASTY_NAME));
    expect(readBack(nasty).header.get("roof")).toEqual([`'${NASTY_NAME}`]);
    // No line of the file starts a cell with a formula character.
    for (const line of nasty.split("\r\n")) expect(line).not.toMatch(/(^|,)"?[=+@]/);
    // Negative numbers stay numbers (only text is guarded).
    expect(nasty).toContain(",-20,");
  });

  it("is named after the roof and the date, with safe characters only", () => {
    expect(scheduleFileName(pack)).toBe("annex-roof-drop-schedule-2026-12-04.csv");
    expect(scheduleFileName({ name: NASTY_NAME, date: pack.date })).toBe(
      "hyperlink-http-x-invalid-click-annex-b-east-drop-schedule-2026-12-04.csv",
    );
    expect(packFileName("../../etc/passwd\r\nX: y", "plan", pack.date, "dxf")).toBe(
      "etc-passwd-x-y-plan-2026-12-04.dxf",
    );
    expect(packFileName("屋根", "plan", pack.date, "dxf")).toBe("roof-plan-2026-12-04.dxf");
  });

  it("is the same file from npm run analyse", () => {
    expect(cliScheduleCsv(a, pack.spec, "Annex roof", pack.date)).toBe(csv);
  });

  it("reads joist directions in degrees like the settings panel (0 ≤ a < 180)", () => {
    expect(directionDegrees([0, 1])).toBe(90);
    expect(directionDegrees([0, -1])).toBe(90);
    expect(directionDegrees([Math.cos(Math.PI / 6), Math.sin(Math.PI / 6)])).toBe(30);
    expect(directionDegrees([-1, -1e-12])).toBe(0);
    expect(scheduleRows(a.shaped.joists)).toHaveLength(back.table.length);
  });
});
