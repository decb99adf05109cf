import * as z from "zod/mini";
import { en } from "zod/locales";
import { parseFall } from "./fall";
import { RULE_SET_IDS } from "./rule-sets";

// zod's small functional build keeps the sandbox's engine worker light; its English messages
// are loaded explicitly (the full build does that by itself).
z.config(en());

/** Plan coordinates are metres; anything beyond 10,000 km is a unit mistake, not a roof. */
const coordinate = z.number({ error: "must be a finite number (metres)" }).check(z.gte(-1e7), z.lte(1e7));
const point = z.tuple([coordinate, coordinate], { error: "must be a point [x, y] in metres" });
const limited = (min: number, max: number, tooSmall?: string, tooLarge?: string) =>
  z.number().check(z.gte(min, tooSmall), z.lte(max, tooLarge));

const fall = z.union([z.string(), z.number()], { error: "must be a fall such as 1:40, 2°, 2.5% or 25 mm/m" }).check(
  z.superRefine((value, ctx) => {
    const parsed = parseFall(value);
    if (!parsed.ok) ctx.addIssue({ code: "custom", message: `${JSON.stringify(value).slice(0, 40)} ${parsed.error}` });
  }),
);

/** The request body of POST /api/v1/analyses, checked for shape and ranges (docs/roof-method.md §9). */
export const roofSpecSchema = z.object({
  // One extra vertex is allowed for a repeated closing point, dropped on normalising.
  outline: z
    .array(point, { error: "must be a list of [x, y] points" })
    .check(z.minLength(3, "needs at least 3 vertices"), z.maxLength(201, "allows at most 200 vertices")),
  edges: z.optional(
    z.array(z.enum(["parapet", "eaves"], { error: 'must be "parapet" or "eaves"' })).check(z.maxLength(201)),
  ),
  outlets: z.optional(
    z
      .array(
        z.object({
          at: point,
          level: z.optional(limited(-100, 100)),
          size: z.optional(z.number().check(z.gt(0, "must be more than 0 (metres)"), z.lte(2, "must be at most 2 m"))),
        }),
        { error: "must be a list of outlets {at: [x, y]}" },
      )
      .check(z.maxLength(100, "allows at most 100 outlets")),
  ),
  baseFall: fall,
  highLevel: z.optional(limited(-100, 100)),
  joists: z.optional(
    z.object({
      spacing: z.optional(limited(0.05, 20, "must be at least 0.05 m", "must be at most 20 m")),
      direction: z.optional(point.check(z.refine(([x, y]) => Math.hypot(x, y) > 1e-9, "must not be the zero vector"))),
      offset: z.optional(limited(0, 100_000)),
      fromOutlets: z.optional(z.boolean({ error: "must be true or false" })),
    }),
  ),
  minFall: z.optional(fall),
  gutter: z.optional(
    z.object({
      width: z.optional(z.number().check(z.gt(0), z.lte(5, "must be at most 5 m"))),
      depth: z.optional(limited(0, 2, undefined, "must be at most 2 m")),
      fall: z.optional(fall),
    }),
  ),
  rainfall: z.optional(
    z.object({
      intensity: z.number().check(z.gt(0, "must be more than 0 mm/h"), z.lte(2000, "must be at most 2000 mm/h")),
    }),
  ),
  probes: z.optional(z.array(point).check(z.maxLength(1000, "allows at most 1000 probes"))),
  openings: z.optional(
    z
      .array(
        z.object({
          // One extra vertex is allowed for a repeated closing point.
          outline: z
            .array(point, { error: "must be a list of [x, y] points" })
            .check(z.minLength(3, "needs at least 3 vertices"), z.maxLength(51, "allows at most 50 vertices")),
          kind: z.optional(
            z.enum(["rooflight", "hatch", "plant", "other"], {
              error: 'must be "rooflight", "hatch", "plant" or "other"',
            }),
          ),
          upstand: z.optional(limited(0, 2, "must be at least 0 m", "must be at most 2 m")),
        }),
        { error: "must be a list of openings {outline: [[x, y], ...]}" },
      )
      .check(z.maxLength(50, "allows at most 50 openings")),
  ),
  // Drainage areas (docs/roof-method-plans.md P4): ridges from wall to wall, and the joist
  // settings of the area holding a point; crickets (P5) are ridges of their own kind.
  ridges: z.optional(
    z
      .array(
        z.object({
          line: z
            .array(point, { error: "must be a list of [x, y] points" })
            .check(z.minLength(2, "needs at least 2 points"), z.maxLength(50, "allows at most 50 points")),
          kind: z.optional(z.enum(["divide", "cricket"], { error: 'must be "divide" or "cricket"' })),
        }),
        { error: "must be a list of ridges {line: [[x, y], ...]}" },
      )
      .check(z.maxLength(50, "allows at most 50 ridges")),
  ),
  areas: z.optional(
    z
      .array(
        z.object({
          at: point,
          joists: z.optional(
            z.object({
              spacing: z.optional(limited(0.05, 20, "must be at least 0.05 m", "must be at most 20 m")),
              direction: z.optional(
                point.check(z.refine(([x, y]) => Math.hypot(x, y) > 1e-9, "must not be the zero vector")),
              ),
              offset: z.optional(limited(0, 100_000)),
            }),
          ),
        }),
        { error: "must be a list of areas {at: [x, y], joists: {...}}" },
      )
      .check(z.maxLength(50, "allows at most 50 areas")),
  ),
  ruleSet: z.optional(
    z.enum(RULE_SET_IDS as [string, ...string[]], { error: `must be one of ${RULE_SET_IDS.join(", ")}` }),
  ),
});
