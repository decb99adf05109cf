import { z } from "zod";
import { AS_BUILT_LIMITS } from "~/engine";

const metres = (what: string) =>
  z
    .number({ error: `must be a finite number (${what})` })
    .gte(-1e7)
    .lte(1e7);

/** The request body besides the spec (docs/as-built.md); the spec is checked by the engine's parseSpec. */
export const asBuiltBodySchema = z.object({
  spec: z.unknown(),
  points: z
    .array(
      z.object({
        at: z.tuple([metres("metres"), metres("metres")], { error: "must be a point [x, y] in metres" }),
        level: metres("metres"),
        label: z.string().max(60).optional(),
      }),
      { error: "must be a list of { at: [x, y], level } points" },
    )
    .min(1, "needs at least one measured point")
    .max(AS_BUILT_LIMITS.maxPoints, `allows at most ${AS_BUILT_LIMITS.maxPoints} points`),
  tolerance: z
    .object({
      deviation: z.number().gt(0).lte(1, "must be at most 1 m").optional(),
      minFall: z.number().gte(1, "is a ratio N of 1:N, at least 1").lte(10_000).optional(),
      pondDepth: z.number().gte(0).lte(1, "must be at most 1 m").optional(),
    })
    .optional(),
});

/** The answer's top-level keys (docs/as-built.md); the parts inside may gain fields. */
export const asBuiltAnswerSchema = z.looseObject({
  deviations: z.array(
    z.looseObject({ at: z.array(z.number()), design: z.number(), measured: z.number(), delta: z.number() }),
  ),
  surface: z.looseObject({
    fallMap: z.unknown(),
    catchments: z.unknown(),
    ponds: z.array(z.looseObject({ at: z.array(z.number()), area: z.number(), depth: z.number(), volume: z.number() })),
  }),
  verdict: z.looseObject({
    passed: z.boolean(),
    failures: z.array(z.looseObject({ code: z.string(), message: z.string() })),
  }),
  fixes: z.array(z.looseObject({ joist: z.unknown(), end: z.unknown(), change: z.number() })),
});
