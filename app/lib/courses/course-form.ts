/** The course form's fields (name, description), read and checked for the action and the page. */
import { z } from "zod";

const CourseDetails = z.object({
  name: z.string().trim().min(1, "Give the course a name.").max(120, "Keep the name under 120 characters."),
  description: z.string().trim().max(2000, "Keep the description under 2,000 characters."),
});

export type CourseField = "name" | "description";
export type CourseValues = Record<CourseField, string>;

export function parseCourseDetails(
  form: FormData,
):
  | { ok: true; value: { name: string; description: string } }
  | { ok: false; errors: Partial<Record<CourseField, string>>; values: CourseValues } {
  const values: CourseValues = {
    name: String(form.get("name") ?? ""),
    description: String(form.get("description") ?? ""),
  };
  const parsed = CourseDetails.safeParse(values);
  if (parsed.success) return { ok: true, value: parsed.data };
  const errors: Partial<Record<CourseField, string>> = {};
  for (const issue of parsed.error.issues) errors[issue.path[0] as CourseField] ??= issue.message;
  return { ok: false, errors, values };
}

/** Moves the item at `index` one place up (-1) or down (+1); out of range leaves the order as it was. */
export function moveItem<T>(items: readonly T[], index: number, by: -1 | 1): T[] {
  const out = [...items];
  const to = index + by;
  if (index < 0 || index >= out.length || to < 0 || to >= out.length) return out;
  [out[index], out[to]] = [out[to], out[index]];
  return out;
}
