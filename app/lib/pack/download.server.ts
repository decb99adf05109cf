/**
 * The builder's pack as HTTP downloads: one place that turns a named roof spec into the CSV,
 * PDF, DXF or glb response, for the saved roof's addresses (/roofs/:id/…), the sandbox's
 * (POST the spec) and a share link's (/s/:token/…).
 */
import type { AppLoadContext } from "react-router";
import { parseSpec, type Analysis, type RoofSpec } from "~/engine";
import { PoolBusy, PoolTimeout, runInPool } from "~/lib/pool.server";
import { chargeApiWork, limitApiRequest } from "~/lib/rate-limit.server";
import { isUnitSystem, systemFor, type UnitSystem } from "~/lib/units";
import { requirePermission } from "~/lib/auth.server";
import { getRoofFor } from "~/lib/roofs.server";
import { packFileName, PACK_FILES, type PackFile, type PackRoof, type PackWriter } from "./facts";

export { PACK_FILES, type PackFile, type PackWriter };
import { planDxf } from "./plan-dxf";
import { scheduleCsv } from "./schedule-csv";

export const SCHEDULE_CSV: PackWriter = {
  file: "schedule.csv",
  what: "drop-schedule",
  ext: "csv",
  type: "text/csv; charset=utf-8",
  mesh: false,
  // A byte-order mark so spreadsheet programs read the file as UTF-8.
  write: (p) => `\uFEFF${scheduleCsv(p)}\r\n`,
};

export const PLAN_DXF: PackWriter = {
  file: "plan.dxf",
  what: "plan",
  ext: "dxf",
  type: "application/dxf",
  mesh: false,
  write: planDxf,
};

export const isPackFile = (f: unknown): f is PackFile =>
  typeof f === "string" && (PACK_FILES as readonly string[]).includes(f);

const text = (body: string, status: number, headers: Record<string, string> = {}) =>
  new Response(body, { status, headers: { "Content-Type": "text/plain; charset=utf-8", ...headers } });

/** The file for a spec already checked by parseSpec; 422 when the engine cannot shape it. */
export async function packResponse(
  w: PackWriter,
  name: string,
  spec: RoofSpec,
  cache = "no-store",
  opts: { units?: UnitSystem; context?: AppLoadContext } = {},
): Promise<Response> {
  // The analysis runs in the engine's worker pool, so a large roof never holds up other requests.
  let analysis: Analysis;
  try {
    const result = await runInPool("engine", { kind: "shape", spec, mesh: w.mesh }, 15_000);
    if (opts.context) chargeApiWork(opts.context, result.ms);
    if (result.kind === "refused") return text(result.error.message, result.status);
    if (result.kind !== "analysis") return text("This roof could not be analysed.", 422);
    analysis = result.analysis;
  } catch (error) {
    if (error instanceof PoolBusy || error instanceof PoolTimeout)
      return text("The server is busy. Try again in a few seconds.", 503, { "Retry-After": "5" });
    throw error;
  }
  const pack: PackRoof = { name, date: new Date(), spec, analysis, units: opts.units ?? systemFor(null, spec.ruleSet) };
  const body = await w.write(pack);
  return new Response(body as BodyInit, {
    headers: {
      "Content-Type": w.type,
      "Content-Disposition": `attachment; filename="${packFileName(name, w.what, pack.date, w.ext)}"`,
      "Cache-Control": cache,
    },
  });
}

/** A saved roof's file, for whoever may read the roof (owner, or a colleague when it is shared). */
export async function roofPackResponse(request: Request, id: string, w: PackWriter): Promise<Response> {
  const user = await requirePermission(request, "roofs:own");
  const roof = await getRoofFor(user, id);
  if (!roof) return text("No roof with that id in your library.", 404);
  return savedSpecResponse(w, roof.name, roof.spec, "private, no-store");
}

/** A stored spec (checked again: an old roof may no longer pass) as the file. */
export async function savedSpecResponse(
  w: PackWriter,
  name: string,
  stored: unknown,
  cache: string,
): Promise<Response> {
  const parsed = parseSpec(stored);
  if (!parsed.ok) return text(`This roof cannot be shaped as saved: ${parsed.error.message}`, 422);
  return packResponse(w, name, parsed.spec, cache);
}

/** Longest spec text accepted; 200 vertices and 100 outlets fit many times over. */
const MAX_SPEC_CHARS = 256 * 1024;
const NAME_MAX = 120;

interface Fields {
  spec: string | null;
  name: string | null;
  units: string | null;
}

async function readFields(request: Request): Promise<Fields> {
  const type = request.headers.get("content-type") ?? "";
  const query = new URL(request.url).searchParams.get("units");
  if (type.includes("application/json")) return { spec: await request.text(), name: null, units: query };
  if (type.includes("application/x-www-form-urlencoded") || type.includes("multipart/form-data")) {
    const form = await request.formData();
    const spec = form.get("spec");
    const name = form.get("name");
    const units = form.get("units");
    return {
      spec: typeof spec === "string" ? spec : null,
      name: typeof name === "string" ? name : null,
      units: typeof units === "string" ? units : query,
    };
  }
  return { spec: null, name: null, units: query };
}

/**
 * POST /sandbox/<file>: the file for the posted roof (form fields `spec`, JSON, and optional
 * `name`; or the spec as a JSON body). Open to everyone like the sandbox; nothing is stored.
 */
export async function sandboxPackResponse(
  request: Request,
  w: PackWriter,
  context?: AppLoadContext,
): Promise<Response> {
  if (request.method !== "POST") return text("Only POST.", 405, { Allow: "POST" });
  // Anonymous analyses share the open API's per-address budget, charged by the work done.
  const limited = await limitApiRequest(context);
  if (limited)
    return text((await limited.json()).error.message, 429, {
      "Retry-After": limited.headers.get("Retry-After") ?? "60",
    });
  let fields: Fields;
  try {
    fields = await readFields(request);
  } catch {
    return text("The request body could not be read.", 400);
  }
  const raw = fields.spec;
  if (fields.units != null && fields.units !== "" && !isUnitSystem(fields.units))
    return text("The field `units` must be metric or us.", 400);
  if (raw == null || raw.trim() === "") return text("Send the roof spec as the form field `spec` (JSON).", 400);
  if (raw.length > MAX_SPEC_CHARS) return text("The roof spec is too large.", 413);
  const name = (fields.name ?? "").trim() || "Sandbox roof";
  if (name.length > NAME_MAX) return text(`The field \`name\` must be at most ${NAME_MAX} characters.`, 400);
  let input: unknown;
  try {
    input = JSON.parse(raw);
  } catch {
    return text("The field `spec` is not JSON.", 400);
  }
  const parsed = parseSpec(input);
  if (!parsed.ok) return text(parsed.error.message, parsed.status);
  return packResponse(w, name, parsed.spec, "no-store", {
    units: isUnitSystem(fields.units) ? fields.units : undefined,
    context,
  });
}

/** GET on a sandbox file address: it needs the roof posted. */
export const sandboxPackGet = (w: PackWriter) =>
  text(`POST the roof spec (form field \`spec\`, JSON) to get its ${w.file}.`, 405, { Allow: "POST" });
