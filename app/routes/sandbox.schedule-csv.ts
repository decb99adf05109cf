import type { Route } from "./+types/sandbox.schedule-csv";
import { log } from "~/lib/log.server";
import { metrics } from "~/lib/metrics.server";
import { PoolBusy, PoolTimeout, runInPool } from "~/lib/pool.server";
import { currentRequest } from "~/lib/request-context.server";
import { chargeApiWork, limitApiRequest } from "~/lib/rate-limit.server";

/** Longest spec text accepted; 200 vertices and 100 outlets fit many times over. */
const MAX_SPEC_CHARS = 256 * 1024;

const text = (body: string, status: number, headers: Record<string, string> = {}) =>
  new Response(body, { status, headers: { "Content-Type": "text/plain; charset=utf-8", ...headers } });

export function loader() {
  return text("POST the roof spec (form field `spec`, JSON) to get its drop schedule as CSV.", 405, { Allow: "POST" });
}

async function specText(request: Request): Promise<string | null> {
  const type = request.headers.get("content-type") ?? "";
  if (type.includes("application/json")) return await request.text();
  if (type.includes("application/x-www-form-urlencoded") || type.includes("multipart/form-data")) {
    const value = (await request.formData()).get("spec");
    return typeof value === "string" ? value : null;
  }
  return null;
}

/**
 * POST /sandbox/schedule.csv: the drop schedule (every joist span with levels and drops below H)
 * of the posted roof, as a CSV attachment. Open to everyone like the sandbox; nothing is stored.
 * Shares the analysis API's per-address budget (charged by work done) and runs in the engine's
 * worker pool.
 */
export async function action({ request, context }: Route.ActionArgs) {
  if (request.method !== "POST") return text("Only POST.", 405, { Allow: "POST" });
  const limited = await limitApiRequest(context);
  if (limited) return text((await limited.json()).error.message, 429, { "Retry-After": limited.headers.get("Retry-After") ?? "60" });
  let raw: string | null;
  try {
    raw = await specText(request);
  } catch {
    return text("The request body could not be read.", 400);
  }
  if (raw == null || raw.trim() === "") return text("Send the roof spec as the form field `spec` (JSON).", 400);
  if (raw.length > MAX_SPEC_CHARS) return text("The roof spec is too large.", 413);
  let input: unknown;
  try {
    input = JSON.parse(raw);
  } catch {
    return text("The field `spec` is not JSON.", 400);
  }
  const started = performance.now();
  let result;
  try {
    result = await runInPool("engine", { kind: "csv", spec: input }, 30_000);
  } catch (error) {
    if (error instanceof PoolBusy || error instanceof PoolTimeout) return text("The server is busy. Try again in a few seconds.", 503, { "Retry-After": "5" });
    throw error;
  }
  chargeApiWork(context, result.ms);
  metrics().analysisDuration.observe({ kind: "csv", outcome: result.kind === "text" ? "ok" : result.kind }, (performance.now() - started) / 1000);
  if (result.kind === "refused") return text(result.error.message, result.status);
  if (result.kind !== "text") {
    log().error({ reqId: currentRequest()?.id, reason: result.kind === "failed" ? result.message : result.kind }, "schedule CSV: a roof that passed validation could not be analysed");
    return text("This roof could not be analysed.", 422);
  }
  const csv = result.text;
  return new Response(`\uFEFF${csv}\r\n`, {
    headers: {
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": 'attachment; filename="drop-schedule.csv"',
      "Cache-Control": "no-store",
    },
  });
}
