import { create, fractionDependencies, unitDependencies } from "mathjs";
import { describe, expect, it, vi } from "vitest";
import { convert, parsePlainLength, type LengthKind, type UnitSystem } from "~/lib/units";
import { parseLength } from "~/lib/units-reader";

const math = create({ unitDependencies, fractionDependencies });

let seed = 11;
const random = () => ((seed = (seed * 16807) % 2147483647) - 1) / 2147483646;
const samples = (n: number, top: number) =>
  Array.from({ length: n }, (_, i) => Number((random() * top).toFixed(i % 6)));

describe("units without mathjs on the page (docs/decisions/0015-lazy-unit-reader.md)", () => {
  it("the formatters' conversions are bit for bit mathjs' own", () => {
    for (const v of samples(4000, 5000)) {
      expect(convert(v, [["m", 1]], [["inch", 1]])).toBe(math.unit(v, "m").toNumber("inch"));
      expect(convert(v, [["m", 2]], [["ft", 2]])).toBe(math.unit(v, "m^2").toNumber("ft^2"));
      expect(
        convert(
          v,
          [
            ["L", 1],
            ["s", -1],
          ],
          [
            ["gal", 1],
            ["minute", -1],
          ],
        ),
      ).toBe(math.unit(v, "L/s").toNumber("gal/minute"));
      expect(convert(v, [["mm", 1]], [["inch", 1]])).toBe(math.unit(v, "mm").toNumber("inch"));
    }
  });

  it("a plain number is read exactly as the mathjs reader reads it, in every system and kind", () => {
    const texts = ["0", "1", "1.", ".5", "12.5", "-3", "−2.25", "2,5", " 7 ", "", "0.0254", "1".repeat(41)];
    for (const v of samples(1500, 300)) texts.push(String(v), `-${v}`);
    let compared = 0;
    for (const system of ["metric", "us"] as UnitSystem[])
      for (const kind of ["length", "level"] as LengthKind[])
        for (const text of texts) {
          const fast = parsePlainLength(text, system, kind);
          expect(fast, text).not.toBeNull();
          expect([text, fast]).toEqual([text, parseLength(text, system, kind)]);
          compared++;
        }
    expect(compared).toBeGreaterThan(10_000);
  });

  it("leaves anything beyond a plain number to the reader, which loads on demand", async () => {
    for (const text of ["12' 6\"", "6 1/2 in", "150 mm", "3.5m", "1e3", "+2", "2,5 m"])
      expect(parsePlainLength(text, "us", "length")).toBeNull();
    vi.resetModules();
    const units = await import("~/lib/units");
    expect(units.readLength("12' 6\"", "us", "length")).toBeNull();
    expect(units.readLength("12.5", "us", "length")).toEqual(parseLength("12.5", "us", "length"));
    await units.loadLengthReader();
    for (const text of ["12' 6\"", "6 1/2 in", "150 mm", "3.5m", "2,5 m", "1/0 in", "3 kg"])
      expect(units.readLength(text, "us", "length")).toEqual(parseLength(text, "us", "length"));
  });
});
