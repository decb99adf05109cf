import { describe, expect, it } from "vitest";
import { MAX_MESH_VERTICES, PREVIEW_MESH_VERTICES } from "~/engine";
import { BENCH_ROOFS } from "../../bench/bench";
import { analyseSpec } from "./helpers";

/** A grid of probe points inside a rectangle's bounds (the bench roofs' outlines contain them). */
function probesIn(outline: [number, number][], n = 9): [number, number][] {
  const xs = outline.map((p) => p[0]);
  const ys = outline.map((p) => p[1]);
  const [x0, x1, y0, y1] = [Math.min(...xs), Math.max(...xs), Math.min(...ys), Math.max(...ys)];
  const out: [number, number][] = [];
  for (let i = 1; i < n; i++)
    for (let j = 1; j < n; j++) out.push([x0 + ((x1 - x0) * i) / n, y0 + ((y1 - y0) * j) / n]);
  return out;
}

describe("drag preview: the same method on a coarser mesh", () => {
  for (const roof of BENCH_ROOFS) {
    it(`${roof.name}: same high level; probe levels and mesh within 5 mm of the full analysis, catchments within 2 %`, () => {
      const spec = { ...roof.spec, probes: probesIn(roof.spec.outline as [number, number][]) };
      const full = analyseSpec(spec, { mesh: true, traces: false, maxMeshVertices: MAX_MESH_VERTICES });
      const preview = analyseSpec(spec, { mesh: true, traces: false, maxMeshVertices: PREVIEW_MESH_VERTICES });
      expect(preview.shaped.highLevel).toBe(full.shaped.highLevel);
      const vertices = (a: typeof full) => (a.shaped.mesh?.positions.length ?? 0) / 3;
      // The engine bounds an estimate of the vertex count, so the mesh may pass it a little.
      expect(vertices(preview)).toBeLessThanOrEqual(1.5 * PREVIEW_MESH_VERTICES);
      expect(vertices(preview)).toBeLessThanOrEqual(vertices(full));
      let worst = 0;
      full.shaped.probes.forEach((p, k) => {
        const q = preview.shaped.probes[k];
        expect(q.level == null).toBe(p.level == null);
        if (p.level != null && q.level != null) worst = Math.max(worst, Math.abs(p.level - q.level));
      });
      expect(worst).toBeLessThanOrEqual(0.005);
      // The preview's mesh lies on the full analysis' surface: its vertices, probed in the full analysis.
      const pos = preview.shaped.mesh!.positions;
      const picks = Array.from({ length: 200 }, (_, k) => Math.floor((k * pos.length) / 3 / 200));
      const onFull = analyseSpec(
        { ...roof.spec, probes: picks.map((i) => [pos[3 * i], pos[3 * i + 1]]) },
        { mesh: false, traces: false },
      );
      let off = 0;
      picks.forEach((i, k) => {
        const level = onFull.shaped.probes[k].level;
        if (level != null) off = Math.max(off, Math.abs(level - pos[3 * i + 2]));
      });
      expect(off).toBeLessThanOrEqual(0.005);
      // Catchments cover the same roof, each within 2 % of its full area (faces are coarser).
      expect(preview.shaped.catchments.length).toBe(full.shaped.catchments.length);
      full.shaped.catchments.forEach((c, k) =>
        expect(Math.abs(preview.shaped.catchments[k].area - c.area)).toBeLessThanOrEqual(0.02 * c.area + 0.01),
      );
    });
  }
});
