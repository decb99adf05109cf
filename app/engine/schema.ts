import { z } from "zod";
import { parseFall } from "./fall";
import { RULE_SET_IDS } from "./rule-sets";

/** Plan coordinates are metres; anything beyond 10,000 km is a unit mistake, not a roof. */
const coordinate = z.number({ error: "must be a finite number (metres)" }).min(-1e7).max(1e7);
const point = z.tuple([coordinate, coordinate], { error: "must be a point [x, y] in metres" });

const fall = z
  .union([z.string(), z.number()], { error: "must be a fall such as 1:40, 2°, 2.5% or 25 mm/m" })
  .superRefine((value, ctx) => {
    const parsed = parseFall(value);
    if (!parsed.ok) ctx.addIssue({ code: "custom", message: `${JSON.stringify(value).slice(0, 40)} ${parsed.error}` });
  });

/** The request body of POST /api/v1/analyses, checked for shape and ranges (ROOF-METHOD.md §9). */
export const roofSpecSchema = z.object({
  // One extra vertex is allowed for a repeated closing point, dropped on normalising.
  outline: z.array(point, { error: "must be a list of [x, y] points" }).min(3, "needs at least 3 vertices").max(201, "allows at most 200 vertices"),
  edges: z.array(z.enum(["parapet", "eaves"], { error: 'must be "parapet" or "eaves"' })).max(201).optional(),
  outlets: z
    .array(
      z.object({
        at: point,
        level: z.number().min(-100).max(100).optional(),
        size: z.number().gt(0, "must be more than 0 (metres)").max(2, "must be at most 2 m").optional(),
      }),
      { error: "must be a list of outlets {at: [x, y]}" },
    )
    .max(100, "allows at most 100 outlets")
    .optional(),
  baseFall: fall,
  highLevel: z.number().min(-100).max(100).optional(),
  joists: z
    .object({
      spacing: z.number().min(0.05, "must be at least 0.05 m").max(20, "must be at most 20 m").optional(),
      direction: point.refine(([x, y]) => Math.hypot(x, y) > 1e-9, "must not be the zero vector").optional(),
      offset: z.number().min(0).max(100_000).optional(),
    })
    .optional(),
  minFall: fall.optional(),
  gutter: z
    .object({
      width: z.number().gt(0).max(5, "must be at most 5 m").optional(),
      depth: z.number().min(0).max(2, "must be at most 2 m").optional(),
      fall: fall.optional(),
    })
    .optional(),
  rainfall: z.object({ intensity: z.number().gt(0, "must be more than 0 mm/h").max(2000, "must be at most 2000 mm/h") }).optional(),
  probes: z.array(point).max(1000, "allows at most 1000 probes").optional(),
  ruleSet: z.enum(RULE_SET_IDS as [string, ...string[]], { error: `must be one of ${RULE_SET_IDS.join(", ")}` }).optional(),
});
