import { formatDateRange as formatDateRangeIn, formatDay as formatDayIn } from "./when";
import { z } from "zod";

/** A real calendar day written yyyy-mm-dd (JavaScript alone would take 2027-02-30 as 2 March). */
export function isIsoDay(v: string): boolean {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(v);
  if (!m) return false;
  const [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
  const t = new Date(Date.UTC(y, mo - 1, d));
  return y >= 1900 && y <= 9999 && t.getUTCFullYear() === y && t.getUTCMonth() === mo - 1 && t.getUTCDate() === d;
}

const isoDate = z
  .string()
  .trim()
  .refine((v) => v === "" || isIsoDay(v), "Use a date like 2027-03-01.")
  .transform((v) => (v === "" ? null : v));

const ClassDetails = z
  .object({
    name: z.string().trim().min(1, "Give the class a name.").max(120, "Keep the name under 120 characters."),
    startsOn: isoDate,
    endsOn: isoDate,
    venue: z.string().trim().max(200, "Keep the venue under 200 characters."),
  })
  .refine((c) => !c.startsOn || !c.endsOn || c.endsOn >= c.startsOn, {
    path: ["endsOn"],
    message: "The class cannot end before it starts.",
  });

export type ClassDetailsField = "name" | "startsOn" | "endsOn" | "venue";
export type ClassDetailsValues = Record<ClassDetailsField, string>;

/** Name, dates and venue from a form; on failure the field errors and what was typed. */
export function parseClassDetails(form: FormData) {
  const values: ClassDetailsValues = {
    name: String(form.get("name") ?? ""),
    startsOn: String(form.get("startsOn") ?? ""),
    endsOn: String(form.get("endsOn") ?? ""),
    venue: String(form.get("venue") ?? ""),
  };
  const parsed = ClassDetails.safeParse(values);
  if (parsed.success) return { ok: true as const, value: parsed.data };
  const errors: Partial<Record<ClassDetailsField, string>> = {};
  for (const issue of parsed.error.issues) errors[issue.path[0] as ClassDetailsField] ??= issue.message;
  return { ok: false as const, errors, values };
}

/** Due dates and the like for people, in the one date style of the app (app/lib/when.ts). */
export function formatDay(iso: string | null | undefined, locale?: string): string {
  return formatDayIn(iso, locale);
}

export function formatDateRange(from: string | null, to: string | null, locale?: string): string {
  return formatDateRangeIn(from, to, locale) || "Dates not set";
}
