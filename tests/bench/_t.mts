import { BENCH_ROOFS, timeIt } from "./bench.ts";
import { analyse, parseSpec } from "../../app/engine/index.ts";
for (const roof of BENCH_ROOFS) { const p = parseSpec(roof.spec); if (!p.ok) throw 0;
 for (const mesh of [true, "typed", false] as const) { const t = timeIt(() => analyse(p.spec, { mesh })); console.log(roof.name.slice(0,30), mesh, (t.median/16.7).toFixed(3), "cpu", (t.cpu/16.7).toFixed(3)); } }
