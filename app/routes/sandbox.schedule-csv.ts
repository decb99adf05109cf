import type { Route } from "./+types/sandbox.schedule-csv";
import { analyse, parseSpec } from "~/engine";
import { scheduleCsv } from "~/components/sandbox/schedule-csv";

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
 */
export async function action({ request }: Route.ActionArgs) {
  if (request.method !== "POST") return text("Only POST.", 405, { Allow: "POST" });
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
  const parsed = parseSpec(input);
  if (!parsed.ok) return text(parsed.error.message, parsed.status);
  let csv: string;
  try {
    csv = scheduleCsv(analyse(parsed.spec, { mesh: false, traces: false }).shaped.joists);
  } catch {
    return text("This roof could not be analysed.", 422);
  }
  return new Response(`\uFEFF${csv}\r\n`, {
    headers: {
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": 'attachment; filename="drop-schedule.csv"',
      "Cache-Control": "no-store",
    },
  });
}
