/**
 * Which parts of a task's roof the trainee changed that the task fixes. Pure and light (no units
 * library), so the lesson editor uses it in the browser to lock those parts, and the server's
 * grading uses the same function for its "Keep what the task fixes" check.
 */
import { parseFall } from "../../engine";
import type { RoofSpec } from "../../engine/types";

const near = (a: number, b: number) => Math.abs(a - b) <= 1e-6 * Math.max(1, Math.abs(a), Math.abs(b));

function samePoints(a: unknown, b: unknown): boolean {
  if (!Array.isArray(a) || !Array.isArray(b)) return a === b;
  const strip = (pts: unknown[]) => {
    const p = pts as [number, number][];
    // A repeated closing point is the same outline.
    return p.length > 3 && near(p[0][0], p[p.length - 1][0]) && near(p[0][1], p[p.length - 1][1]) ? p.slice(0, -1) : p;
  };
  const x = strip(a);
  const y = strip(b);
  return x.length === y.length && x.every((p, i) => near(p[0], y[i][0]) && near(p[1], y[i][1]));
}

function fallRatio(v: string | number | undefined): number | null {
  if (v === undefined) return null;
  const r = parseFall(v);
  return r.ok ? r.ratio : null;
}

/**
 * Which fixed parts of the task's roof the trainee changed. Defaults count as given (an edge list
 * of all parapets equals no edge list), so an editor that writes defaults out is not penalised.
 */
export function changedFixedKeys(
  task: { editable: readonly string[] },
  start: RoofSpec,
  submitted: RoofSpec,
): string[] {
  const editable = new Set<string>(task.editable);
  const changed: string[] = [];
  if (!editable.has("outline") && !samePoints(start.outline, submitted.outline)) changed.push("outline");
  if (!editable.has("edges")) {
    const n = start.outline.length;
    const norm = (e: RoofSpec["edges"], count: number) => Array.from({ length: count }, (_, i) => e?.[i] ?? "parapet");
    const count = Math.max(n, submitted.outline.length);
    if (norm(start.edges, count).join() !== norm(submitted.edges, count).join()) changed.push("edges");
  }
  if (!editable.has("baseFall") && !near(fallRatio(start.baseFall) ?? 0, fallRatio(submitted.baseFall) ?? -1))
    changed.push("baseFall");
  if (!editable.has("highLevel") && (start.highLevel ?? null) !== (submitted.highLevel ?? null)) {
    if (start.highLevel == null || submitted.highLevel == null || !near(start.highLevel, submitted.highLevel))
      changed.push("highLevel");
  }
  if (!editable.has("joists")) {
    const a = start.joists ?? {};
    const b = submitted.joists ?? {};
    const sameNum = (x: number | undefined, y: number | undefined, d: number) => near(x ?? d, y ?? d);
    const dirA = a.direction;
    const dirB = b.direction;
    const dirSame = !dirA
      ? !dirB || dirB === dirA
      : !!dirB &&
        near(dirA[0] / Math.hypot(...dirA), dirB[0] / Math.hypot(...dirB)) &&
        near(dirA[1] / Math.hypot(...dirA), dirB[1] / Math.hypot(...dirB));
    if (!sameNum(a.spacing, b.spacing, 0.4) || !sameNum(a.offset, b.offset, 0) || !dirSame) changed.push("joists");
  }
  if (!editable.has("outletLevels") && submitted.outlets.some((o) => o.level !== undefined && !near(o.level, 0))) {
    const startLevels = new Set(start.outlets.map((o) => o.level ?? 0));
    if (submitted.outlets.some((o) => !startLevels.has(o.level ?? 0))) changed.push("outlet levels");
  }
  if (
    !editable.has("outlets") &&
    !samePoints(
      start.outlets.map((o) => o.at),
      submitted.outlets.map((o) => o.at),
    )
  )
    changed.push("outlets");
  if (!editable.has("openings")) {
    const a = start.openings ?? [];
    const b = submitted.openings ?? [];
    const same =
      a.length === b.length &&
      a.every(
        (o, i) =>
          samePoints(o.outline, b[i].outline) &&
          (o.kind ?? "other") === (b[i].kind ?? "other") &&
          near(o.upstand ?? 0.15, b[i].upstand ?? 0.15),
      );
    if (!same) changed.push("openings");
  }
  const minA = fallRatio(start.minFall ?? "1:100");
  const minB = fallRatio(submitted.minFall ?? "1:100");
  if (minA !== minB && !(minA != null && minB != null && near(minA, minB))) changed.push("minimum fall");
  if ((start.rainfall?.intensity ?? null) !== (submitted.rainfall?.intensity ?? null)) changed.push("rainfall");
  if ((start.ruleSet ?? "common-practice") !== (submitted.ruleSet ?? "common-practice")) changed.push("rule set");
  const g = (s: RoofSpec) =>
    JSON.stringify([
      s.gutter?.width ?? null,
      s.gutter?.depth ?? null,
      s.gutter?.fall == null ? null : fallRatio(s.gutter.fall),
    ]);
  if (g(start) !== g(submitted)) changed.push("gutter");
  return changed;
}
