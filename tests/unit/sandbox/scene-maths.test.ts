import { describe, expect, it } from "vitest";
import { analyse, parseSpec, type RoofSpec } from "~/engine";
import { contourSegments } from "~/components/sandbox/view-3d/contours";
import { DEMO_ROOF } from "~/components/sandbox/state/demo-roof";
import { cividis, fallPosition, SCALE_FLAT, SCALE_STEEP } from "~/lib/fall-colour";
import { gutterSurface, openEdgeSurface, WALL_FACE } from "~/components/sandbox/view-3d/layout-scenes";
import { MeshSampler } from "~/components/sandbox/view-3d/mesh-sample";

function analysed(spec: RoofSpec) {
  const parsed = parseSpec(structuredClone(spec));
  if (!parsed.ok) throw new Error(parsed.error.message);
  return { spec: parsed.spec, analysis: analyse(parsed.spec) };
}

function planArea(positions: number[], indices: number[], faceRatio: (number | null)[]) {
  let sum = 0;
  for (let f = 0; f < indices.length / 3; f++) {
    if (faceRatio[f] === WALL_FACE) continue;
    const [a, b, c] = [indices[3 * f] * 3, indices[3 * f + 1] * 3, indices[3 * f + 2] * 3];
    sum +=
      Math.abs(
        (positions[b] - positions[a]) * (positions[c + 1] - positions[a + 1]) -
          (positions[c] - positions[a]) * (positions[b + 1] - positions[a + 1]),
      ) / 2;
  }
  return sum;
}

describe("fall colour scale", () => {
  it("is cividis: matches the published table within the polynomial fit's error", () => {
    // matplotlib's _cividis_data (Nuñez, Anderton & Renslow 2018), entries 0, 128 and 255 as 0..1 floats.
    const table: [number, [number, number, number]][] = [
      [0, [0.0, 0.135112, 0.304751]],
      [128 / 255, [0.488697, 0.485318, 0.471008]],
      [1, [0.995737, 0.909344, 0.217772]],
    ];
    for (const [t, rgb] of table) {
      const got = cividis(t);
      // The degree-5 fit strays up to about 13/255 (blue, at the yellow end).
      rgb.forEach((v, k) => expect(Math.abs(got[k] - v * 255)).toBeLessThanOrEqual(14));
    }
  });

  it("gets lighter all the way along (cividis is designed with monotone lightness)", () => {
    let last = -1;
    for (let i = 0; i <= 50; i++) {
      const [r, g, b] = cividis(i / 50);
      const luma = 0.2126 * r + 0.7152 * g + 0.0722 * b;
      expect(luma).toBeGreaterThan(last - 0.5);
      last = luma;
    }
  });

  it("places falls on a log scale of N, level faces at the flat end", () => {
    expect(fallPosition(SCALE_STEEP)).toBe(0);
    expect(fallPosition(SCALE_FLAT)).toBe(1);
    expect(fallPosition(Math.sqrt(SCALE_STEEP * SCALE_FLAT))).toBeCloseTo(0.5, 12);
    expect(fallPosition(null)).toBe(1);
    expect(fallPosition(5)).toBe(0);
  });
});

describe("contours", () => {
  it("cut a plane z = x/10 into straight lines of the right level and length", () => {
    // Unit square in two triangles.
    const positions = [0, 0, 0, 1, 0, 0.1, 1, 1, 0.1, 0, 1, 0];
    const indices = [0, 1, 2, 0, 2, 3];
    const seg = contourSegments(positions, indices, 0.025);
    const byLevel = new Map<number, number>();
    for (let i = 0; i < seg.length; i += 6) {
      expect(seg[i + 2]).toBeCloseTo(seg[i + 5], 6);
      expect(seg[i]).toBeCloseTo(seg[i + 2] * 10, 5);
      const len = Math.hypot(seg[i + 3] - seg[i], seg[i + 4] - seg[i + 1]);
      const level = Math.round(seg[i + 2] * 1000);
      byLevel.set(level, (byLevel.get(level) ?? 0) + len);
    }
    expect([...byLevel.keys()].sort((a, b) => a - b)).toEqual([25, 50, 75]);
    for (const total of byLevel.values()) expect(total).toBeCloseTo(1, 5);
  });
});

describe("levels read off the engine's mesh", () => {
  it("match the engine's own probes (chord rule, docs/roof-method.md §4) within a millimetre", () => {
    const points: [number, number][] = [
      [1, 1],
      [6, 4],
      [11.5, 7.5],
      [3.3, 0.2],
      [9.1, 6.6],
      [6, 0],
      [12, 8],
    ];
    const { analysis } = analysed({ ...DEMO_ROOF, probes: points });
    const sampler = new MeshSampler(analysis.shaped.mesh!);
    analysis.shaped.probes.forEach((probe) => {
      expect(sampler.levelAt(probe.at[0], probe.at[1])).toBeCloseTo(probe.level!, 3);
    });
    expect(sampler.levelAt(20, 20)).toBeNull();
  });
});

describe("comparison layouts rebuilt for drawing", () => {
  const { spec, analysis } = analysed(DEMO_ROOF);

  it("gutter layout: field rises from the engine's lip to the engine's high level; the sole starts at the outlet", () => {
    const g = gutterSurface(spec, analysis)!;
    expect(g).not.toBeNull();
    // docs/roof-method.md §8 on this rectangle: H = lip + base fall × (8 m - gutter width).
    expect(g.high).toBeCloseTo(analysis.gutter.highLevel!, 9);
    expect(g.levelAt(6, 0)).toBeCloseTo(0, 12);
    expect(g.levelAt(6, 8)).toBeCloseTo(analysis.gutter.highLevel!, 9);
    expect(g.levelAt(3, analysis.gutter.width + 1e-6)).toBeCloseTo(analysis.gutter.lipLevel!, 6);
    // Sole at a gutter end: outlet level + 6 m at the gutter fall.
    expect(g.levelAt(0, 0.1)).toBeCloseTo(6 / analysis.gutter.fall.ratio, 9);
    expect(planArea(g.positions, g.indices, g.faceRatio)).toBeCloseTo(analysis.area, 6);
    expect(g.faceRatio.some((r) => r === WALL_FACE)).toBe(true);
  });

  it("gutter layout with facing gutters ridges half-way", () => {
    const two = analysed({ ...DEMO_ROOF, outlets: [{ at: [6, 0] }, { at: [6, 8] }] });
    const g = gutterSurface(two.spec, two.analysis)!;
    expect(g.high).toBeCloseTo(two.analysis.gutter.highLevel!, 9);
    expect(g.levelAt(6, 4)).toBeCloseTo(two.analysis.gutter.highLevel!, 9);
    expect(planArea(g.positions, g.indices, g.faceRatio)).toBeCloseTo(two.analysis.area, 6);
  });

  it("is not drawn when the engine says the gutter layout is not comparable", () => {
    const odd = analysed({ ...DEMO_ROOF, outlets: [{ at: [6, 0] }, { at: [12, 4] }] });
    expect(odd.analysis.gutter.comparable).toBe(false);
    expect(gutterSurface(odd.spec, odd.analysis)).toBeNull();
  });

  it("open edge: one plane at the base fall up to the engine's high level", () => {
    const o = openEdgeSurface(spec, analysis);
    expect(o.high).toBeCloseTo(analysis.openEdge.highLevel, 9);
    expect(o.levelAt(3, 8)).toBeCloseTo(analysis.openEdge.highLevel, 9);
    expect(planArea(o.positions, o.indices, o.faceRatio)).toBeCloseTo(analysis.area, 6);
    for (const r of o.faceRatio) expect(r).toBeCloseTo(analysis.baseFall.ratio, 6);
  });
});
