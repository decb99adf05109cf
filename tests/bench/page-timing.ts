/**
 * The arithmetic of the bench's browser section (browser-section.ts), kept apart from the browser
 * so tests/unit/bench-page-timing.test.ts can check it: one page load's marks, their medians over
 * several loads, and the ratios to a plain page measured in the same run.
 */
import { median } from "./stats.ts";

/** One load of one page, in ms from the start of navigation (null: the page never showed it). */
export interface LoadTiming {
  /** First byte of the HTML: the server's loaders and rendering, plus the trip. */
  ttfb: number;
  /** DOMContentLoaded: the HTML parsed and its module scripts run. */
  dcl: number;
  /** The page answers input: `<html data-hydrated>`, set once React has hydrated every route. */
  hydrated: number | null;
  /** The first frame of the 3D view that shows the roof (`data-drawn`); null on a page without 3D. */
  drawn: number | null;
  /** Script bytes (compressed) the page loaded before it answered input. */
  scriptBytes: number;
  /** Time in long tasks (> 50 ms) on the main thread before the page answered input. */
  longTaskMs: number;
  /** The server's own time for the HTML request, from its request log (null when not found). */
  serverMs: number | null;
  /** Where the time to the first 3D frame went (ms from navigation, or ms spent), by name. */
  phases?: Record<string, number | null>;
}

export interface PageSummary {
  loads: number;
  /** Loads that never answered input, or (on a page with 3D) never drew: a row with any fails. */
  missed: { hydrated: number; drawn: number };
  ttfb: number;
  dcl: number;
  hydrated: number | null;
  drawn: number | null;
  scriptKB: number;
  longTaskMs: number;
  serverMs: number | null;
  /** The median of each phase over the loads that recorded it. */
  phases: Record<string, number | null>;
}

/** Median of the values that were measured; null when none was. */
export function medianOf(values: (number | null)[]): number | null {
  const seen = values.filter((v): v is number => v != null && Number.isFinite(v));
  return seen.length ? median(seen) : null;
}

/** Medians over the loads of one page (each mark on its own). */
export function summarise(loads: LoadTiming[]): PageSummary {
  if (!loads.length) throw new Error("no loads to summarise");
  const pick = (k: Exclude<keyof LoadTiming, "phases">) => medianOf(loads.map((l) => l[k]));
  return {
    loads: loads.length,
    missed: {
      hydrated: loads.filter((l) => l.hydrated == null).length,
      drawn: loads.filter((l) => l.drawn == null).length,
    },
    ttfb: pick("ttfb")!,
    dcl: pick("dcl")!,
    hydrated: pick("hydrated"),
    drawn: pick("drawn"),
    scriptKB: pick("scriptBytes")! / 1024,
    longTaskMs: pick("longTaskMs")!,
    serverMs: pick("serverMs"),
    phases: Object.fromEntries(
      [...new Set(loads.flatMap((l) => Object.keys(l.phases ?? {})))].map((k) => [
        k,
        medianOf(loads.map((l) => l.phases?.[k] ?? null)),
      ]),
    ),
  };
}

/**
 * `value / baseline`, the figure that holds across machines; Infinity when the value was never
 * measured (a page that never drew fails its target rather than passing on a missing figure).
 */
export function ratio(value: number | null, baseline: number | null): number {
  if (value == null || !Number.isFinite(value)) return Infinity;
  if (baseline == null || !(baseline > 0)) throw new Error("the plain page gave no baseline");
  return value / baseline;
}

/** Long tasks that started before `until`, summed (a task running across `until` counts whole). */
export function longTaskTime(tasks: { startTime: number; duration: number }[], until: number): number {
  return tasks.filter((t) => t.startTime < until).reduce((sum, t) => sum + t.duration, 0);
}

/**
 * The server's time for one request, from its pino request log (one JSON line per request, with
 * `reqId` and `ms`; README, Request logs). Lines that are not JSON are skipped.
 */
export function serverTime(log: string, requestId: string | null | undefined): number | null {
  if (!requestId) return null;
  for (const line of log.split("\n")) {
    if (!line.includes(requestId)) continue;
    try {
      const entry = JSON.parse(line) as { reqId?: string; ms?: number; msg?: string };
      if (entry.reqId === requestId && typeof entry.ms === "number") return entry.ms;
    } catch {
      /* not a log line */
    }
  }
  return null;
}
