import DxfParser from "dxf-parser";
import { describe, expect, it } from "vitest";
import type { RoofSpec } from "~/engine";
import { CAUTION_LINE } from "~/lib/caution";
import { DXF_LAYERS, planDxf } from "~/lib/pack/plan-dxf";
import { packOf, U_ROOF } from "./fixtures";

// Read back with dxf-parser, a parser written independently of the writer (dxf-writer).
type Entity = {
  type: string;
  layer: string;
  vertices?: { x: number; y: number }[];
  text?: string;
  startPoint?: { x: number; y: number };
  center?: { x: number; y: number };
  radius?: number;
};
function parse(text: string) {
  const dxf = new DxfParser().parseSync(text) as unknown as {
    entities: Entity[];
    tables: { layer: { layers: Record<string, unknown> } };
    header: Record<string, unknown>;
  };
  return dxf;
}

describe("plan DXF", () => {
  const pack = packOf(U_ROOF, "Annex roof");
  const a = pack.analysis;
  const dxf = parse(planDxf(pack));
  const on = (layer: string, type?: string) =>
    dxf.entities.filter((e) => e.layer === layer && (!type || e.type === type));

  it("has layers named for what they hold, in metres ($INSUNITS 6)", () => {
    const names = Object.keys(dxf.tables.layer.layers);
    for (const [name] of Object.values(DXF_LAYERS)) expect(names).toContain(name);
    expect(dxf.header.$INSUNITS).toBe(6);
  });

  it("draws the outline on its layer, closed, through every vertex", () => {
    const [outline] = on(DXF_LAYERS.outline[0], "LWPOLYLINE");
    expect(outline.vertices!.map((v) => [v.x, v.y])).toEqual(U_ROOF.outline);
  });

  it("draws every joist span as a line, with both end levels as text equal to the analysis within 1 mm", () => {
    const spans = a.shaped.joists.flatMap((j) => j.spans);
    const lines = on(DXF_LAYERS.joists[0], "LINE");
    expect(lines).toHaveLength(spans.length);
    const texts = on(DXF_LAYERS.joistLevels[0], "TEXT");
    expect(texts).toHaveLength(2 * spans.length);
    spans.forEach((s, i) => {
      const line = lines[i];
      expect(line.vertices![0].x).toBeCloseTo(s.start[0], 9);
      expect(line.vertices![1].y).toBeCloseTo(s.end[1], 9);
      // The text nearest each end of the span gives that end's level in mm.
      for (const [end, level] of [
        [s.start, s.startLevel],
        [s.end, s.endLevel],
      ] as const) {
        const near = texts.reduce((best, t) =>
          Math.hypot(t.startPoint!.x - end[0], t.startPoint!.y - end[1]) <
          Math.hypot(best.startPoint!.x - end[0], best.startPoint!.y - end[1])
            ? t
            : best,
        );
        expect(Math.abs(Number(near.text) / 1000 - level)).toBeLessThanOrEqual(0.001);
      }
    });
  });

  it("marks every outlet with a circle and its level, and carries the north and datum note and the caution", () => {
    const circles = on(DXF_LAYERS.outlets[0], "CIRCLE");
    expect(circles.map((c) => [c.center!.x, c.center!.y])).toEqual([
      [0, 2],
      [12, 6],
    ]);
    const labels = on(DXF_LAYERS.outlets[0], "TEXT").map((t) => t.text);
    expect(labels[1]).toMatch(/^O2 level -20 mm, on joist \d+/);
    const notes = on(DXF_LAYERS.notes[0], "TEXT").map((t) => t.text!);
    expect(notes.some((t) => t.startsWith("North: plan +y"))).toBe(true);
    expect(notes.some((t) => t.includes(`H = ${Math.round(a.shaped.highLevel * 1000)} mm`))).toBe(true);
    expect(notes).toContain(CAUTION_LINE);
  });

  it("draws openings and ridges when the roof has them, and leaves their layers empty when not", () => {
    expect(on(DXF_LAYERS.openings[0])).toHaveLength(0);
    expect(on(DXF_LAYERS.ridges[0])).toHaveLength(0);
    const hatch: [number, number][] = [
      [1, 1],
      [2, 1],
      [2, 2],
      [1, 2],
    ];
    const withExtras = {
      ...pack,
      spec: {
        ...U_ROOF,
        openings: [{ outline: hatch }],
        ridges: [
          {
            line: [
              [6, 0],
              [6, 3],
            ],
          },
        ],
      } as RoofSpec,
    };
    const more = parse(planDxf(withExtras));
    const opening = more.entities.find((e) => e.layer === DXF_LAYERS.openings[0])!;
    expect(opening.vertices!.map((v) => [v.x, v.y])).toEqual(hatch);
    const ridge = more.entities.find((e) => e.layer === DXF_LAYERS.ridges[0])!;
    expect(ridge.vertices!.map((v) => [v.x, v.y])).toEqual([
      [6, 0],
      [6, 3],
    ]);
  });
});
