import { readFileSync } from "node:fs";
import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { report, scheduleCsv } from "~/cli/analyse";
import { analyseSpec } from "./helpers";

describe("npm run analyse", () => {
  for (const name of ["workshop-l", "garage-eaves"]) {
    const spec = JSON.parse(readFileSync(new URL(`../../../app/cli/examples/${name}.json`, import.meta.url), "utf8"));
    const a = analyseSpec(spec);

    it(`${name}: the CSV has one row per joist span with levels in millimetres`, () => {
      const text = scheduleCsv(a, spec, name);
      expect(text.split("\r\n")[1]).toBe(`roof,${name}${",".repeat(text.split("\r\n")[1].split(",").length - 2)}`);
      // The table starts after the header block's empty line.
      const lines = text.split("\r\n");
      const table = lines.slice(lines.findIndex((l) => /^,*$/.test(l)) + 1).join("\r\n");
      const csv = Papa.parse<Record<string, string>>(table, { header: true, skipEmptyLines: true });
      const spans = a.shaped.joists.flatMap((j) => j.spans);
      expect(csv.data).toHaveLength(spans.length);
      expect(csv.meta.fields).toContain("start_drop_below_H_mm");
      const first = csv.data[0];
      expect(Number(first.start_level_mm)).toBe(Math.round(spans[0].startLevel * 1000));
      expect(Number(first.start_drop_below_H_mm) + Number(first.start_level_mm)).toBeCloseTo(
        Math.round(a.shaped.highLevel * 1000),
        -0.5,
      );
    });

    it(`${name}: the report prints the high level, longest fall line and every warning`, () => {
      const text = report(a, name);
      expect(text).toContain(`${Math.round(a.shaped.highLevel * 1000)} mm`);
      if (a.shaped.longestFallLine) expect(text).toContain(`${a.shaped.longestFallLine.length.toFixed(2)} m`);
      for (const w of a.warnings) expect(text).toContain(`[${w.code}]`);
    });
  }
});
