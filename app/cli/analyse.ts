/**
 * `npm run analyse -- roof.json [--csv schedule.csv]`: the key figures of a roof for designers
 * who script, and the drop schedule as CSV.
 */
import { readFileSync, writeFileSync } from "node:fs";
import { parseArgs } from "node:util";
import { basename } from "node:path";
import { CAUTION_LINE } from "../lib/caution.ts";
import { directionDegrees } from "../lib/pack/facts.ts";
import { scheduleCsv as packScheduleCsv } from "../lib/pack/schedule-csv.ts";
import { analyse, formatRatio, parseSpec, type Analysis, type RoofSpec } from "../engine/index.ts";

const HELP = `Usage: npm run analyse -- <roof.json> [--csv <schedule.csv>]

Reads a roof spec (the JSON body of POST /api/v1/analyses), prints the shaped roof's key
figures, the gutter comparison and any warnings, and with --csv writes the drop schedule.
Examples: app/cli/examples/*.json`;

const mm = (m: number | null | undefined) => (m == null ? "-" : `${Math.round(m * 1000)} mm`);
const m2 = (a: number) => `${a.toFixed(1)} m²`;
const metres = (m: number) => `${m.toFixed(2)} m`;
const pt = (p: [number, number]) => `(${p[0].toFixed(2)}, ${p[1].toFixed(2)})`;

/** The drop schedule as CSV: the same writer, header block and columns as the app's downloads. */
export function scheduleCsv(a: Analysis, spec: RoofSpec, name: string, date = new Date()): string {
  return packScheduleCsv({ name, date, spec, analysis: a });
}

/** The printed report. */
export function report(a: Analysis, name: string): string {
  const s = a.shaped;
  const lines: string[] = [];
  const add = (text = "") => lines.push(text);
  add(`${name}: ${m2(a.area)}, rule set "${a.ruleSet.name}"`);
  add(
    `Base fall ${formatRatio(a.baseFall.ratio)} (${a.baseFall.degrees.toFixed(2)}°), minimum fall line ${formatRatio(a.minFall.ratio)}`,
  );
  add();
  add("Shaped roof");
  add(`  High level            ${mm(s.highLevel)} (${s.highLevelSource})`);
  add(
    `  Joists                ${s.joists.length} at ${Math.round(s.setOut.spacing * 1000)} mm, direction ${directionDegrees(s.joistDirection).toFixed(1)}° from x, first at ${s.setOut.offset.toFixed(3)} m${s.setOut.fromOutlets ? " (set out from the outlets)" : ""}`,
  );
  for (const f of s.edgeFalls)
    add(`  Edge ${f.edge + 1} fall           ${formatRatio(f.ratio)} from ${pt(f.from)} to ${pt(f.to)}`);
  const l = s.longestFallLine;
  const drainLabel = (id: string) => s.catchments.find((c) => c.drain === id)?.label ?? id;
  if (l)
    add(
      `  Longest fall line     ${metres(l.length)} from ${pt(l.from)} to ${drainLabel(l.drain)}, drop ${mm(l.drop)}, ${formatRatio(l.ratio)}`,
    );
  if (s.worstFallRatio !== null) add(`  Worst fall line       ${formatRatio(s.worstFallRatio)}`);
  add(`  Flatter than minimum  ${m2(s.fallMap.flatterThanMinimumArea)}`);
  for (const b of s.fallMap.areaByBand) add(`    ${b.label.padEnd(20)} ${m2(b.area)}`);
  add();
  add(`Catchments (rainfall ${a.rainfall.intensity} mm/h${a.rainfall.assumed ? ", assumed" : ""})`);
  for (const c of s.catchments) {
    const capacity = c.capacity !== undefined ? `, capacity about ${c.capacity.toFixed(1)} L/s` : "";
    add(`  ${c.label.padEnd(20)} ${m2(c.area).padStart(10)}  ${c.flow.toFixed(2)} L/s${capacity}`);
  }
  for (const p of s.ponding) add(`  Ponding at ${pt(p.at)}: ${m2(p.area)} drain to it`);
  add();
  add("Gutter layout, for comparison");
  if (a.gutter.comparable) {
    add(`  High level            ${mm(a.gutter.highLevel)} (lip ${mm(a.gutter.lipLevel)})`);
    add(`  Height saved          ${mm(a.comparison.heightSaved)} by shaping`);
    add(
      `  Gutter                ${metres(a.gutter.gutterLength)} long, sole ${m2(a.gutter.soleArea)} at ${formatRatio(a.gutter.fall.ratio)}`,
    );
    add(`  Changes of plane      ${metres(a.gutter.detailLength)}`);
  } else {
    add(`  Not comparable: ${a.gutter.reason}`);
  }
  add(`  Open edge option      ${mm(a.openEdge.highLevel)} high, falling to edge ${a.openEdge.edge + 1}`);
  add();
  add("Advice");
  const base = a.advice.minimumBaseFall;
  add(
    `  Flattest base fall keeping every fall line at ${formatRatio(a.minFall.ratio)}: ${base ? formatRatio(base.ratio) : "none found"}`,
  );
  const extra = a.advice.extraOutlet;
  if (extra)
    add(
      `  One more outlet at ${pt(extra.at)} (edge ${extra.edge + 1}): worst fall line ${formatRatio(extra.currentLongestFallRatio)} → ${formatRatio(extra.longestFallRatio)}`,
    );
  add();
  add(a.warnings.length ? `Warnings (${a.warnings.length})` : "No warnings");
  for (const w of a.warnings) add(`  [${w.code}] ${w.message}`);
  add();
  add(CAUTION_LINE);
  return lines.join("\n");
}

export function main(argv: string[]): number {
  let parsed;
  try {
    parsed = parseArgs({
      args: argv,
      allowPositionals: true,
      options: { csv: { type: "string" }, help: { type: "boolean", short: "h" } },
    });
  } catch (error) {
    process.stderr.write(`${(error as Error).message}\n\n${HELP}\n`);
    return 2;
  }
  const file = parsed.positionals[0];
  if (parsed.values.help || !file) {
    process.stdout.write(`${HELP}\n`);
    return parsed.values.help ? 0 : 2;
  }
  let input: unknown;
  try {
    input = JSON.parse(readFileSync(file, "utf8"));
  } catch (error) {
    process.stderr.write(`Cannot read ${file} as JSON: ${(error as Error).message}\n`);
    return 2;
  }
  const spec = parseSpec(input);
  if (!spec.ok) {
    process.stderr.write(`${spec.error.message}\n`);
    for (const i of spec.error.issues) process.stderr.write(`  ${i.path}: ${i.message}\n`);
    return 1;
  }
  const analysis = analyse(spec.spec, { mesh: false, traces: false });
  process.stdout.write(`${report(analysis, file)}\n`);
  if (parsed.values.csv) {
    const name = basename(file).replace(/\.json$/i, "");
    writeFileSync(parsed.values.csv, `${scheduleCsv(analysis, spec.spec, name)}\r\n`);
    process.stdout.write(`\nDrop schedule written to ${parsed.values.csv}\n`);
  }
  return 0;
}

if (import.meta.url === `file://${process.argv[1]}`) process.exitCode = main(process.argv.slice(2));
