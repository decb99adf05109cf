/**
 * The caption over a live roof (present mode and every follower). A deck step's caption or a
 * handed-up roof's name describes that roof only while it is what is shown: once the trainer
 * changes it, the caption is worked out from the roof on screen, so it never says "1:68" above a
 * roof whose base fall is 1:40.
 */
import { parseSpec, type RoofSpec } from "~/engine";

/** Object keys in a fixed order, so two specs that differ only in key order compare equal. */
function canonical(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(canonical);
  if (value && typeof value === "object")
    return Object.fromEntries(
      Object.keys(value)
        .sort()
        .map((k) => [k, canonical((value as Record<string, unknown>)[k])]),
    );
  return value;
}

const key = (spec: unknown) => {
  const parsed = parseSpec(spec);
  return JSON.stringify(canonical(parsed.ok ? parsed.spec : spec));
};

/** Whether two specs are the same roof (as the engine reads them: defaults filled in). */
export function sameRoof(a: unknown, b: unknown): boolean {
  if (a === b) return true;
  return key(a) === key(b);
}

const num = (v: number) => String(Number(v.toFixed(2)));

/** A one-line description of a roof from its spec: plan size, outlets and base fall. */
export function describeRoof(spec: unknown): string {
  const s = spec as Partial<RoofSpec> | null;
  if (!s || !Array.isArray(s.outline) || s.outline.length < 3) return "a roof";
  const xs = s.outline.map((p) => p[0]);
  const ys = s.outline.map((p) => p[1]);
  const outlets = Array.isArray(s.outlets) ? s.outlets.length : 0;
  const parts = [
    `${num(Math.max(...xs) - Math.min(...xs))} × ${num(Math.max(...ys) - Math.min(...ys))} m plan`,
    outlets === 0 ? "no outlet" : outlets === 1 ? "one outlet" : `${outlets} outlets`,
  ];
  if (s.baseFall != null) parts.push(`base fall ${String(s.baseFall)}`);
  return parts.join(", ");
}

/** What a caption was written for: a step's roof and its caption, or a handed-up roof and whose it is. */
export interface CaptionBase {
  caption: string;
  spec: unknown;
}

/** The caption for the roof on screen: the base's while unchanged, else one worked out from the roof. */
export function liveCaption(base: CaptionBase | null, shown: unknown): { title: string; changed: boolean } {
  if (base && sameRoof(base.spec, shown)) return { title: base.caption, changed: false };
  return { title: `Changed live: ${describeRoof(shown)}`, changed: true };
}

/** Added to a live roof's source once the trainer has changed it (present mode). */
export const CHANGED_LIVE = " · changed live";

/**
 * Which roof of the trainer's a live state shows, edits aside: the deck and step, or the roof
 * handed up. The same while the trainer edits it; new at the next step or hand-up.
 */
export function liveRoofKey(state: { deck?: string; step?: { index: number } | null; source: string }): string {
  const source = state.source.endsWith(CHANGED_LIVE) ? state.source.slice(0, -CHANGED_LIVE.length) : state.source;
  return `${state.deck ?? ""}|${state.step?.index ?? ""}|${source}`;
}
