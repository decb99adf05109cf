import { create, unitDependencies } from "mathjs";
import polygonClipping from "polygon-clipping";
import { describe, expect, it } from "vitest";
import { designFlow, designFlowGpm, fallFromRatio, formatRatio, parseFall, RULE_SETS, ruleValue } from "~/engine";
import { analyseSpec, close, shoelace } from "./helpers";

const math = create({ unitDependencies });

describe("fall conversions (docs/check-values.md, Trigonometry: derived)", () => {
  // ratio 1:N has slope 1/N, percent 100/N, angle atan(1/N).
  const table: [string, number, number, number][] = [
    ["1:40", 40, 2.5, 1.432],
    ["1:48", 48, 2.083, 1.193],
    ["1:60", 60, 1.667, 0.955],
    ["1:80", 80, 1.25, 0.716],
    ["1:100", 100, 1.0, 0.573],
  ];
  it.each(table)("%s = %f → %f %% and %f°", (text, ratio, percent, degrees) => {
    const f = parseFall(text);
    if (!f.ok) throw new Error(f.error);
    close(f.ratio, ratio, 1e-9);
    close(f.percent, percent, 0.0005);
    close(f.degrees, degrees, 0.0005);
  });

  // N = 1 / tan(angle): 1° = 1:57.29; 1.5° = 1:38.19; 2° = 1:28.64; 3° = 1:19.08.
  it.each([
    ["1°", 57.29],
    ["1.5 deg", 38.19],
    ["2°", 28.64],
    ["2 deg", 28.64],
    ["3 degrees", 19.08],
  ] as const)("%s = 1:%f", (text, ratio) => {
    const f = parseFall(text);
    if (!f.ok) throw new Error(f.error);
    close(f.ratio, ratio, 0.005);
  });

  it("reads percent, mm/m and a bare ratio as the same fall (2.5 % = 25 mm/m = 1:40)", () => {
    for (const text of ["2.5%", "25 mm/m", "1 in 40", 40, "40"] as const) {
      const f = parseFall(text);
      if (!f.ok) throw new Error(f.error);
      close(f.ratio, 40, 1e-9);
      close(f.mmPerM, 25, 1e-9);
    }
  });

  it("1/4 in per 12 in is 1:48 (IBC 1507.10.1 minimum design slope, page)", () => {
    const f = parseFall("1/4 in/ft");
    if (!f.ok) throw new Error(f.error);
    close(f.ratio, 48, 1e-9);
  });

  it("1/4:12, the way US roofers write the IBC minimum, is 1:48 and 2.083 % (IBC 2018 1507.10.1; 0.25/12 = 1/48)", () => {
    for (const text of ["1/4:12", "1/4 : 12", "0.25:12", "1/4 in 12", '1/4" per ft', "1/4 in per ft", "3 in 144"]) {
      const f = parseFall(text);
      if (!f.ok) throw new Error(`${text}: ${f.error}`);
      close(f.ratio, 48, 1e-9);
      close(f.percent, 2.083, 0.0005);
    }
    const half = parseFall("1 1/2:12"); // a mixed number: 1.5 in per ft = 1:8
    if (!half.ok) throw new Error(half.error);
    close(half.ratio, 8, 1e-9);
    expect(parseFall("1/4:0").ok).toBe(false);
    expect(parseFall("1/0:12").ok).toBe(false);
  });

  it("agrees with mathjs's own angle conversion (mathjs units, from the npm registry)", () => {
    for (const deg of [0.5, 1, 2, 5, 30]) {
      const f = parseFall(`${deg} deg`);
      if (!f.ok) throw new Error(f.error);
      close(f.ratio, 1 / Math.tan(math.unit(deg, "deg").toNumber("rad")), 1e-9);
    }
  });

  it("formats ratios the way the product shows them", () => {
    expect(formatRatio(40)).toBe("1:40");
    expect(formatRatio(28.636)).toBe("1:28.6");
    expect(formatRatio(56.5685)).toBe("1:56.6");
    expect(formatRatio(Infinity)).toBe("level");
    expect(formatRatio(null)).toBe("level");
  });

  it("refuses things that are not falls", () => {
    for (const bad of ["", "banana", "2 m", "0", "-2%", "1:0", "89 deg", 0, -3, Number.NaN]) {
      expect(parseFall(bad as never).ok).toBe(false);
    }
  });
});

describe("warped bay (docs/check-values.md, Warped bays: derived, bilinear z = a + bx + cy + dxy)", () => {
  // Joists 4 m long (along y) from a level wall at 0 mm to a beam dropping 50 mm at x = 0 and
  // 150 mm at x = 6. Built here as the bay x ∈ [0, 6] of a 9 m × 4 m roof: wall y = 0 at
  // H = 0.15 (given), corner outlet (6, 4) at 0, so the beam edge y = 4 falls 0.15 over 9 m and
  // sits at 0.10 at x = 0. Levels relative to the wall are the docs/check-values.md bay.
  const a = analyseSpec({
    outline: [
      [-3, 0],
      [6, 0],
      [6, 4],
      [-3, 4],
    ],
    outlets: [{ at: [6, 4] }],
    highLevel: 0.15,
    baseFall: "1:40",
    probes: [
      [0, 0],
      [6, 0],
      [0, 4],
      [6, 4],
      [3, 2],
      [1.5, 1],
      [4.5, 3],
    ],
  });
  const z = (i: number) => (a.shaped.probes[i].level as number) - 0.15;

  it("corners at 0, 0, -50 and -150 mm; centre is their mean, -50 mm", () => {
    close(z(0), 0);
    close(z(1), 0);
    close(z(2), -0.05);
    close(z(3), -0.15);
    close(z(4), (0 + 0 - 0.05 - 0.15) / 4);
  });

  it("along the diagonal the surface is a parabola 25 mm above the straight chord at mid-diagonal", () => {
    const chordMid = (z(0) + z(3)) / 2;
    close(z(4) - chordMid, 0.025);
    // A parabola through the ends lies 4 × 25 mm × s(1 − s) above the chord: 18.75 mm at s = 1/4 and 3/4.
    close(z(5) - (z(0) + 0.25 * (z(3) - z(0))), 0.01875);
    close(z(6) - (z(0) + 0.75 * (z(3) - z(0))), 0.01875);
  });

  it("corner falls 1:80, 1:48, 1:26.7 and 1:24.4 from the engine's own surface", () => {
    const spec = {
      outline: [
        [-3, 0],
        [6, 0],
        [6, 4],
        [-3, 4],
      ],
      outlets: [{ at: [6, 4] }],
      highLevel: 0.15,
      baseFall: "1:40",
      probes: [] as [number, number][],
    };
    const h = 1e-4;
    const corners: [number, number, number, number][] = [
      [0, 0, 1, 1],
      [0, 4, 1, -1],
      [6, 0, -1, 1],
      [6, 4, -1, -1],
    ];
    for (const [x, y, sx, sy] of corners) spec.probes.push([x, y], [x + sx * h, y], [x, y + sy * h]);
    const p = analyseSpec(spec).shaped.probes.map((q) => q.level as number);
    const ratios = corners.map((c, k) => {
      const [z0, zx, zy] = p.slice(3 * k, 3 * k + 3);
      return 1 / Math.hypot((zx - z0) / h, (zy - z0) / h);
    });
    close(ratios[0], 80, 0.01);
    close(ratios[1], 48, 0.01);
    close(ratios[2], 26.67, 0.01);
    close(ratios[3], 24.37, 0.01);
  });
});

describe("valley: two planes falling at right angles meet at s1·s2/√(s1² + s2²) (docs/check-values.md, derived)", () => {
  it("two 1:40 planes give a 1:56.6 valley: the engine's square with a corner outlet", () => {
    // 16 × 16 square, outlet at (0, 0), joists along the diagonal: the chord rule gives two planes
    // z = H·x/16 and z = H·y/16 that meet along the diagonal. With the base fall on the diagonal
    // set to 1:(40·√2) = 1:56.57, H = 16√2/56.57 = 0.4 m and each plane falls 0.4/16 = 1:40; the
    // formula gives the valley (1/40)²/√(2·(1/40)²) = 1/(40·√2) = 1:56.57 back.
    const a = analyseSpec({
      outline: [
        [0, 0],
        [16, 0],
        [16, 16],
        [0, 16],
      ],
      outlets: [{ at: [0, 0] }],
      joists: { direction: [1, 1] },
      baseFall: `1:${40 * Math.SQRT2}`,
      probes: [
        [12, 2],
        [13, 2],
        [4, 12],
        [4, 13],
      ],
    });
    const z = a.shaped.probes.map((p) => p.level as number);
    close(1 / (z[1] - z[0]), 40, 1e-6); // the plane below the diagonal, along x
    close(1 / (z[3] - z[2]), 40, 1e-6); // the plane above it, along y
    const s = 1 / 40;
    close(a.shaped.longestFallLine!.ratio, 1 / ((s * s) / Math.sqrt(2 * s * s)), 1e-6);
    close(a.shaped.longestFallLine!.ratio, 56.57, 0.005);
  });

  it("matches the engine: a corner outlet with joists along the diagonal makes two planes and a valley", () => {
    // 16 × 12 rectangle, outlet at (0, 0), joists along (16, 12). Chord rule gives z = H·x/16
    // below the diagonal and z = H·y/12 above it; H = 20 m × 1/40 = 0.5.
    const a = analyseSpec({
      outline: [
        [0, 0],
        [16, 0],
        [16, 12],
        [0, 12],
      ],
      outlets: [{ at: [0, 0] }],
      joists: { direction: [16, 12] },
      baseFall: "1:40",
      probes: [
        [12, 2],
        [13, 2],
        [12, 3],
        [3, 8],
        [4, 8],
        [3, 9],
        [4, 3],
        [12, 9],
      ],
    });
    const z = a.shaped.probes.map((p) => p.level as number);
    const s1 = Math.hypot(z[1] - z[0], z[2] - z[0]); // per metre, below the diagonal
    const s2 = Math.hypot(z[4] - z[3], z[5] - z[3]); // above it
    close(s1, 0.5 / 16, 1e-9);
    close(s2, 0.5 / 12, 1e-9);
    const valley = (z[7] - z[6]) / Math.hypot(8, 6); // along the diagonal
    close(valley, (s1 * s2) / Math.hypot(s1, s2), 1e-9);
    close(a.shaped.longestFallLine!.ratio, 40, 1e-9);
  });
});

describe("design flow by the rational method (ASCE 7-05 Commentary C8, page)", () => {
  it("Q = 0.0104·A·i gpm: 11,500 ft² at 1.5 in/h ≈ 180 gpm (worked example, ASCE 7 style sheet)", () => {
    close(designFlowGpm(11_500, 1.5), 179.4, 0.05);
    expect(Math.round(designFlowGpm(11_500, 1.5) / 10) * 10).toBe(180);
  });

  it("Q[L/s] = i·A/3600 gives the same flow in SI (1 ft = 0.3048 m, 1 in = 25.4 mm, 1 L/s = 15.850 gpm)", () => {
    const areaM2 = 11_500 * 0.3048 ** 2;
    const intensity = 1.5 * 25.4;
    const lps = designFlow(intensity, areaM2);
    close(lps * 15.850323, designFlowGpm(11_500, 1.5), 0.01 * 180);
  });

  it("catchment flows in the analysis use i·A/3600", () => {
    const a = analyseSpec({
      outline: [
        [0, 0],
        [30, 0],
        [30, 20],
        [0, 20],
      ],
      outlets: [{ at: [15, 0] }],
      baseFall: "1:60",
      rainfall: { intensity: 120 },
    });
    close(a.shaped.catchments[0].flow, (120 * 600) / 3600, 1e-6);
    expect(a.rainfall).toEqual({ intensity: 120, assumed: false });
  });
});

describe("rule sets against their cited clauses (docs/check-values.md, Falls and gutters in published codes)", () => {
  it("IBC 1507.10.1-1507.15.1: 1/4 in per 12 in = 1:48 for membrane roofs (page)", () => {
    const v = RULE_SETS["us-ibc-2018"].values.fieldFall!;
    expect(v.value).toBe(48);
    expect(v.clause).toBe("1507.10.1-1507.15.1");
    expect(v.confidence).toBe("page");
    close(fallFromRatio(v.value).percent, 2.083, 0.001);
    // Applying it to every fall line is an interpretation, marked derived.
    const line = RULE_SETS["us-ibc-2018"].values.fallLine!;
    expect(line.confidence).toBe("derived");
    expect(line.note).toMatch(/interpretation/);
  });

  it("IPC 2015 1108.3: minimum scupper opening 4 in = 0.1016 m (page)", () => {
    const v = RULE_SETS["us-ibc-2018"].values.overflowOpening!;
    close(v.value, 4 * 0.0254, 1e-12);
    expect(v.clause).toBe("1108.3");
  });

  it("AS 4654.2-2012 cl 2.5.2: 1:100 to outlets; NCC 2019 Vol 2 Part 3.5.3 (installing gutters): box gutters 1:100; VBA 2016: 300 × 75 mm", () => {
    const set = RULE_SETS["au-ncc-2022"];
    const au = set.values;
    expect([au.fallLine!.value, au.fallLine!.clause]).toEqual([100, "2.5.2"]);
    // The installation clause, not 3.5.3.2 (clause number from memory, marked so); housing provisions, for houses.
    expect([au.gutterFall!.value, au.gutterFall!.clause, au.gutterFall!.confidence]).toEqual([
      100,
      "Part 3.5.3, installation of gutters",
      "memory",
    ]);
    expect(au.gutterFall!.document).toMatch(/houses/);
    // One set of editions throughout: the name cites the editions its values were read in.
    expect(set.name).toContain("NCC 2019");
    expect(set.name).not.toContain("NCC 2022");
    expect(JSON.stringify(set)).not.toContain("3.5.3.2");
    expect([au.gutterWidth!.value, au.gutterDepth!.value]).toEqual([0.3, 0.075]);
    expect([au.sumpDepth!.value, au.sumpDepth!.clause]).toEqual([0.15, "3.7.4(e)"]);
  });

  it("E2/AS1 8.1.6.1: internal gutter 300 mm wide, 70 mm deep; Table 1: 2° (editions conflict, noted)", () => {
    const nz = RULE_SETS["nz-e2-as1"].values;
    expect([nz.gutterWidth!.value, nz.gutterDepth!.value, nz.gutterDepth!.clause]).toEqual([0.3, 0.07, "8.1.6.1"]);
    close(nz.fieldFall!.value, 28.64, 0.005);
    expect(nz.fieldFall!.note).toMatch(/1\.5°/);
    expect(nz.gutterRainfallFactor!.value).toBe(2);
  });

  it("DIN 18531-1:2017 6.3.1: 2 % plan fall and 1 % valleys (part 1, as far as known; part 5 is balconies)", () => {
    const de = RULE_SETS["de-din-18531"].values;
    expect([de.fieldFall!.value, de.fieldFall!.clause]).toEqual([50, "6.3.1"]);
    expect([de.fallLine!.value, de.fallLine!.document, de.fallLine!.clause, de.fallLine!.confidence]).toEqual([
      100,
      "DIN 18531-1:2017",
      "6.3.1",
      "memory",
    ]);
  });

  it("BS 6229:2018: design 1:40 for 1:80 as built, with no clause found", () => {
    const uk = RULE_SETS["uk-bs-6229"].values;
    expect([uk.fieldFall!.value, uk.fallLine!.value]).toEqual([40, 80]);
    expect(uk.fieldFall!.clause).toBeNull();
    // 1:40 is design advice; 1:80 is an as-built value, applied to design fall lines by derivation.
    expect(uk.fieldFall!.note).toMatch(/design advice/);
    expect(uk.fallLine!.note).toMatch(/as-built/);
    expect(uk.fallLine!.confidence).toBe("derived");
  });

  it("labels trade habits as common practice, with no document or clause", () => {
    const cp = RULE_SETS["common-practice"];
    expect(cp.commonPractice).toBe(true);
    for (const v of Object.values(cp.values)) {
      expect(v!.confidence).toBe("common practice");
      expect(v!.clause).toBeNull();
    }
    expect([
      cp.values.gutterWidth!.value,
      cp.values.gutterDepth!.value,
      cp.values.gutterFall!.value,
      cp.values.fallLine!.value,
    ]).toEqual([0.3, 0.05, 100, 100]);
  });

  it("every value in every set names a document and a confidence; there are at least three jurisdictions", () => {
    const sets = Object.values(RULE_SETS);
    expect(sets.filter((s) => !s.commonPractice).length).toBeGreaterThanOrEqual(3);
    for (const set of sets) {
      for (const v of Object.values(set.values)) {
        expect(v!.document.length).toBeGreaterThan(3);
        expect(["page", "memory", "derived", "common practice"]).toContain(v!.confidence);
      }
    }
  });

  it("falls back to common practice, labelled, where a code gives no value", () => {
    const v = ruleValue("us-ibc-2018", "gutterWidth")!;
    expect(v.ruleSet).toBe("common-practice");
    expect(v.confidence).toBe("common practice");
  });

  it("an analysis says which set and clauses it used, and uses them", () => {
    const a = analyseSpec({
      outline: [
        [0, 0],
        [20, 0],
        [20, 10],
        [0, 10],
      ],
      outlets: [{ at: [10, 0] }],
      baseFall: "1:120",
      ruleSet: "au-ncc-2022",
    });
    expect(a.ruleSet.id).toBe("au-ncc-2022");
    const used = Object.fromEntries(a.ruleSet.used.map((u) => [u.key, u]));
    expect(used.fallLine.clause).toBe("2.5.2");
    expect(used.gutterDepth.value).toBe(0.075);
    expect(a.minFall.ratio).toBe(100);
    close(a.gutter.depth, 0.075);
    // 1:120 is flatter than AS 4654.2's 1:100: the warning cites the clause.
    expect(a.warnings.find((w) => w.code === "base-fall-below-rule")?.message).toMatch(/2\.5\.2/);
  });
});

describe("polygon area against polygon-clipping (npm, a general-purpose planar geometry library)", () => {
  const libraryArea = (outline: [number, number][]) => {
    const result = polygonClipping.union([[...outline, outline[0]]]);
    let total = 0;
    for (const polygon of result) {
      total += shoelace(polygon[0] as [number, number][]);
      for (const hole of polygon.slice(1)) total -= shoelace(hole as [number, number][]);
    }
    return total;
  };

  it.each([
    [
      "rectangle",
      [
        [0, 0],
        [20, 0],
        [20, 10],
        [0, 10],
      ],
    ],
    [
      "L-shape",
      [
        [0, 0],
        [10, 0],
        [10, 4],
        [4, 4],
        [4, 10],
        [0, 10],
      ],
    ],
    [
      "quadrilateral",
      [
        [0, 0],
        [10, 3],
        [12, 14],
        [-3, 9],
      ],
    ],
    [
      "U-shape, clockwise",
      [
        [0, 0],
        [0, 8],
        [3, 8],
        [3, 3],
        [7, 3],
        [7, 8],
        [10, 8],
        [10, 0],
      ],
    ],
  ] as [string, [number, number][]][])("%s: engine area and mesh area equal the library's", (_, outline) => {
    const a = analyseSpec(
      {
        outline,
        outlets: [{ at: [(outline[0][0] + outline[1][0]) / 2, (outline[0][1] + outline[1][1]) / 2] }],
        baseFall: "1:40",
      },
      { mesh: true, traces: false },
    );
    const expected = libraryArea(outline);
    close(a.area, expected, 1e-9 * expected);
    close(a.shaped.fallMap.area, expected, 1e-8 * expected);
  });

  it("a self-crossing outline is two pieces to the library and is refused by the engine", () => {
    const bowtie: [number, number][] = [
      [0, 0],
      [10, 10],
      [10, 0],
      [0, 10],
    ];
    expect(polygonClipping.union([[...bowtie, bowtie[0]]]).length).toBe(2);
    expect(() => analyseSpec({ outline: bowtie, outlets: [{ at: [5, 0] }], baseFall: "1:40" })).toThrow(/422/);
  });
});
