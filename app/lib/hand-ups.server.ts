/**
 * Hands up: during a live session a trainee sends a roof to the class's trainer, who sees the
 * class's roofs on a wall and may put any one on the shared screen. One hand-up per trainee and
 * class (a new one replaces the old); ending the session clears them. Changes go out through the
 * live feed's LISTEN/NOTIFY channel (docs/decisions/0006-live-feed-over-listen-notify.md), so a
 * trainer's wall on any process hears of a hand-up made on any other.
 */
import { z } from "zod";
import { parseSpec, type RoofSpec } from "~/engine";
import { db } from "~/lib/db.server";
import { jsonError, zodIssues } from "~/lib/json-api.server";
import { bumpWall, type LivePhase } from "~/lib/live.server";
import { PoolBusy, PoolTimeout, runInPool } from "~/lib/pool.server";

/** The figures a wall tile shows: what the class compares at a glance (the sandbox's key figures). */
export interface HandUpFigures {
  /** High level above the outlets, in metres. */
  highLevel: number;
  longestFallLine: { length: number; ratio: number } | null;
  /** The flattest fall line's 1:N (null when level). */
  worstFallRatio: number | null;
  minFallRatio: number;
}

export interface HandUp {
  id: string;
  userId: string;
  name: string;
  title: string;
  spec: RoofSpec;
  figures: HandUpFigures;
  at: string;
}

export interface Wall {
  wallSeq: number;
  handUps: HandUp[];
}

const HandUpBody = z.object({
  spec: z.unknown(),
  title: z.string().trim().max(120).default(""),
});

export type ParsedHandUp = { ok: true; spec: RoofSpec; title: string } | { ok: false; response: Response };

/** The trainee's POST body: a title and a roof the engine accepts. */
export function parseHandUp(body: unknown): ParsedHandUp {
  const shaped = HandUpBody.safeParse(body);
  if (!shaped.success)
    return { ok: false, response: jsonError(400, "The hand-up is malformed.", zodIssues(shaped.error.issues)) };
  if (shaped.data.spec === undefined)
    return {
      ok: false,
      response: jsonError(400, "Send the roof to hand up.", [{ path: "spec", message: "Required" }]),
    };
  const spec = parseSpec(shaped.data.spec);
  if (!spec.ok)
    return {
      ok: false,
      response: jsonError(
        spec.status,
        spec.error.message,
        spec.error.issues.map((i) => ({ path: `spec.${i.path}`, message: i.message })),
      ),
    };
  return { ok: true, spec: spec.spec, title: shaped.data.title };
}

/** The wall's figures for a roof, worked out in the engine's worker pool; a Response when it cannot be. */
export async function handUpFigures(spec: RoofSpec): Promise<HandUpFigures | Response> {
  try {
    const result = await runInPool("engine", { kind: "shape", spec, mesh: false }, 30_000);
    if (result.kind === "refused") return jsonError(result.status, result.error.message);
    if (result.kind !== "analysis") return jsonError(422, "This roof could not be shaped, so it cannot be handed up.");
    const { shaped, minFall } = result.analysis;
    return {
      highLevel: shaped.highLevel,
      longestFallLine: shaped.longestFallLine
        ? { length: shaped.longestFallLine.length, ratio: shaped.longestFallLine.ratio }
        : null,
      worstFallRatio: shaped.worstFallRatio ?? null,
      minFallRatio: minFall.ratio,
    };
  } catch (error) {
    if (error instanceof PoolBusy || error instanceof PoolTimeout)
      return jsonError(503, "The server is busy. Hand up again in a few seconds.", [], { "Retry-After": "5" });
    throw error;
  }
}

/** Whether hands may go up now: only while the trainer presents (live or paused). */
export async function sessionPhase(classId: string): Promise<LivePhase | null> {
  const row = await db()("classes").where({ id: classId }).first("live_phase");
  return row?.live_phase ?? null;
}

/** Puts (or replaces) a trainee's roof on the class's wall and tells the trainer's streams. */
export async function raiseHand(
  classId: string,
  userId: string,
  input: { title: string; spec: RoofSpec; figures: HandUpFigures },
): Promise<{ id: string; wallSeq: number }> {
  const out = await db().transaction(async (trx) => {
    const [row] = await trx("class_hand_ups")
      .insert({
        class_id: classId,
        user_id: userId,
        title: input.title,
        spec: JSON.stringify(input.spec),
        figures: JSON.stringify(input.figures),
        created_at: trx.fn.now(),
      })
      .onConflict(["class_id", "user_id"])
      .merge(["title", "spec", "figures", "created_at"])
      .returning("id");
    const wallSeq = await bumpWall(trx, classId);
    return { id: row.id as string, wallSeq };
  });
  globalThis.__fallwrightLiveHub?.deliverWall(classId);
  return out;
}

/** The class's wall, oldest hand first (the order hands went up). */
export async function readWall(classId: string): Promise<Wall | null> {
  const cls = await db()("classes").where({ id: classId }).first("wall_seq");
  if (!cls) return null;
  const rows = await db()("class_hand_ups as h")
    .join("users as u", "u.id", "h.user_id")
    .where("h.class_id", classId)
    .orderBy([{ column: "h.created_at" }, { column: "h.id" }])
    .select("h.id", "h.user_id", "u.name", "u.email", "h.title", "h.spec", "h.figures", "h.created_at");
  return {
    wallSeq: cls.wall_seq,
    handUps: rows.map((r) => ({
      id: r.id,
      userId: r.user_id,
      name: r.name || r.email,
      title: r.title,
      spec: r.spec,
      figures: r.figures,
      at: new Date(r.created_at).toISOString(),
    })),
  };
}
