import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { scheduleCsv } from "~/lib/pack/schedule-csv";
import { sheetData } from "~/lib/pack/sheet-data";
import {
  addRidge,
  addRidgePoint,
  defaultRidge,
  deleteRidge,
  deleteRidgePoint,
  setRidgePoint,
} from "~/components/sandbox/state/spec-edit";
import { parseSpec, type RoofSpec } from "~/engine";
import { packOf, U_ROOF } from "./fixtures";

// The U roof cut at x = 6 from the south wall to the notch (6, 3): two areas, outlet O1 (0, 2)
// in the west one, O2 (12, 6) in the east one; a hatch in the west area.
const spec: RoofSpec = {
  ...U_ROOF,
  openings: [
    {
      outline: [
        [1, 4],
        [2, 4],
        [2, 5],
        [1, 5],
      ],
      kind: "hatch",
    },
  ],
  ridges: [
    {
      line: [
        [6, 0],
        [6, 3],
      ],
    },
  ],
};

describe("the check sheet and the drop schedule CSV list openings, ridges and areas", () => {
  const pack = packOf(spec);
  const csv = scheduleCsv(pack);
  const rows = Papa.parse<string[]>(csv, { skipEmptyLines: true }).data;

  it("the CSV's header block has a line per opening, ridge and area", () => {
    const opening = rows.find((r) => r[0] === "opening")!;
    expect(opening.slice(0, 5)).toEqual(["opening", "1", "hatch", "150", "1"]);
    expect(opening[5]).toBe("1 4; 2 4; 2 5; 1 5");
    const ridge = rows.find((r) => r[0] === "ridge")!;
    expect(ridge.slice(0, 4)).toEqual(["ridge", "1", "divide", "6 0; 6 3"]);
    const areas = rows.filter((r) => r[0] === "area" && r[1] !== "joist");
    expect(areas).toHaveLength(2);
    // Drained areas: the U is 12 × 8 less its 4 × 5 notch = 76 m², cut in two halves of 38 m²
    // by the ridge at x = 6; the west one less the 1 m² hatch: 37 m².
    expect(areas.map((r) => Number(r[2])).sort()).toEqual([37, 38]);
  });

  it("the schedule table has an area column agreeing with each joist's area", () => {
    const head = rows.findIndex((r) => r[0] === "area" && r[1] === "joist");
    expect(head).toBeGreaterThan(0);
    const table = rows.slice(head + 1);
    const spans = pack.analysis.shaped.joists.flatMap((j) => j.spans.map(() => String(j.area + 1)));
    expect(table.map((r) => r[0])).toEqual(spans);
    expect(new Set(spans).size).toBe(2);
  });

  it("the sheet has the same lists as tables", () => {
    const sheet = sheetData(pack);
    const titles = sheet.tables.map((t) => t.title);
    expect(titles).toEqual(expect.arrayContaining(["Openings", "Ridges", "Drainage areas"]));
    const areas = sheet.tables.find((t) => t.title === "Drainage areas")!;
    expect(areas.rows.map((r) => r[1]).sort()).toEqual(["37.0 m²", "38.0 m²"]);
    const schedule = sheet.tables.find((t) => t.title.startsWith("Drop schedule"))!;
    expect(schedule.header[0]).toBe("area");
  });
});

describe("ridge edits in the sandbox (undoable spec edits)", () => {
  const rect: RoofSpec = {
    outline: [
      [0, 0],
      [20, 0],
      [20, 10],
      [0, 10],
    ],
    outlets: [{ at: [5, 0] }, { at: [15, 0] }],
    baseFall: "1:40",
  };

  it("the default ridge runs wall to wall across the middle and divides the roof", () => {
    const r = defaultRidge(rect);
    expect(r.line).toEqual([
      [10, 0],
      [10, 10],
    ]);
    const parsed = parseSpec(addRidge(rect, r));
    expect(parsed.ok).toBe(true);
  });

  it("moves, bends, unbends and deletes a ridge", () => {
    let s = addRidge(rect, defaultRidge(rect));
    s = setRidgePoint(s, 0, 1, [12, 10]);
    expect(s.ridges![0].line[1]).toEqual([12, 10]);
    s = addRidgePoint(s, 0);
    expect(s.ridges![0].line).toEqual([
      [10, 0],
      [11, 5],
      [12, 10],
    ]);
    s = deleteRidgePoint(s, 0, 1);
    expect(s.ridges![0].line).toHaveLength(2);
    // A ridge keeps at least its two ends.
    expect(deleteRidgePoint(s, 0, 0).ridges![0].line).toHaveLength(2);
    expect(deleteRidge(s, 0).ridges).toBeUndefined();
  });
});
