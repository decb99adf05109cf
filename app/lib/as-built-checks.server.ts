import { parseSpec, type Analysis, type AsBuiltResult, type RoofSpec } from "~/engine";
import { db } from "~/lib/db.server";
import { isUuid } from "~/lib/input";
import { PoolBusy, PoolTimeout, runInPool } from "~/lib/pool.server";
import type { CheckMeta } from "~/lib/as-built-check";

/** Saved as-built checks (docs/as-built.md, "Saved checks"; table as_built_checks in docs/data-model.md). */

export interface CheckSummary {
  id: string;
  measuredOn: string;
  measuredBy: string;
  checkedBy: string;
  passed: boolean;
  failures: number;
  points: number;
  roofVersion: number;
  createdAt: string;
}

export interface CheckDetail extends CheckSummary {
  spec: RoofSpec;
  tolerance: { deviation: number; minFall: number; pondDepth: number };
  result: AsBuiltResult;
  source: "form" | "csv";
}

const day = (d: unknown) =>
  d instanceof Date
    ? `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, "0")}-${String(d.getDate()).padStart(2, "0")}`
    : String(d);

interface Row {
  id: string;
  measured_on: unknown;
  measured_by: string;
  checked_by: string;
  passed: boolean;
  failures: number | string;
  points: number | string;
  roof_version: number;
  created_at: Date;
}

const summary = (r: Row): CheckSummary => ({
  id: r.id,
  measuredOn: day(r.measured_on),
  measuredBy: r.measured_by,
  checkedBy: r.checked_by,
  passed: r.passed,
  failures: Number(r.failures),
  points: Number(r.points),
  roofVersion: r.roof_version,
  createdAt: r.created_at.toISOString(),
});

const SUMMARY_COLUMNS = [
  "id",
  "measured_on",
  "measured_by",
  "checked_by",
  "passed",
  "roof_version",
  "created_at",
] as const;

/** A roof's checks, newest first (the caller has already checked the roof may be read). */
export async function listChecks(roofId: string): Promise<CheckSummary[]> {
  const rows = await db()("as_built_checks")
    .where({ roof_id: roofId })
    .orderBy([
      { column: "measured_on", order: "desc" },
      { column: "created_at", order: "desc" },
    ])
    .limit(200)
    .select(
      ...SUMMARY_COLUMNS,
      db().raw("jsonb_array_length(result->'verdict'->'failures') as failures"),
      db().raw("jsonb_array_length(points) as points"),
    );
  return (rows as unknown as Row[]).map(summary);
}

/** One check of this roof, or null (a check of another roof is not found). */
export async function getCheck(roofId: string, checkId: string): Promise<CheckDetail | null> {
  if (!isUuid(checkId)) return null;
  const r = await db()("as_built_checks")
    .where({ roof_id: roofId, id: checkId })
    .first(
      ...SUMMARY_COLUMNS,
      "spec",
      "tolerance",
      "result",
      "source",
      db().raw("jsonb_array_length(result->'verdict'->'failures') as failures"),
      db().raw("jsonb_array_length(points) as points"),
    );
  if (!r) return null;
  // The jsonb columns hold what insertCheck wrote: the spec and result as the engine gave them.
  return {
    ...summary(r as unknown as Row),
    spec: r.spec as CheckDetail["spec"],
    tolerance: r.tolerance as CheckDetail["tolerance"],
    result: r.result as CheckDetail["result"],
    source: r.source as CheckDetail["source"],
  };
}

export async function insertCheck(o: {
  roofId: string;
  roofVersion: number;
  spec: RoofSpec;
  meta: CheckMeta;
  points: { at: [number, number]; level: number; label?: string }[];
  result: AsBuiltResult;
  source: "form" | "csv";
  userId: string;
}): Promise<string> {
  const [row] = await db()("as_built_checks")
    .insert({
      roof_id: o.roofId,
      roof_version: o.roofVersion,
      spec: JSON.stringify(o.spec),
      measured_by: o.meta.measuredBy,
      checked_by: o.meta.checkedBy,
      measured_on: o.meta.measuredOn,
      points: JSON.stringify(o.points),
      tolerance: JSON.stringify(o.result.tolerance),
      passed: o.result.verdict.passed,
      // JSON has no Infinity: a level triangle's fall is stored as null.
      result: JSON.stringify(o.result),
      source: o.source,
      created_by: o.userId,
    })
    .returning("id");
  return row.id as string;
}

export type EngineOutcome<T> = { ok: true; value: T } | { ok: false; status: number; message: string };

const busy = (error: unknown): EngineOutcome<never> | null =>
  error instanceof PoolBusy || error instanceof PoolTimeout
    ? { ok: false, status: 503, message: "The server is busy. Try again in a few seconds." }
    : null;

/** The roof's design (drop schedule) from a stored spec, in the engine's worker pool. */
export async function shapeStored(stored: unknown): Promise<EngineOutcome<{ spec: RoofSpec; analysis: Analysis }>> {
  const parsed = parseSpec(stored);
  if (!parsed.ok)
    return { ok: false, status: 422, message: `This roof cannot be shaped as saved: ${parsed.error.message}` };
  try {
    const r = await runInPool("engine", { kind: "shape", spec: parsed.spec, mesh: false }, 15_000);
    if (r.kind === "analysis") return { ok: true, value: { spec: parsed.spec, analysis: r.analysis } };
    return {
      ok: false,
      status: 422,
      message: r.kind === "refused" ? r.error.message : "This roof could not be analysed.",
    };
  } catch (error) {
    const b = busy(error);
    if (b) return b;
    throw error;
  }
}

/** The as-built check, in the engine's worker pool. */
export async function runCheck(
  spec: RoofSpec,
  points: { at: [number, number]; level: number; label?: string }[],
  tolerance: { deviation?: number; pondDepth?: number },
): Promise<EngineOutcome<AsBuiltResult>> {
  try {
    const r = await runInPool("engine", { kind: "as-built", spec, points, tolerance }, 20_000);
    if (r.kind === "as-built") return { ok: true, value: r.result };
    return {
      ok: false,
      status: 422,
      message: r.kind === "refused" ? r.error.message : "The levels could not be checked.",
    };
  } catch (error) {
    const b = busy(error);
    if (b) return b;
    throw error;
  }
}
