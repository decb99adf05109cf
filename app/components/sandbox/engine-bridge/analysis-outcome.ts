import type { analyse, Analysis, AnalyseOptions, parseSpec, RoofSpec } from "~/engine/core";
import type { EngineError } from "../state/store";

/** `preview`: the drag preview, on a coarser mesh (docs/decisions/0002-engine-in-a-worker-and-on-the-server.md). */
export type EngineOutcome = { ok: true; analysis: Analysis; preview?: boolean } | { ok: false; error: EngineError };

interface Engine {
  parseSpec: typeof parseSpec;
  analyse: typeof analyse;
}

/**
 * Validate and analyse a spec with the given engine functions; never throws (an engine fault
 * becomes an error the panel can show). The worker passes `~/engine/core`'s, pages `~/engine`'s.
 */
export function analysisOutcome(
  spec: RoofSpec,
  { parseSpec, analyse }: Engine,
  options?: AnalyseOptions,
): EngineOutcome {
  try {
    const parsed = parseSpec(spec);
    if (!parsed.ok) {
      return {
        ok: false,
        error: {
          status: parsed.status,
          message: parsed.error.message,
          issues: parsed.error.issues.map((i) => ({ path: String(i.path), message: i.message })),
        },
      };
    }
    return { ok: true, analysis: analyse(parsed.spec, options) };
  } catch (error) {
    return {
      ok: false,
      error: {
        status: 500,
        message: `The engine could not analyse this roof: ${(error as Error)?.message ?? error}`,
        issues: [],
      },
    };
  }
}
