import { describe, expect, it } from "vitest";
import {
  cividis,
  contrastRatio,
  HATCH_INK,
  HATCH_MIX,
  hexRgb,
  relativeLuminance,
  SHADE_MIN,
  WATER_DARK,
  WATER_LIGHT,
} from "~/lib/fall-colour";

type Rgb = [number, number, number];
const scale = (c: Rgb, k: number): Rgb => c.map((v) => Math.round(v * k)) as Rgb;
const mix = (a: Rgb, b: Rgb, t: number): Rgb => a.map((v, i) => Math.round(v + (b[i] - v) * t)) as Rgb;

/** Every colour a face can show: the whole fall scale, shaded from SHADE_MIN to full, plain and hatched. */
function faceColours(): Rgb[] {
  const out: Rgb[] = [];
  for (let i = 0; i <= 100; i++) {
    for (const light of [SHADE_MIN, (SHADE_MIN + 1) / 2, 1]) {
      const c = scale(cividis(i / 100), light);
      out.push(c, mix(c, HATCH_INK, HATCH_MIX));
    }
  }
  return out;
}

describe("water paths against the fall map (WCAG 2.2 1.4.11 non-text contrast, 3:1)", () => {
  it("computes contrast as WCAG defines it (white on black 21:1; #767676 on white 4.54:1)", () => {
    expect(contrastRatio([255, 255, 255], [0, 0, 0])).toBeCloseTo(21, 6);
    expect(contrastRatio([0x76, 0x76, 0x76], [255, 255, 255])).toBeCloseTo(4.54, 2);
    expect(relativeLuminance([255, 255, 255])).toBeCloseTo(1, 9);
  });

  it("the two tones of a path contrast with each other, and one of them reaches 3:1 on every face colour", () => {
    const light = hexRgb(WATER_LIGHT);
    const dark = hexRgb(WATER_DARK);
    expect(contrastRatio(light, dark)).toBeGreaterThanOrEqual(3);
    let worst = Infinity;
    for (const face of faceColours()) {
      worst = Math.min(worst, Math.max(contrastRatio(light, face), contrastRatio(dark, face)));
    }
    expect(worst).toBeGreaterThanOrEqual(3);
  });

  it("the old single light cyan failed on the flat (yellow) end, which is why there are two tones", () => {
    const oldCyan = hexRgb("#7fdcff");
    const yellow = cividis(1);
    expect(contrastRatio(oldCyan, yellow)).toBeLessThan(3);
  });
});
