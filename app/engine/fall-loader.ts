import { fallNeedsUnitReader } from "./fall";

/** The spec's fields that hold a fall (app/engine/schema.ts), at any depth. */
const FALL_KEYS = new Set(["baseFall", "minFall", "fall"]);

/**
 * Whether a spec (or a typed fall, given as a string) holds a fall that needs the unit reader,
 * which is not loaded yet.
 */
export function needsFallUnits(value: unknown, depth = 0): boolean {
  if (typeof value === "string") return fallNeedsUnitReader(value);
  if (depth > 8 || value == null || typeof value !== "object") return false;
  if (Array.isArray(value))
    return value.some((v) => v != null && typeof v === "object" && needsFallUnits(v, depth + 1));
  return Object.entries(value).some(([k, v]) =>
    FALL_KEYS.has(k) ? fallNeedsUnitReader(v) : v != null && typeof v === "object" && needsFallUnits(v, depth + 1),
  );
}

let loading: Promise<unknown> | null = null;

/** Loads and installs the fall unit reader (mathjs) once. */
export function loadFallUnits(): Promise<unknown> {
  loading ??= import("./fall-units").catch((error: unknown) => {
    loading = null;
    throw error;
  });
  return loading;
}
