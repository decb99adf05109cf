import { describe, expect, it } from "vitest";
import type { RoofSpec } from "~/engine";
import { readRoofFile, roofFileName, writeRoofFile } from "~/lib/roof-file";
import { calibrate, parseLength, pixelToPlan, planToPixel, retraceSpec } from "~/lib/underlay";

describe("roof file format", () => {
  const spec = {
    outline: [
      [0, 0],
      [5, 0],
      [5, 4],
      [0, 4],
    ],
    baseFall: "1:60",
  };

  it("round-trips a roof, with or without underlay placement", () => {
    const file = writeRoofFile({ name: "Porch", spec }, new Date("2027-01-02T03:04:05Z"));
    expect(file).toEqual({
      format: "fallwright-roof",
      version: 1,
      name: "Porch",
      exportedAt: "2027-01-02T03:04:05.000Z",
      spec,
    });
    const back = readRoofFile(JSON.stringify(file));
    expect(back).toEqual({ ok: true, file });
    const u = { opacity: 0.5, originX: 1, originY: 2, metresPerPixel: 0.01, widthPx: 100, heightPx: 80 };
    const withUnderlay = readRoofFile(JSON.stringify(writeRoofFile({ name: "Porch", spec, underlay: u })));
    expect(withUnderlay.ok && withUnderlay.file.underlay).toEqual(u);
  });

  it("names what is wrong: not JSON, not ours, an unknown version, a damaged envelope", () => {
    expect(readRoofFile("{")).toMatchObject({ ok: false, message: expect.stringMatching(/not JSON/) });
    expect(readRoofFile("[1,2]")).toMatchObject({
      ok: false,
      message: expect.stringMatching(/not a Fallwright roof file/),
    });
    expect(readRoofFile(JSON.stringify({ format: "fallwright-roof", version: 3, name: "x", spec }))).toMatchObject({
      ok: false,
      message: "This roof file is format version 3; this Fallwright reads version 1 only.",
    });
    expect(readRoofFile(JSON.stringify({ format: "fallwright-roof", name: "x", spec }))).toMatchObject({
      ok: false,
      message: expect.stringMatching(/no format version/),
    });
    expect(readRoofFile(JSON.stringify({ format: "fallwright-roof", version: 1, name: "", spec }))).toMatchObject({
      ok: false,
      message: expect.stringMatching(/damaged: name/),
    });
    expect(
      readRoofFile(
        JSON.stringify({ format: "fallwright-roof", version: 1, name: "x", spec, underlay: { opacity: 3 } }),
      ),
    ).toMatchObject({ ok: false, message: expect.stringMatching(/damaged: underlay/) });
    expect(readRoofFile("x".repeat(300 * 1024))).toMatchObject({
      ok: false,
      message: expect.stringMatching(/over 256 kB/),
    });
  });

  it("makes safe download names", () => {
    expect(roofFileName("Shop roofs 4-8, Quayside Row")).toBe("shop-roofs-4-8-quayside-row.fallwright.json");
    expect(roofFileName('../"evil"\r\n')).toBe("evil.fallwright.json");
    expect(roofFileName("   ")).toBe("roof.fallwright.json");
  });
});

describe("underlay scale", () => {
  it("reads distances with units; a bare number is metres", () => {
    expect(parseLength("12 m")).toEqual({ ok: true, metres: 12 });
    expect(parseLength("12000 mm")).toEqual({ ok: true, metres: 12 });
    expect(parseLength("1200cm")).toEqual({ ok: true, metres: 12 });
    expect(parseLength("7,5")).toEqual({ ok: true, metres: 7.5 });
    expect(parseLength("12,000 mm")).toEqual({ ok: true, metres: 12 });
    // 1 ft = 0.3048 m exactly (international yard and pound agreement, 1959).
    const ft = parseLength("10 ft");
    expect(ft.ok && ft.metres).toBeCloseTo(3.048, 12);
    expect(parseLength("12 kg")).toMatchObject({ ok: false, message: expect.stringMatching(/not a length/) });
    expect(parseLength("twelve")).toMatchObject({ ok: false });
    expect(parseLength("0 m")).toMatchObject({ ok: false });
    expect(parseLength("")).toMatchObject({ ok: false });
  });

  it("calibrates from two points: the picked distance becomes the typed one, point A stays put", () => {
    const u = { opacity: 0.5, originX: 2, originY: 10, metresPerPixel: 0.05, widthPx: 800, heightPx: 500 };
    const a: [number, number] = [100, 400];
    const b: [number, number] = [400, 800];
    const next = calibrate(u, a, b, 12)!;
    const [ax, ay] = pixelToPlan(next, ...a);
    const [bx, by] = pixelToPlan(next, ...b);
    expect(Math.hypot(bx - ax, by - ay)).toBeCloseTo(12, 12);
    expect([ax, ay]).toEqual(pixelToPlan(u, ...a));
    expect(next.metresPerPixel).toBeCloseTo(12 / 500, 15);
    expect(planToPixel(next, bx, by)[0]).toBeCloseTo(400, 9);
    expect(planToPixel(next, bx, by)[1]).toBeCloseTo(800, 9);
    expect(calibrate(u, a, a, 12)).toBeNull();
  });

  it("retracing keeps the other settings, resets edge kinds and moves outlets onto the new outline", () => {
    const spec: RoofSpec = {
      outline: [
        [0, 0],
        [24, 0],
        [24, 7.5],
        [0, 7.5],
      ],
      edges: ["parapet", "eaves", "parapet", "parapet"],
      outlets: [{ at: [12, 0], size: 0.1 }],
      baseFall: "1:60",
    };
    const traced = retraceSpec(spec, [
      [3, -4.5],
      [15, -4.5],
      [15, 1.5],
      [3, 1.5],
    ]);
    expect(traced).toEqual({
      outline: [
        [3, -4.5],
        [15, -4.5],
        [15, 1.5],
        [3, 1.5],
      ],
      outlets: [{ at: [12, 1.5], size: 0.1 }],
      baseFall: "1:60",
    });
    expect(spec.outline).toHaveLength(4);
    expect(spec.edges).toHaveLength(4);
  });
});
