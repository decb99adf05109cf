import { describe, expect, it } from "vitest";
import type { Point } from "~/engine";
import { boxesOverlap, placeLabels, ringCandidates, segmentHitsBox } from "~/lib/pack/labels";
import { planLabels } from "~/lib/pack/plan-figure";
import { DEMO_ROOF } from "~/components/sandbox/state/demo-roof";
import { MeshSampler } from "~/components/sandbox/view-3d/mesh-sample";
import { packOf, U_ROOF } from "./fixtures";

describe("label placement", () => {
  it("finds segments that cross, touch or lie inside a box, and not those that pass by", () => {
    const box = { x0: 0, y0: 0, x1: 2, y1: 1 };
    expect(segmentHitsBox([-1, 0.5], [3, 0.5], box)).toBe(true);
    expect(segmentHitsBox([0.5, 0.2], [1, 0.8], box)).toBe(true);
    expect(segmentHitsBox([-1, 2], [3, 2], box)).toBe(false);
    expect(segmentHitsBox([-1, -1], [-0.1, 3], box)).toBe(false);
    expect(segmentHitsBox([-1, 0], [1, 2], box)).toBe(true);
  });

  it("moves a label off a line to its next candidate, and two labels at one point apart", () => {
    const wall: [Point, Point] = [
      [-5, 0],
      [5, 0],
    ];
    const [a, b] = placeLabels(
      [
        {
          width: 2,
          height: 0.5,
          candidates: [
            [0, 0],
            [0, 1],
            [0, -1],
          ],
        },
        {
          width: 2,
          height: 0.5,
          candidates: [
            [0, 0],
            [0, 1],
            [0, -1],
          ],
        },
      ],
      [wall],
    );
    expect(a.centre).toEqual([0, 1]);
    expect(b.centre).toEqual([0, -1]);
    expect(a.clear && b.clear).toBe(true);
    expect(boxesOverlap(a.box, b.box)).toBe(false);
  });

  it("takes the least-bad candidate and says so when nothing is free", () => {
    const [a] = placeLabels(
      [
        {
          width: 1,
          height: 1,
          candidates: [
            [0, 0],
            [0, 0.1],
          ],
        },
      ],
      [
        [
          [-5, 0],
          [5, 0],
        ],
        [
          [0, -5],
          [0, 5],
        ],
      ],
    );
    expect(a.clear).toBe(false);
  });

  it("rings candidates at the given distances from the box's edge", () => {
    const c = ringCandidates([0, 0], 2, 1, [0.5], 0);
    expect(c).toHaveLength(8);
    expect(c[0][0]).toBeCloseTo(1.5, 9);
    expect(c[0][1]).toBeCloseTo(0, 9);
  });

  for (const [name, spec] of [
    ["rectangle", DEMO_ROOF],
    ["U-shaped roof", U_ROOF],
  ] as const) {
    it(`${name}: the plan's labels overlap no wall, fall line, outlet or each other`, () => {
      const pack = packOf(spec, name, undefined, true);
      const sampler = new MeshSampler(pack.analysis.shaped.mesh!);
      const plan = planLabels(
        pack,
        (text, size) => text.length * size * 0.6,
        (x, y) => sampler.levelAt(x, y),
      );
      // An edge length and a corner level per vertex, and a label per outlet.
      expect(plan.labels).toHaveLength(2 * spec.outline.length + spec.outlets.length);
      for (const l of plan.labels) {
        expect(l.clear, `${l.text} at ${l.centre}`).toBe(true);
        for (const [p, q] of plan.obstacles) expect(segmentHitsBox(p, q, l.box), `${l.text} on a line`).toBe(false);
      }
      for (let i = 0; i < plan.labels.length; i++)
        for (let j = i + 1; j < plan.labels.length; j++)
          expect(
            boxesOverlap(plan.labels[i].box, plan.labels[j].box),
            `${plan.labels[i].text} / ${plan.labels[j].text}`,
          ).toBe(false);
    });
  }
});
