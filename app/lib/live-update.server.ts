import { z } from "zod";
import { parseSpec } from "~/engine";
import { jsonError, zodIssues } from "~/lib/json-api.server";
import type { LiveContent } from "~/lib/live.server";

const LiveUpdate = z.object({
  spec: z.unknown(),
  title: z.string().trim().max(200).default(""),
  source: z.string().trim().max(200).default(""),
  deck: z.string().trim().max(200).default(""),
  step: z
    .object({ index: z.number().int().min(0).max(999), count: z.number().int().min(1).max(1000) })
    .nullable()
    .default(null),
});

export type LiveUpdate = Omit<LiveContent, "presenter" | "at">;

/** The presenter's POST body: only a roof the engine accepts goes out to the followers. */
export function parseLiveUpdate(body: unknown): { ok: true; value: LiveUpdate } | { ok: false; response: Response } {
  const shaped = LiveUpdate.safeParse(body);
  if (!shaped.success)
    return { ok: false, response: jsonError(400, "The live update is malformed.", zodIssues(shaped.error.issues)) };
  const spec = parseSpec(shaped.data.spec);
  if (!spec.ok) {
    return {
      ok: false,
      response: jsonError(
        spec.status,
        spec.error.message,
        spec.error.issues.map((i) => ({ path: `spec.${i.path}`, message: i.message })),
      ),
    };
  }
  return { ok: true, value: { ...shaped.data, spec: spec.spec } };
}

const PhaseChange = z.object({ phase: z.enum(["live", "paused", "ended"]) }).strict();

/**
 * A body that names a phase (and nothing else) pauses, resumes or ends the session; null when the
 * body is a roof update instead.
 */
export function parsePhaseChange(
  body: unknown,
): { ok: true; phase: "live" | "paused" | "ended" } | { ok: false; response: Response } | null {
  if (!body || typeof body !== "object" || Array.isArray(body) || !("phase" in body)) return null;
  const parsed = PhaseChange.safeParse(body);
  if (!parsed.success)
    return {
      ok: false,
      response: jsonError(
        400,
        "Say which phase: live, paused or ended (and nothing else).",
        zodIssues(parsed.error.issues),
      ),
    };
  return { ok: true, phase: parsed.data.phase };
}
