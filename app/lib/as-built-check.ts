import { z } from "zod";
import type { AsBuiltResult, Deviation } from "~/engine";

/**
 * A saved as-built check's form (docs/as-built.md, "Saved checks"): who measured, who checked,
 * the day, the tolerances. Shared by the server (validation) and the phone form (its own field
 * errors); levels come as `level:<label>` fields in millimetres or a measured schedule CSV.
 */
export const CHECK_NAME_MAX = 120;

const name = (who: string) =>
  z
    .string({ error: `Say who ${who}.` })
    .trim()
    .min(1, `Say who ${who}.`)
    .max(CHECK_NAME_MAX, `At most ${CHECK_NAME_MAX} characters.`);

const mm = (what: string, min: number, max: number) =>
  z.coerce
    .number({ error: `${what} must be a number of millimetres.` })
    .min(min, `${what} must be at least ${min} mm.`)
    .max(max, `${what} must be at most ${max} mm.`);

export const checkMetaSchema = z.object({
  measuredBy: name("measured the levels"),
  checkedBy: name("checked them"),
  measuredOn: z
    .string({ error: "Give the day the levels were taken." })
    .regex(/^\d{4}-\d{2}-\d{2}$/, "Give the day as YYYY-MM-DD.")
    .refine((d) => {
      const t = Date.parse(`${d}T00:00:00Z`);
      return Number.isFinite(t) && new Date(t).toISOString().slice(0, 10) === d;
    }, "That day does not exist.")
    .refine((d) => d >= "2000-01-01" && Date.parse(`${d}T00:00:00Z`) <= Date.now() + 36 * 3600_000, {
      message: "The day must be between 2000 and today.",
    }),
  deviationMm: mm("The deviation tolerance", 1, 100).default(10),
  pondDepthMm: mm("The pond depth tolerance", 0, 100).default(5),
});

export type CheckMeta = z.infer<typeof checkMetaSchema>;

/** The worst deviation of a check (largest |delta|), or null without points. */
export function worstDeviation(r: Pick<AsBuiltResult, "deviations">): Deviation | null {
  let worst: Deviation | null = null;
  for (const d of r.deviations) if (!worst || Math.abs(d.delta) > Math.abs(worst.delta)) worst = d;
  return worst;
}

/** The verdict as one line, the same on the page, in the list and in the PDF. */
export function verdictLine(r: Pick<AsBuiltResult, "verdict">): string {
  const n = r.verdict.failures.length;
  return r.verdict.passed ? "Verdict: PASS" : `Verdict: FAIL (${n} ${n === 1 ? "problem" : "problems"})`;
}

/** The worst deviation as one line, the same on the page and in the PDF. */
export function worstLine(r: Pick<AsBuiltResult, "deviations">): string {
  const w = worstDeviation(r);
  if (!w) return "Worst deviation: none measured";
  const mmv = Math.round(w.delta * 1000);
  return `Worst deviation: ${mmv > 0 ? "+" : mmv < 0 ? "-" : "±"}${Math.abs(mmv)} mm at ${w.label ?? `(${w.at[0].toFixed(2)}, ${w.at[1].toFixed(2)})`}`;
}

/**
 * A fix as a builder reads it: "Pack up J4 start by 15 mm". The joist end's name is the measured
 * point's label at that end when it has one (as the measured schedule names it).
 */
export function fixLine(
  f: { joist: number; span: number; end: "start" | "end"; at: [number, number]; change: number },
  deviations: Pick<Deviation, "at" | "label">[],
): string {
  const named = deviations.find(
    (d) => d.label && /^J\d/.test(d.label) && Math.hypot(d.at[0] - f.at[0], d.at[1] - f.at[1]) < 1e-3,
  );
  const label = named?.label ?? `joist ${f.joist + 1}${f.span > 0 ? ` span ${f.span + 1}` : ""} ${f.end}`;
  const v = Math.round(Math.abs(f.change) * 1000);
  return `${f.change >= 0 ? "Pack up" : "Plane down"} ${label} by ${v} mm`;
}
