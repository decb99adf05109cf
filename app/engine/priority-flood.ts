import FlatQueue from "flatqueue";

/**
 * Priority-Flood depression filling and watershed labelling (Barnes, Lehman and Mulla 2014,
 * "Priority-Flood: An optimal depression-filling and watershed-labeling algorithm for digital
 * elevation models", Computers & Geosciences 62, 117-127; Algorithm 2, "Improved
 * Priority-Flood", with the plain pit queue, and its labelling variant).
 *
 * The algorithm is stated for any graph of cells, not only a grid: water leaves at the seeds
 * (the grid's edge in the paper; on a parapet roof, the outlets and eaves), every other node
 * is raised to the lowest level at which water from it can reach a seed. Nodes marked NaN are
 * walls (outside the roof). The priority queue is `flatqueue`, a small well-known binary heap.
 */
export interface Graph {
  /** Node levels; NaN marks a wall that water never crosses. */
  z: ArrayLike<number>;
  /** Compressed adjacency: neighbours of node i are adj[start[i]] .. adj[start[i + 1] - 1]. */
  start: ArrayLike<number>;
  adj: ArrayLike<number>;
}

export interface FloodResult {
  /** Levels after filling: every depression raised to its spill level. */
  filled: Float64Array;
  /** Index (in `seeds`) of the seed each node drains to; -1 for walls and nodes no seed reaches. */
  label: Int32Array;
  /** The node that reached each node first (its way out towards the seed); -1 for seeds, walls and unreached nodes. */
  parent: Int32Array;
}

export function priorityFlood(graph: Graph, seeds: readonly number[]): FloodResult {
  const { z, start, adj } = graph;
  const n = z.length;
  const filled = Float64Array.from(z as ArrayLike<number>);
  const label = new Int32Array(n).fill(-1);
  const parent = new Int32Array(n).fill(-1);
  const closed = new Uint8Array(n);
  const open = new FlatQueue<number>();
  // Cells raised to their spill level all have the same level: a plain FIFO is enough for them
  // (the paper's "pit" queue), which saves heap work inside large flats.
  const pit: number[] = [];
  let pitHead = 0;
  seeds.forEach((s, k) => {
    if (closed[s] || Number.isNaN(filled[s])) return;
    closed[s] = 1;
    label[s] = k;
    open.push(s, filled[s]);
  });
  while (open.length > 0 || pitHead < pit.length) {
    const c = pitHead < pit.length ? pit[pitHead++] : open.pop()!;
    if (pitHead === pit.length) {
      pit.length = 0;
      pitHead = 0;
    }
    for (let e = start[c]; e < start[c + 1]; e++) {
      const nb = adj[e];
      if (closed[nb] || Number.isNaN(filled[nb])) continue;
      closed[nb] = 1;
      label[nb] = label[c];
      parent[nb] = c;
      if (filled[nb] <= filled[c]) {
        filled[nb] = filled[c];
        pit.push(nb);
      } else {
        open.push(nb, filled[nb]);
      }
    }
  }
  return { filled, label, parent };
}

/**
 * Adjacency of a row-major grid, width × height, with 8 neighbours (D8, as in the paper) or 4.
 */
export function gridGraph(z: ArrayLike<number>, width: number, height: number, connectivity: 4 | 8 = 8): Graph {
  const offsets: [number, number][] =
    connectivity === 8
      ? [
          [-1, -1],
          [0, -1],
          [1, -1],
          [-1, 0],
          [1, 0],
          [-1, 1],
          [0, 1],
          [1, 1],
        ]
      : [
          [0, -1],
          [-1, 0],
          [1, 0],
          [0, 1],
        ];
  const start = new Int32Array(width * height + 1);
  const adj: number[] = [];
  for (let r = 0; r < height; r++) {
    for (let c = 0; c < width; c++) {
      start[r * width + c] = adj.length;
      for (const [dc, dr] of offsets) {
        const cc = c + dc,
          rr = r + dr;
        if (cc >= 0 && cc < width && rr >= 0 && rr < height) adj.push(rr * width + cc);
      }
    }
  }
  start[width * height] = adj.length;
  return { z, start, adj: Int32Array.from(adj) };
}

/** The paper's seeds: every cell on the grid's edge, and every cell beside a NaN (no-data) cell. */
export function gridEdgeSeeds(z: ArrayLike<number>, width: number, height: number): number[] {
  const seeds: number[] = [];
  for (let r = 0; r < height; r++) {
    for (let c = 0; c < width; c++) {
      const i = r * width + c;
      if (Number.isNaN(z[i])) continue;
      let edge = r === 0 || c === 0 || r === height - 1 || c === width - 1;
      for (let dr = -1; dr <= 1 && !edge; dr++) {
        for (let dc = -1; dc <= 1 && !edge; dc++) {
          if (Number.isNaN(z[(r + dr) * width + c + dc])) edge = true;
        }
      }
      if (edge) seeds.push(i);
    }
  }
  return seeds;
}

/**
 * Groups the nodes raised by more than `minDepth` into depressions (connected through the
 * graph), each with its nodes, water level and deepest node.
 */
export function depressions(graph: Graph, filled: ArrayLike<number>, minDepth = 1e-9) {
  const { z, start, adj } = graph;
  const n = z.length;
  const group = new Int32Array(n).fill(-1);
  const out: { nodes: number[]; level: number; deepest: number; depth: number }[] = [];
  for (let i = 0; i < n; i++) {
    if (group[i] >= 0 || !(filled[i] - z[i] > minDepth)) continue;
    const g = out.length;
    const nodes = [i];
    group[i] = g;
    for (let k = 0; k < nodes.length; k++) {
      const c = nodes[k];
      for (let e = start[c]; e < start[c + 1]; e++) {
        const nb = adj[e];
        if (group[nb] < 0 && filled[nb] - z[nb] > minDepth && Math.abs(filled[nb] - filled[i]) <= 1e-9) {
          group[nb] = g;
          nodes.push(nb);
        }
      }
    }
    let deepest = i;
    for (const c of nodes) if (filled[c] - z[c] > filled[deepest] - z[deepest]) deepest = c;
    out.push({ nodes, level: filled[i], deepest, depth: filled[deepest] - z[deepest] });
  }
  return { group, depressions: out };
}
