import { describe, expect, it } from "vitest";
import { depressions, gridEdgeSeeds, gridGraph, priorityFlood } from "~/engine/priority-flood";

// Checked against grids worked by hand, following Barnes, Lehman and Mulla 2014, "Priority-Flood:
// An optimal depression-filling and watershed-labeling algorithm for digital elevation models",
// Computers & Geosciences 62, 117-127 (Algorithm 2: seeds on the edge, lowest open cell first,
// a neighbour lower than the cell that reaches it is raised to that cell's level).

// Grid A (row 0 at the top), levels in mm:
//   8 8 8 8 8
//   8 6 7 4 8
//   8 7 2 7 8
//   8 5 7 3 8
//   8 8 8 1 8
const A = [8, 8, 8, 8, 8, 8, 6, 7, 4, 8, 8, 7, 2, 7, 8, 8, 5, 7, 3, 8, 8, 8, 8, 1, 8];

describe("priority-flood", () => {
  it("fills grid A by hand with 8 neighbours (D8)", () => {
    // By hand: every edge cell is a seed; the lowest, 1 at (r4, c3), is taken first. Its inner
    // neighbours (r3, c2) = 7 and (r3, c3) = 3 are higher, so they keep their levels and enter
    // the queue. Next 3 at (r3, c3): its diagonal neighbour (r2, c2) = 2 is lower, so it is
    // raised to 3 (the pit's spill level); (r2, c3) = 7 enters as is. Every other cell is
    // reached from a lower or equal cell and keeps its level: (r1, c3) = 4 is reached from the
    // raised 3, (r3, c1) = 5 and (r1, c1) = 6 likewise. Only (r2, c2) changes, 2 -> 3.
    const g = gridGraph(A, 5, 5, 8);
    const { filled, label } = priorityFlood(g, gridEdgeSeeds(A, 5, 5));
    const expected = [...A];
    expected[12] = 3;
    expect(Array.from(filled)).toEqual(expected);
    // Watershed labelling: the pit drains through (r3, c3) to the outlet at (r4, c3), seed index
    // of cell 23 in the edge list.
    const seeds = gridEdgeSeeds(A, 5, 5);
    expect(seeds[label[12]]).toBe(23);
    expect(seeds[label[18]]).toBe(23);
    const { depressions: d } = depressions(g, filled);
    expect(d).toHaveLength(1);
    expect(d[0]).toMatchObject({ nodes: [12], level: 3, deepest: 12, depth: 1 });
  });

  it("fills grid A by hand with 4 neighbours: no diagonal escape", () => {
    // By hand: with 4 neighbours, (r2, c2) = 2 touches only 7s, and (r1, c3) = 4 touches 8, 7,
    // 8, 7; each is raised to 7, the lowest way out. (r3, c3) = 3 touches the outlet cell 1 and
    // keeps its level. The 6 at (r1, c1) touches 8, 8, 7, 7 and the 5 at (r3, c1) touches
    // 8, 8, 7, 7: both are raised to 7. The 7s are reached from the 8s or the 3 and stay.
    const g = gridGraph(A, 5, 5, 4);
    const { filled } = priorityFlood(g, gridEdgeSeeds(A, 5, 5));
    const expected = [...A];
    expected[12] = 7; // 2
    expected[8] = 7; // 4
    expected[6] = 7; // 6
    expected[16] = 7; // 5
    expect(Array.from(filled)).toEqual(expected);
  });

  it("treats NaN as a parapet and drains only to the given seeds (an outlet)", () => {
    // A 3 x 3 roof inside a wall of NaN, levels in mm:
    //   5 4 5
    //   4 1 4
    //   5 4 2   <- outlet at the bottom right, the only seed
    // By hand: from the outlet at 2 the centre 1 is reached first and raised to 2; the 4s and
    // 5s are higher than any cell that reaches them and keep their levels. Without the wall
    // rule the edge 4s and 5s would be seeds too, but the result here is the same except the
    // seed: the depth of the pit is 2 - 1 = 1.
    const N = NaN;
    const z = [N, N, N, N, N, N, 5, 4, 5, N, N, 4, 1, 4, N, N, 5, 4, 2, N, N, N, N, N, N];
    const g = gridGraph(z, 5, 5, 8);
    const { filled, label } = priorityFlood(g, [18]);
    expect(filled[12]).toBe(2);
    expect(Number.isNaN(filled[0])).toBe(true);
    expect(label[0]).toBe(-1);
    expect(label[6]).toBe(0);
    for (const i of [6, 7, 8, 11, 13, 16, 17, 18]) expect(filled[i]).toBe(z[i]);
    // A lower outlet elsewhere does not change a pit that spills first to a higher one: seed
    // the top-left 5 as well, and the centre still fills only to 2.
    expect(priorityFlood(g, [18, 6]).filled[12]).toBe(2);
  });

  it("fills a flat-bottomed basin to its rim through the pit queue", () => {
    // 1 x 6 strip: 3 0 0 0 0 2 seeded at both ends (in a one-row grid every cell is on the
    // edge, so the seeds are given); the four 0s all rise to 2, the lower rim, and form one
    // depression of depth 2.
    const z = [3, 0, 0, 0, 0, 2];
    const g = gridGraph(z, 6, 1, 4);
    const { filled } = priorityFlood(g, [0, 5]);
    expect(Array.from(filled)).toEqual([3, 2, 2, 2, 2, 2]);
    const { depressions: d } = depressions(g, filled);
    expect(d).toHaveLength(1);
    expect(d[0].nodes.sort()).toEqual([1, 2, 3, 4]);
    expect(d[0].depth).toBe(2);
  });
});
