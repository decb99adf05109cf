/**
 * Due dates for a class that follows a course (docs/product.md capability 10): the course's
 * lessons, in order, spread evenly over the class's days. Lesson i of n (1-based) is due
 * round(i × span / n) days after the first day, where span is the number of days from the
 * first day to the last, so the last lesson is due on the last day and the gaps differ by at
 * most one day. A one-day class has every lesson due that day. Without both dates there is
 * nothing to spread over: a class with only an end date has every lesson due on it, and a class
 * with no end date gets no due dates.
 */
import { isIsoDay } from "~/lib/class-form";

const DAY_MS = 86_400_000;

const toDays = (iso: string) => Date.parse(`${iso}T00:00:00Z`) / DAY_MS;
const fromDays = (days: number) => new Date(days * DAY_MS).toISOString().slice(0, 10);

export function spreadDueDates(startsOn: string | null, endsOn: string | null, count: number): (string | null)[] {
  const n = Math.max(0, Math.floor(count));
  const end = endsOn && isIsoDay(endsOn) ? toDays(endsOn) : null;
  if (end === null) return Array.from({ length: n }, () => null);
  const start = startsOn && isIsoDay(startsOn) ? Math.min(toDays(startsOn), end) : end;
  const span = end - start;
  return Array.from({ length: n }, (_, i) => fromDays(start + Math.round(((i + 1) * span) / n)));
}
