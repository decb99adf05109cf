import { formatRatio, RULE_SETS, type Point } from "~/engine";
import { datumText, directionDegrees, isoDate, mmOf, packOutlets, type PackRoof } from "./facts";
import { citation, RULE_KEY_NAMES } from "./rule-keys";
import { scheduleColumns } from "./schedule-csv";
import { scheduleRows } from "./schedule-rows";

/**
 * The check sheet's words and tables, made once for the page and the PDF so that both (and the
 * CSV, which shares the schedule's columns) say the same for the same roof.
 */
export interface SheetTable {
  title: string;
  header: string[];
  /** Columns right-aligned (numbers). */
  numeric: boolean[];
  rows: string[][];
  note?: string;
}

export interface SheetData {
  title: string;
  subtitle: string;
  figures: [string, string][];
  tables: SheetTable[];
  warnings: string[];
  ruleSet: { title: string; name: string; lines: string[]; notes: string[] };
}

const mm = (m: number | null | undefined) => (m == null || !Number.isFinite(m) ? "–" : `${mmOf(m)} mm`);
const metres = (m: number) => `${m.toFixed(2)} m`;
const area = (a: number) => `${a.toFixed(1)} m²`;
const flow = (q: number) => `${q.toFixed(2)} L/s`;
const pt = (p: Point) => `(${p[0].toFixed(2)}, ${p[1].toFixed(2)})`;
/** "1.43° · 2.50 %", the other two forms of a fall. */
export function fallDetail(ratio: number | null | undefined): string {
  if (ratio == null || !Number.isFinite(ratio)) return "level";
  return `${((Math.atan(1 / ratio) * 180) / Math.PI).toFixed(2)}° · ${(100 / ratio).toFixed(2)} %`;
}
const fallWithDetail = (r: number | null | undefined) =>
  r == null || !Number.isFinite(r) ? "level" : `${formatRatio(r)} (${fallDetail(r)})`;

/** Openings and the drainage areas with their ridges (docs/roof-method-plans.md P2, P4), where the roof has them. */
function planTables(p: PackRoof): SheetTable[] {
  const s = p.analysis.shaped;
  const out: SheetTable[] = [];
  const openings = p.spec.openings ?? [];
  if (openings.length)
    out.push({
      title: "Openings",
      header: ["opening", "kind", "upstand (mm)", "area", "corners (m)"],
      numeric: [false, false, true, true, false],
      rows: openings.map((o, i) => [
        String(i + 1),
        o.kind ?? "other",
        String(mmOf(o.upstand ?? 0.15)),
        s.openings?.[i] ? area(s.openings[i].area) : "–",
        o.outline.map(pt).join(" "),
      ]),
      note: "Water goes round the upstands; the deck under an opening keeps the surface it would have without it.",
    });
  const ridges = s.ridges ?? [];
  if (ridges.length)
    out.push({
      title: "Ridges",
      header: ["ridge", "kind", "points (m)"],
      numeric: [false, false, false],
      rows: ridges.map((r) => [
        String(r.index + 1),
        r.kind === "cricket" ? "cricket (diverting ridge)" : "dividing, level at H",
        r.line.map(pt).join(" → "),
      ]),
    });
  const areas = s.areas ?? [];
  if (areas.length > 1)
    out.push({
      title: "Drainage areas",
      header: ["area", "drained area", "outlets", "joists", "own high level"],
      numeric: [false, true, false, true, true],
      rows: areas.map((a, k) => [
        String(k + 1),
        area(a.area),
        a.outlets.map((o) => `O${o + 1}`).join(", ") || "eaves",
        `${directionDegrees(a.joistDirection).toFixed(1)}° from x`,
        mm(a.highLevel),
      ]),
      note: "Each area is shaped on its own up to the one high level H; water never crosses a ridge.",
    });
  return out;
}

export function sheetData(p: PackRoof): SheetData {
  const { analysis: a, spec } = p;
  const s = a.shaped;
  const line = s.longestFallLine;
  const figures: [string, string][] = [
    ["Roof area", area(a.area)],
    [`High level H (${s.highLevelSource})`, mm(s.highLevel)],
    ["Datum", datumText(p)],
    ["Base fall", fallWithDetail(a.baseFall.ratio)],
    ["Minimum fall for fall lines", fallWithDetail(a.minFall.ratio)],
    ["Longest fall line", line ? `${metres(line.length)} at ${formatRatio(line.ratio)}` : "–"],
    ["Flattest fall line", formatRatio(s.worstFallRatio)],
    ["Area flatter than the minimum", area(s.fallMap.flatterThanMinimumArea)],
    [
      "Joists",
      `${s.joists.length} at ${mmOf(s.setOut.spacing)} mm, ${directionDegrees(s.joistDirection).toFixed(1)}° from x, first at ${s.setOut.offset.toFixed(3)} m${s.setOut.fromOutlets ? " (set out from the outlets)" : ""}`,
    ],
    ["Rainfall intensity", `${a.rainfall.intensity} mm/h${a.rainfall.assumed ? " (assumed)" : ""}`],
    [
      "Gutter layout high level",
      a.gutter.comparable
        ? `${mm(a.gutter.highLevel)} (saves ${mm(a.comparison.heightSaved)} by shaping)`
        : `not comparable: ${a.gutter.reason ?? ""}`,
    ],
    [`Open edge (edge ${a.openEdge.edge + 1}) high level`, mm(a.openEdge.highLevel)],
  ];
  const rows = scheduleRows(s.joists);
  const columns = scheduleColumns(rows);
  const headings: Record<string, string> = {
    area: "area",
    joist: "joist",
    span: "span",
    offset_m: "offset m",
    start_x_m: "start x",
    start_y_m: "start y",
    end_x_m: "end x",
    end_y_m: "end y",
    length_m: "length m",
    start_level_mm: "start level",
    end_level_mm: "end level",
    start_drop_below_H_mm: "start drop",
    end_drop_below_H_mm: "end drop",
    fall: "fall",
  };
  // The sheet leaves out the plan coordinates (the plan shows them); the CSV keeps them.
  const shown = columns.filter(([name]) => !/_(x|y)_m$/.test(name));
  const cell = (name: string, v: string | number) =>
    typeof v === "number"
      ? name.endsWith("_m")
        ? v.toFixed(name === "offset_m" || name === "length_m" ? 2 : 3)
        : String(v)
      : v;
  const tables: SheetTable[] = [
    {
      title: "Outlets",
      header: ["outlet", "at (m)", "level (mm)", "joist"],
      numeric: [false, false, true, false],
      rows: packOutlets(p).map((o) => [`O${o.number}`, pt(o.at), String(o.level), o.joist]),
    },
    ...planTables(p),
    {
      title: "Edge falls",
      header: ["edge", "from (low)", "to (high)", "fall", "° · %"],
      numeric: [false, false, false, true, true],
      rows: s.edgeFalls.map((r) => [
        String(r.edge + 1),
        pt(r.from),
        pt(r.to),
        formatRatio(r.ratio),
        fallDetail(r.ratio),
      ]),
    },
    {
      title: "Catchments and flows",
      header: ["drain", "area", "design flow", "capacity"],
      numeric: [false, true, true, true],
      rows: s.catchments.map((c) => [c.label, area(c.area), flow(c.flow), c.capacity == null ? "–" : flow(c.capacity)]),
      note: `Q = i·A/3600, runoff coefficient 1 (ASCE 7-05 Commentary C8). Ponding: ${s.ponding.length ? `${s.ponding.length} low point(s)` : "none"}.`,
    },
    {
      title: `Drop schedule (H = ${mm(s.highLevel)})`,
      header: shown.map(([name]) => headings[name] ?? name),
      numeric: shown.map(([name]) => name !== "fall"),
      rows: rows.map((r) => shown.map(([name, get]) => cell(name, get(r)))),
      note: "Levels and drops in mm; drops measured down from H at each bearing. Plan positions of every span are in the CSV and DXF.",
    },
  ];
  const warnings = a.warnings.map((w) => w.message);
  if (a.advice.minimumBaseFall)
    warnings.push(
      `Advice: the flattest base fall keeping every fall line at ${formatRatio(a.minFall.ratio)} is ${formatRatio(a.advice.minimumBaseFall.ratio)} (${fallDetail(a.advice.minimumBaseFall.ratio)}).`,
    );
  if (a.advice.extraOutlet)
    warnings.push(
      `Advice: one more outlet at ${pt(a.advice.extraOutlet.at)} (edge ${a.advice.extraOutlet.edge + 1}) would bring the longest fall line to ${formatRatio(a.advice.extraOutlet.longestFallRatio)}.`,
    );
  const ruleSet = {
    title: "Rule set and sources",
    name: a.ruleSet.name,
    lines: a.ruleSet.used.map(
      (u) =>
        `${RULE_KEY_NAMES[u.key] ?? u.key}: ${u.unit === "ratio" ? `${formatRatio(u.value)} (${fallDetail(u.value)})` : u.unit === "m" ? `${Math.round(u.value * 1000)} mm` : `× ${u.value}`}, ${citation(u)}`,
    ),
    notes: RULE_SETS[a.ruleSet.id]?.notes ?? [],
  };
  const edges = spec.outline.length;
  return {
    title: p.name,
    subtitle: `Check sheet · ${edges} edges, ${spec.outlets.length} outlet${spec.outlets.length === 1 ? "" : "s"} · rule set: ${a.ruleSet.name} · ${isoDate(p.date)}`,
    figures,
    tables,
    warnings,
    ruleSet,
  };
}
