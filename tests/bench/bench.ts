/**
 * `npm run bench`: performance figures as shares of one 16.7 ms frame (docs/quality.md, Performance).
 * Sections run in order and each prints its own table; a section is a function returning rows,
 * so more sections (the API's requests/s) append to SECTIONS below.
 */
import { loadavg } from "node:os";
import { performance } from "node:perf_hooks";
import { analyse, parseRoofSpec, parseSpec, PREVIEW_MESH_VERTICES, type RoofSpec } from "../../app/engine/index.ts";
import { analysisAnswer } from "../../app/lib/analysis-answer.ts";
import { median } from "./stats.ts";
import { MeshSampler } from "../../app/components/sandbox/view-3d/mesh-sample.ts";
import { sceneFrame } from "../../app/components/sandbox/view-3d/scene-frame.ts";
import { surfaceAttributes } from "../../app/components/sandbox/view-3d/surface-attributes.ts";

export const FRAME_MS = 16.7;

export interface BenchRow {
  name: string;
  /** What was measured, in its unit. */
  value: number;
  unit: string;
  /** The figure compared with the target (frames for the engine). */
  score: number;
  target: string;
  pass: boolean;
  /** A figure reported for comparison, with no target of its own (printed INFO, never fails the run). */
  info?: boolean;
  note?: string;
}

export type Section = { title: string; run: () => Promise<BenchRow[]> | BenchRow[] };

/** Invented roofs of about 150, 1,500 (plain, and with openings) and 10,000 m² with 0.4 m joists. */
export const BENCH_ROOFS: { name: string; area: number; frames: number; spec: RoofSpec }[] = [
  {
    name: "small (15 × 10 m, 150 m²)",
    area: 150,
    frames: 0.05,
    spec: {
      outline: [
        [0, 0],
        [15, 0],
        [15, 10],
        [0, 10],
      ],
      outlets: [{ at: [7.5, 0] }],
      baseFall: "1:60",
      joists: { spacing: 0.4 },
    },
  },
  {
    name: "medium (L-shape, 1,500 m²)",
    area: 1500,
    frames: 0.25,
    spec: {
      outline: [
        [0, 0],
        [50, 0],
        [50, 21],
        [30, 21],
        [30, 36],
        [0, 36],
      ],
      outlets: [{ at: [12.5, 0] }, { at: [37.5, 0] }],
      baseFall: "1:50",
      joists: { spacing: 0.4 },
    },
  },
  {
    name: "medium with 5 openings and 2 ridges (1,500 m²)",
    area: 1500,
    frames: 0.5,
    // The medium L with three rooflights, a hatch and a plant base (one across a fall line),
    // divided by two ridges into three drainage areas (docs/roof-method-plans.md P4): x = 25 from
    // wall to wall, and y = 22 from the west wall to that ridge, the top-left area draining to an
    // outlet of its own on the west wall.
    spec: {
      ridges: [
        {
          line: [
            [25, 0],
            [25, 36],
          ],
        },
        {
          line: [
            [0, 22],
            [25, 22],
          ],
        },
      ],
      outline: [
        [0, 0],
        [50, 0],
        [50, 21],
        [30, 21],
        [30, 36],
        [0, 36],
      ],
      outlets: [{ at: [12.5, 0] }, { at: [37.5, 0] }, { at: [0, 30] }],
      baseFall: "1:50",
      joists: { spacing: 0.4 },
      openings: [
        {
          outline: [
            [4, 8],
            [7, 8],
            [7, 11],
            [4, 11],
          ],
          kind: "rooflight",
        },
        {
          outline: [
            [18, 8],
            [21, 8],
            [21, 11],
            [18, 11],
          ],
          kind: "rooflight",
        },
        {
          outline: [
            [40, 10],
            [43, 10],
            [43, 13],
            [40, 13],
          ],
          kind: "rooflight",
        },
        {
          outline: [
            [8, 25],
            [9.5, 25],
            [9.5, 26.5],
            [8, 26.5],
          ],
          kind: "hatch",
        },
        {
          outline: [
            [10, 14],
            [15, 14],
            [15, 17],
            [10, 17],
          ],
          kind: "plant",
        },
      ],
    },
  },
  {
    name: "large (100 × 100 m, 10,000 m²)",
    area: 10_000,
    frames: 1,
    // Outlets on facing edges are staggered: facing ones would leave a level joist between them.
    spec: {
      outline: [
        [0, 0],
        [100, 0],
        [100, 100],
        [0, 100],
      ],
      outlets: [{ at: [25, 0] }, { at: [75, 0] }, { at: [50, 100] }],
      baseFall: "1:60",
      joists: { spacing: 0.4 },
    },
  },
];

/**
 * The most work the API's bounds let onto the request's own thread (ON_REQUEST_THREAD in
 * app/lib/analysis-request.server.ts): a 40 × 32 m comb of 16 vertices, 8 outlets, 2 openings and
 * a mesh estimate just under the 20,000 stations allowed. tests/unit/analysis-thread.test.ts holds
 * it inside the bounds, so the row below times what it says.
 */
export const REQUEST_THREAD_ROOF: RoofSpec = {
  outline: [
    [0, 0],
    [40, 0],
    [40, 32],
    [34, 32],
    [34, 12],
    [28, 12],
    [28, 32],
    [22, 32],
    [22, 12],
    [16, 12],
    [16, 32],
    [10, 32],
    [10, 12],
    [4, 12],
    [4, 32],
    [0, 32],
  ],
  outlets: [5, 15, 25, 35]
    .map((x) => ({ at: [x, 0] as [number, number] }))
    .concat([2, 13, 25, 37].map((x) => ({ at: [x, 32] as [number, number] }))),
  baseFall: "1:60",
  joists: { spacing: 0.4 },
  openings: [
    {
      outline: [
        [6, 4],
        [8, 4],
        [8, 6],
        [6, 6],
      ],
    },
    {
      outline: [
        [30, 4],
        [32, 4],
        [32, 6],
        [30, 6],
      ],
    },
  ],
};

/** Longest the event loop may be held by an analysis the API runs on the request's thread. */
export const REQUEST_THREAD_FRAMES = 0.25;

export { median };

const cpuMs = () => {
  const c = process.cpuUsage();
  return (c.user + c.system) / 1000;
};

/**
 * Median wall time of `fn` over a fixed time budget, after a warm-up; also the median CPU time
 * of this process per run, which other work on a shared machine disturbs less.
 */
export function timeIt(
  fn: () => unknown,
  budgetMs = 1500,
  minRuns = 15,
): { median: number; cpu: number; runs: number } {
  const warmEnd = performance.now() + budgetMs / 4;
  while (performance.now() < warmEnd) fn();
  const times: number[] = [];
  const cpu: number[] = [];
  const end = performance.now() + budgetMs;
  while (performance.now() < end || times.length < minRuns) {
    const c0 = cpuMs();
    const t0 = performance.now();
    fn();
    times.push(performance.now() - t0);
    cpu.push(cpuMs() - c0);
  }
  return { median: median(times), cpu: median(cpu), runs: times.length };
}

/**
 * Build and analyse: validation, surface, mesh, water, advice, comparison; mesh and traces
 * included, as the sandbox's worker runs it (the mesh as typed arrays it hands to the page
 * without copying). The API's form, the mesh as plain arrays for JSON, follows as INFO rows: its
 * cost is part of the API section's figures.
 */
export const engineSection: Section = {
  title: "Engine: build and analyse a roof (median, share of a 16.7 ms frame)",
  run() {
    const analysed = (spec: RoofSpec, mesh: true | "typed") => () => {
      const parsed = parseSpec(spec);
      if (!parsed.ok) throw new Error(parsed.error.message);
      return analyse(parsed.spec, { mesh });
    };
    const rows: BenchRow[] = BENCH_ROOFS.map((roof) => {
      const { median: ms, cpu, runs } = timeIt(analysed(roof.spec, "typed"));
      const frames = ms / FRAME_MS;
      return {
        name: roof.name,
        value: ms,
        unit: "ms",
        score: frames,
        target: `≤ ${roof.frames} frame${roof.frames === 1 ? "" : "s"}`,
        pass: frames <= roof.frames,
        note: `${runs} runs; CPU ${cpu.toFixed(2)} ms = ${(cpu / FRAME_MS).toFixed(3)} frame`,
      };
    });
    for (const roof of BENCH_ROOFS) {
      const { median: ms, runs } = timeIt(analysed(roof.spec, true), 750);
      rows.push({
        name: `${roof.name.split(" (")[0]}, JSON mesh (API)`,
        value: ms,
        unit: "ms",
        score: ms / FRAME_MS,
        target: "none",
        pass: true,
        info: true,
        note: `${runs} runs; the API's form of the same analysis`,
      });
    }
    // The sandbox's drag preview of the large roof: the same analysis on a mesh sized to the
    // frame (PREVIEW_MESH_VERTICES), as the worker computes it for each frame of a drag, then what
    // the 3D view rebuilds from it on the page's thread before drawing: the surface's vertex
    // attributes and the level sampler that drapes labels and lines. Their sum must fit one frame
    // (the two run on different threads, so this is the cautious figure). Uploading to the GPU
    // and drawing are not in it: they need a browser (see the browser section).
    const large = BENCH_ROOFS[BENCH_ROOFS.length - 1];
    const parsed = parseSpec(large.spec);
    if (!parsed.ok) throw new Error(parsed.error.message);
    const frame = sceneFrame(large.spec.outline);
    const preview = timeIt(() => {
      const a = analyse(parsed.spec, { mesh: "typed", maxMeshVertices: PREVIEW_MESH_VERTICES });
      const mesh = a.shaped.meshBuffers!;
      surfaceAttributes(mesh, frame, 100);
      return new MeshSampler(mesh);
    });
    rows.push({
      name: `drag preview, ${large.name.split(" (")[0]}`,
      value: preview.median,
      unit: "ms",
      score: preview.median / FRAME_MS,
      target: "≤ 1 frame",
      pass: preview.median <= FRAME_MS,
      note: `${preview.runs} runs; CPU ${preview.cpu.toFixed(2)} ms; analysis, surface attributes and level sampler`,
    });
    // The API's small analyses run on the request's thread, holding its event loop meanwhile: the
    // most work its bounds let in, timed as the route runs it (checks, analysis, JSON bytes).
    const onRequest = timeIt(() => {
      const checked = parseRoofSpec(structuredClone(REQUEST_THREAD_ROOF));
      if (!checked.ok) throw new Error(checked.error.message);
      return analysisAnswer(checked.roof, { mesh: false, traces: false, maxBytes: Infinity }, performance.now());
    });
    rows.push({
      name: "API, largest on the request thread",
      value: onRequest.median,
      unit: "ms",
      score: onRequest.median / FRAME_MS,
      target: `≤ ${REQUEST_THREAD_FRAMES} frame`,
      pass: onRequest.median / FRAME_MS <= REQUEST_THREAD_FRAMES,
      note: `${onRequest.runs} runs; CPU ${onRequest.cpu.toFixed(2)} ms; the event loop's longest wait on one (16 vertices, 8 outlets, 2 openings)`,
    });
    return rows;
  },
};

/** Sections in order. */
export const SECTIONS: Section[] = [engineSection];

function printRows(title: string, rows: BenchRow[]): void {
  console.log(`\n${title}`);
  for (const r of rows) {
    const verdict = r.info ? "INFO" : r.pass ? "PASS" : "FAIL";
    console.log(
      `  ${verdict}  ${r.name.padEnd(34)} ${r.value.toFixed(2).padStart(9)} ${r.unit.padEnd(5)} ${r.score.toFixed(3).padStart(7)}  target ${r.target}${r.note ? `  (${r.note})` : ""}`,
    );
  }
}

export async function main(sections: Section[] = SECTIONS): Promise<boolean> {
  let ok = true;
  const [load] = loadavg();
  console.log(
    `Load average ${load.toFixed(2)} on this machine: figures are wall-clock medians, which other work slows.`,
  );
  for (const section of sections) {
    const rows = await section.run();
    printRows(section.title, rows);
    ok &&= rows.every((r) => r.info || r.pass);
  }
  console.log(`\n${ok ? "All targets met." : "Some targets missed."}`);
  return ok;
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const { apiSection } = await import("./api-section.ts");
  const { responsivenessSection } = await import("./responsiveness-section.ts");
  const { browserSection } = await import("./browser-section.ts");
  const chosen = process.argv.includes("--engine-only")
    ? SECTIONS
    : process.argv.includes("--responsiveness-only")
      ? [responsivenessSection]
      : process.argv.includes("--browser-only")
        ? [browserSection]
        : process.argv.includes("--api-only")
          ? [apiSection]
          : [...SECTIONS, apiSection, responsivenessSection, browserSection];
  main(chosen).then(
    (ok) => process.exit(ok ? 0 : 1),
    (error) => {
      console.error(error);
      process.exit(2);
    },
  );
}
