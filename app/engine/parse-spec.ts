import { prepareRoof, type SpecIssue } from "./prepare";
import type { Roof } from "./roof";
import { roofSpecSchema } from "./schema";
import type { RoofSpec } from "./types";

export type ParseSpecResult =
  { ok: true; spec: RoofSpec } | { ok: false; status: 400 | 422; error: { message: string; issues: SpecIssue[] } };

/** parseSpec's answer with the roof it prepared, for `analyseRoof` (no second preparation). */
export type ParseRoofResult = Exclude<ParseSpecResult, { ok: true }> | { ok: true; spec: RoofSpec; roof: Roof };

const pathOf = (path: readonly PropertyKey[]) => (path.length ? path.map(String).join(".") : "(spec)");

function failure(status: 400 | 422, issues: SpecIssue[]): Exclude<ParseSpecResult, { ok: true }> {
  const head = status === 400 ? "The roof spec is malformed" : "The roof cannot be built";
  const detail = issues
    .slice(0, 3)
    .map((i) => `${i.path}: ${i.message}`)
    .join("; ");
  const more = issues.length > 3 ? ` (and ${issues.length - 3} more)` : "";
  return { ok: false, status, error: { message: `${head}: ${detail}${more}`, issues } };
}

/**
 * Checks a roof spec from any source: shape and ranges with zod (400), then geometry (422:
 * self-crossing outline, zero-length edge, outlet off every parapet edge, too large). Never throws.
 */
export function parseSpec(input: unknown): ParseSpecResult {
  const parsed = parseRoofSpec(input);
  return parsed.ok ? { ok: true, spec: parsed.spec } : parsed;
}

/** parseSpec, also handing back the prepared roof. */
export function parseRoofSpec(input: unknown): ParseRoofResult {
  try {
    const shaped = roofSpecSchema.safeParse(input);
    if (!shaped.success) {
      return failure(
        400,
        shaped.error.issues.slice(0, 50).map((i) => ({ path: pathOf(i.path), message: i.message })),
      );
    }
    const spec = shaped.data as RoofSpec;
    spec.outlets ??= [];
    const prepared = prepareRoof(spec);
    if (!prepared.ok) return failure(prepared.status, prepared.issues);
    // Hand back the normalised outline (closing point dropped) so callers see what was analysed.
    const n = prepared.roof.n;
    if (spec.outline.length !== n) {
      spec.outline = spec.outline.slice(0, n);
      if (spec.edges && spec.edges.length !== n) spec.edges = spec.edges.slice(0, n);
    }
    return { ok: true, spec, roof: prepared.roof };
  } catch {
    return failure(400, [{ path: "(spec)", message: "could not be read as a roof spec" }]);
  }
}
