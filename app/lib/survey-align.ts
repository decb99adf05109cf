import { z } from "zod";

/**
 * Placing a survey on the roof (docs/as-built.md, "Survey files"): either its x and y are
 * already the roof's plan coordinates, or two points of the survey, named by their labels, are
 * placed on the plan (e.g. two corners the user picks) and the whole survey is turned and moved
 * to match: a rigid motion (rotation and translation, no scaling), so a survey taken in its own
 * axes lands on the roof. Levels are kept as measured (the survey is on the design's datum).
 */

/** How far apart two reference points may be in the survey and on the plan (metres): a tape's error on site. */
export const REFERENCE_TOLERANCE = 0.05;

const coordinate = (what: string) =>
  z.coerce
    .number({ error: `${what} must be a number of metres.` })
    .refine(Number.isFinite, `${what} must be a number of metres.`)
    .refine((v) => Math.abs(v) <= 1e5, `${what} is too far away.`);

const label = (what: string) =>
  z
    .string({ error: `Name ${what} as it is labelled in the file.` })
    .trim()
    .min(1, `Name ${what} as it is labelled in the file.`)
    .max(60);

export const referenceSchema = z.union([
  z.object({ align: z.literal("roof").optional().default("roof") }).transform(() => ({ align: "roof" as const })),
  z.object({
    align: z.literal("points"),
    refA: label("the first reference point"),
    refAx: coordinate("The first reference point's x"),
    refAy: coordinate("The first reference point's y"),
    refB: label("the second reference point"),
    refBx: coordinate("The second reference point's x"),
    refBy: coordinate("The second reference point's y"),
  }),
]);

export type Reference = z.infer<typeof referenceSchema>;

type In = { at: [number, number]; level: number; label?: string };
type Out = { at: [number, number]; level: number; label?: string };

export type Aligned = { ok: true; points: Out[]; rotation: number } | { ok: false; field: string; message: string };

/** The survey in the roof's plan coordinates. */
export function alignSurvey(points: In[], ref: Reference): Aligned {
  const copy = (p: In, at: [number, number]): Out => ({ at, level: p.level, ...(p.label ? { label: p.label } : {}) });
  if (ref.align === "roof") return { ok: true, points: points.map((p) => copy(p, [p.at[0], p.at[1]])), rotation: 0 };
  const a = points.find((p) => p.label === ref.refA);
  const b = points.find((p) => p.label === ref.refB);
  if (!a) return { ok: false, field: "refA", message: `No point labelled "${ref.refA}" in the file.` };
  if (!b) return { ok: false, field: "refB", message: `No point labelled "${ref.refB}" in the file.` };
  const sx = b.at[0] - a.at[0],
    sy = b.at[1] - a.at[1];
  const px = ref.refBx - ref.refAx,
    py = ref.refBy - ref.refAy;
  const ls = Math.hypot(sx, sy),
    lp = Math.hypot(px, py);
  if (ls < 0.5 || lp < 0.5)
    return { ok: false, field: "refB", message: "The two reference points must be at least 0.5 m apart." };
  if (Math.abs(ls - lp) > REFERENCE_TOLERANCE)
    return {
      ok: false,
      field: "refB",
      message: `The reference points are ${ls.toFixed(3)} m apart in the survey but ${lp.toFixed(3)} m apart on the plan: check which points were picked.`,
    };
  const turn = Math.atan2(py, px) - Math.atan2(sy, sx);
  const c = Math.cos(turn),
    s = Math.sin(turn);
  const place = (p: In): [number, number] => {
    const dx = p.at[0] - a.at[0],
      dy = p.at[1] - a.at[1];
    return [ref.refAx + c * dx - s * dy, ref.refAy + s * dx + c * dy];
  };
  return { ok: true, points: points.map((p) => copy(p, place(p))), rotation: turn };
}
