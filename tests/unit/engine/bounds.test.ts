import { describe, expect, it } from "vitest";
import { analyse, MAX_MESH_VERTICES, parseSpec, type Analysis } from "~/engine";

/** Every number in a JSON-bound analysis is finite, except level-face ratios (Infinity → null). */
function nonFinite(value: unknown, path = "analysis", out: string[] = []): string[] {
  if (typeof value === "number" && !Number.isFinite(value) && !path.includes("faceRatio"))
    out.push(`${path} = ${value}`);
  else if (Array.isArray(value)) value.forEach((v, i) => out.length < 5 && nonFinite(v, `${path}.${i}`, out));
  else if (value && typeof value === "object")
    for (const [k, v] of Object.entries(value)) nonFinite(v, `${path}.${k}`, out);
  return out;
}

function run(spec: unknown, options = {}): Analysis {
  const parsed = parseSpec(spec);
  if (!parsed.ok) throw new Error(parsed.error.message);
  return analyse(parsed.spec, options);
}

describe("work is bounded at the limits (issue 4: never a hang)", () => {
  it("a 200-vertex comb with 100 outlets and 1,000 probes analyses in bounded time", () => {
    // 49 teeth, 3 m × 1 m notches between them: 98 re-entrant corners.
    const outline: [number, number][] = [[0, 0]];
    for (let i = 0; i < 49; i++) outline.push([2 * i, 10], [2 * i + 1, 10], [2 * i + 1, 3], [2 * i + 2, 3]);
    outline.push([98, 10], [99, 10], [99, 0]);
    expect(outline).toHaveLength(200);
    const outlets = Array.from({ length: 100 }, (_, k) => ({ at: [((k + 0.5) * 99) / 100, 0] as [number, number] }));
    const probes = Array.from({ length: 1000 }, (_, k): [number, number] => [(k % 49) * 2 + 0.5, (k % 7) + 0.5]);
    const started = Date.now();
    const a = run({ outline, outlets, baseFall: "1:40", probes });
    expect(Date.now() - started).toBeLessThan(10_000);
    expect(a.shaped.probes).toHaveLength(1000);
    expect(a.shaped.catchments).toHaveLength(100);
    expect(a.warnings.filter((w) => w.code === "twist").length).toBeGreaterThan(0);
    expect(nonFinite(a)).toEqual([]);
  });

  it("a 90,000 m² roof at 0.4 m joists coarsens its mesh within the vertex budget and says so", () => {
    const a = run({
      outline: [
        [0, 0],
        [300, 0],
        [300, 300],
        [0, 300],
      ],
      outlets: [{ at: [100, 0] }, { at: [200, 0] }, { at: [150, 300] }],
      baseFall: "1:80",
    });
    const vertices = a.shaped.mesh!.positions.length / 3;
    expect(vertices).toBeLessThanOrEqual(MAX_MESH_VERTICES * 1.1);
    expect(a.warnings.some((w) => w.code === "mesh-coarsened")).toBe(true);
    expect(Math.abs(a.shaped.fallMap.area - 90_000)).toBeLessThan(1e-6);
    expect(a.shaped.joists).toHaveLength(751);
  });

  it("a 990 km sliver laid diagonally (99,000 m²) keeps its mesh and traces bounded", () => {
    const c = Math.SQRT1_2;
    const outline = (
      [
        [0, 0],
        [990_000, 0],
        [990_000, 0.1],
        [0, 0.1],
      ] as [number, number][]
    ).map(([x, y]): [number, number] => [c * x - c * y, c * x + c * y]);
    const outlet: [number, number] = [(outline[3][0] + outline[0][0]) / 2, (outline[3][1] + outline[0][1]) / 2];
    const started = Date.now();
    const a = run({ outline, outlets: [{ at: outlet }], baseFall: "1:40" });
    expect(Date.now() - started).toBeLessThan(10_000);
    expect(a.shaped.mesh!.positions.length / 3).toBeLessThanOrEqual(MAX_MESH_VERTICES);
    expect(a.shaped.flowTraces!.starts.length).toBeLessThan(1000);
    expect(Math.abs(a.shaped.fallMap.area - 99_000)).toBeLessThan(1e-3);
  });

  it("an analysis survives JSON: no NaN or Infinity outside level-face ratios", () => {
    const a = run(
      {
        outline: [
          [0, 0],
          [12, 0],
          [12, 5],
          [7, 5],
          [7, 9],
          [0, 9],
        ],
        edges: ["parapet", "parapet", "parapet", "parapet", "eaves", "parapet"],
        outlets: [{ at: [12, 0] }, { at: [3, 0], level: 0.02 }],
        baseFall: "1.5%",
        probes: [
          [1, 1],
          [50, 50],
        ],
      },
      { mesh: true, traces: true },
    );
    expect(nonFinite(a)).toEqual([]);
    const back = JSON.parse(JSON.stringify(a));
    expect(back.shaped.highLevel).toBe(a.shaped.highLevel);
    expect(back.shaped.probes[1].level).toBeNull();
  });
});
