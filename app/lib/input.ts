/**
 * The rules every value taken from a request obeys, in one place (docs/security.md, "Input"):
 * text PostgreSQL can store, JSON no deeper than it should be, ids that are UUIDs, integers that
 * fit PostgreSQL's `integer`. The host's input guard (app/server/input-guard.ts) applies the text,
 * depth and id rules to every form field, JSON body and query parameter before a route runs;
 * route schemas use `uuid` and `pgInt` so their own field errors say the same.
 */
import { z } from "zod";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** The one UUID check: every id that comes from a request goes through it. */
export const isUuid = (v: unknown): v is string => typeof v === "string" && UUID.test(v);

export const uuid = (what = "an id") => z.string().refine(isUuid, `must be ${what} (a UUID)`);

/** PostgreSQL `integer`: -2147483648 … 2147483647 (PostgreSQL manual, §8.1.1 Integer Types). */
export const PG_INT_MAX = 2_147_483_647;

/** A positive whole number that fits an `integer` column; from a form (coerced) or from JSON. */
export const pgInt = (o: { coerce?: boolean; min?: number } = {}) =>
  (o.coerce ? z.coerce.number({ error: "must be a whole number" }) : z.number({ error: "must be a whole number" }))
    .int("must be a whole number")
    .min(o.min ?? 1, `must be at least ${o.min ?? 1}`)
    .max(PG_INT_MAX, `must be at most ${PG_INT_MAX}`);

/**
 * Deepest JSON a request may carry. A roof spec nests four levels; 64 leaves room for any
 * honest body while keeping recursive code (zod, the engine, PostgreSQL's jsonb) far from
 * its stack limits.
 */
export const MAX_JSON_DEPTH = 64;

const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

/**
 * Why PostgreSQL would refuse this text, or null. It stores no NUL (U+0000) in `text` or
 * `jsonb`, and `jsonb` refuses an unpaired surrogate (which only a JSON escape can make).
 */
export function textProblem(s: string): string | null {
  if (s.includes("\u0000")) return "contains a NUL character (U+0000), which is not allowed";
  if (LONE_SURROGATE.test(s)) return "contains an unpaired surrogate (\\uD800-\\uDFFF), which is not valid Unicode";
  return null;
}

export interface InputProblem {
  /** The field, query parameter or JSON path (`spec.outline.0`), or "(body)". */
  path: string;
  message: string;
}

const join = (base: string, key: string | number) => (base === "" ? String(key) : `${base}.${key}`);

/** The first key or string in a parsed JSON value PostgreSQL would refuse, or nesting over `maxDepth`. */
export function jsonProblem(value: unknown, base = "", maxDepth = MAX_JSON_DEPTH): InputProblem | null {
  const stack: { v: unknown; path: string; depth: number }[] = [{ v: value, path: base, depth: 0 }];
  while (stack.length) {
    const { v, path, depth } = stack.pop()!;
    if (typeof v === "string") {
      const p = textProblem(v);
      if (p) return { path: path || "(body)", message: p };
    } else if (v && typeof v === "object") {
      if (depth >= maxDepth) return { path: path || "(body)", message: `nests deeper than ${maxDepth} levels` };
      if (Array.isArray(v)) {
        for (let i = v.length - 1; i >= 0; i--) stack.push({ v: v[i], path: join(path, i), depth: depth + 1 });
      } else {
        for (const [k, child] of Object.entries(v)) {
          const p = textProblem(k);
          if (p)
            return {
              path: join(path, k.replaceAll("\u0000", "�").replace(/[\uD800-\uDFFF]/g, "�")),
              message: `has a key that ${p}`,
            };
          stack.push({ v: child, path: join(path, k), depth: depth + 1 });
        }
      }
    }
  }
  return null;
}

/**
 * Names that carry an id wherever they appear: route parameters (`:id`) and these query or
 * form fields. A value that is not a UUID is refused before any query is built from it.
 */
export const ID_FIELDS: ReadonlySet<string> = new Set(["id", "userId", "trainee", "class", "classId"]);
