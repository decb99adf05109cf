import { describe, expect, it } from "vitest";
import { analyse, parseSpec } from "~/engine";
import { buildFigure } from "~/lib/lessons/figures.server";
import type { Figure } from "~/lib/lessons/schema";

// Issue 16, item 8: lesson figures are vector drawings of the engine's own faces, not raster cells.
const SPEC = {
  outline: [
    [0, 0],
    [12, 0],
    [12, 6],
    [0, 6],
  ],
  outlets: [{ at: [6, 0] }],
  baseFall: "1:60",
  joists: { spacing: 0.4, direction: [1, 0] },
};
const figure = (view: Figure["view"]) => ({ caption: "test", view, spec: structuredClone(SPEC) }) as Figure;

/** Triangles "MxyLxyLxyZ" of a path, and their total area (shoelace). */
function triangles(d: string): number[][] {
  return [...d.matchAll(/M(-?[\d.]+) (-?[\d.]+)L(-?[\d.]+) (-?[\d.]+)L(-?[\d.]+) (-?[\d.]+)Z/g)].map((m) =>
    m.slice(1).map(Number),
  );
}
const areaOf = (d: string) =>
  triangles(d).reduce(
    (s, [x0, y0, x1, y1, x2, y2]) => s + Math.abs((x1 - x0) * (y2 - y0) - (x2 - x0) * (y1 - y0)) / 2,
    0,
  );

describe("lesson fall-map figures", () => {
  it("are drawn as triangles in plan metres (no raster grid), covering the whole roof", () => {
    const f = buildFigure(figure("plan"));
    expect(f.error).toBeNull();
    expect(f.grid).toBeNull();
    const all = f.fills.map((g) => g.d).join("");
    // Only move/line/close commands: no h/v runs of a cell raster.
    expect(all).toMatch(/^[MLZ0-9. -]+$/);
    expect(areaOf(all)).toBeCloseTo(72, 0);
    for (const [x0, y0] of triangles(all)) {
      expect(x0).toBeGreaterThanOrEqual(-1e-6);
      expect(x0).toBeLessThanOrEqual(12 + 1e-6);
      expect(-y0).toBeGreaterThanOrEqual(-1e-6);
      expect(-y0).toBeLessThanOrEqual(6 + 1e-6);
    }
  });

  it("hatches about the area the engine reports flatter than the minimum", () => {
    const f = buildFigure(figure("plan"));
    const parsed = parseSpec(structuredClone(SPEC));
    if (!parsed.ok) throw new Error("spec");
    const reported = analyse(parsed.spec).shaped.fallMap.flatterThanMinimumArea;
    expect(reported).toBeGreaterThan(30);
    // The figure uses a coarser mesh than the engine's answer: agreement within 15 % of the roof.
    expect(Math.abs(areaOf(f.flat) - reported)).toBeLessThan(0.15 * 72);
  });
});
