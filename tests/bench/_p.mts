import { BENCH_ROOFS } from "./bench.ts";
import { analyse, parseSpec } from "../../app/engine/index.ts";
const which = Number(process.argv[2]);
const roof = BENCH_ROOFS[which];
const p = parseSpec(roof.spec); if (!p.ok) throw new Error();
const end = performance.now() + 6000;
let n = 0;
while (performance.now() < end) { analyse(p.spec, { mesh: "typed" }); n++; }
console.log(roof.name, n);
