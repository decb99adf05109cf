import { expect } from "vitest";
import { analyse, parseSpec, type AnalyseOptions, type Analysis, type RoofSpec } from "~/engine";

/** Validates then analyses, failing the test with the engine's message if the spec is refused. */
export function analyseSpec(spec: unknown, options: AnalyseOptions = { mesh: false, traces: false }): Analysis {
  const parsed = parseSpec(spec);
  if (!parsed.ok) throw new Error(`spec refused: ${parsed.status} ${parsed.error.message}`);
  return analyse(parsed.spec, options);
}

export function parsedSpec(spec: unknown): RoofSpec {
  const parsed = parseSpec(spec);
  if (!parsed.ok) throw new Error(`spec refused: ${parsed.status} ${parsed.error.message}`);
  return parsed.spec;
}

/** Shoelace area of a plan polygon (absolute). */
export function shoelace(points: [number, number][]): number {
  let s = 0;
  for (let i = 0, j = points.length - 1; i < points.length; j = i++) {
    s += (points[j][0] - points[i][0]) * (points[j][1] + points[i][1]);
  }
  return Math.abs(s) / 2;
}

/** Sum of plan areas of a mesh's triangles, and the smallest signed one. */
export function meshAreas(
  positions: ArrayLike<number>,
  indices: ArrayLike<number>,
): { total: number; smallest: number } {
  let total = 0;
  let smallest = Infinity;
  for (let f = 0; f < indices.length; f += 3) {
    const a = 3 * indices[f],
      b = 3 * indices[f + 1],
      c = 3 * indices[f + 2];
    const area =
      ((positions[b] - positions[a]) * (positions[c + 1] - positions[a + 1]) -
        (positions[b + 1] - positions[a + 1]) * (positions[c] - positions[a])) /
      2;
    total += area;
    smallest = Math.min(smallest, area);
  }
  return { total, smallest };
}

export function close(actual: number | null | undefined, expected: number, tolerance = 1e-9): void {
  expect(actual).not.toBeNull();
  expect(actual).toBeDefined();
  expect(Math.abs((actual as number) - expected)).toBeLessThanOrEqual(tolerance);
}

export const RECT_20_10: [number, number][] = [
  [0, 0],
  [20, 0],
  [20, 10],
  [0, 10],
];
