import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { spreadDueDates } from "~/lib/courses/due-dates";
import { moveItem } from "~/lib/courses/course-form";

// docs/product.md capability 10: a class that follows a course gets the course's lessons with due
// dates spread evenly over its days, the last lesson due on the last day.
describe("spreadDueDates", () => {
  it("a class without dates gets no due dates, one per lesson", () => {
    expect(spreadDueDates(null, null, 3)).toEqual([null, null, null]);
  });

  it("a class with a start but no end gets no due dates", () => {
    expect(spreadDueDates("2027-03-01", null, 2)).toEqual([null, null]);
  });

  it("a class with only an end date has every lesson due on it", () => {
    expect(spreadDueDates(null, "2027-03-05", 2)).toEqual(["2027-03-05", "2027-03-05"]);
  });

  it("a one-day class has every lesson due that day", () => {
    expect(spreadDueDates("2027-03-01", "2027-03-01", 4)).toEqual([
      "2027-03-01",
      "2027-03-01",
      "2027-03-01",
      "2027-03-01",
    ]);
  });

  it("spreads evenly: 4 lessons over 1-9 March (8 days) fall every 2 days, the last on the last day", () => {
    expect(spreadDueDates("2027-03-01", "2027-03-09", 4)).toEqual([
      "2027-03-03",
      "2027-03-05",
      "2027-03-07",
      "2027-03-09",
    ]);
  });

  it("a single lesson is due on the last day", () => {
    expect(spreadDueDates("2027-03-01", "2027-03-20", 1)).toEqual(["2027-03-20"]);
  });

  it("crosses a month end and a leap day", () => {
    // 2028 is a leap year: 28 Feb + 2 days = 1 March.
    expect(spreadDueDates("2028-02-27", "2028-03-02", 2)).toEqual(["2028-02-29", "2028-03-02"]);
  });

  it("no lessons give no dates", () => {
    expect(spreadDueDates("2027-03-01", "2027-03-09", 0)).toEqual([]);
  });

  it("any class: dates in order, inside the class's days, the last on the end day, gaps differing by at most one day", () => {
    const day = (n: number) => new Date(Date.UTC(2027, 0, 1) + n * 86_400_000).toISOString().slice(0, 10);
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 400 }),
        fc.integer({ min: 0, max: 120 }),
        fc.integer({ min: 1, max: 30 }),
        (s, len, n) => {
          const start = day(s);
          const end = day(s + len);
          const due = spreadDueDates(start, end, n) as string[];
          expect(due).toHaveLength(n);
          expect(due.at(-1)).toBe(end);
          const ms = due.map((d) => Date.parse(d) / 86_400_000);
          const gaps = ms.map((m, i) => m - (i ? ms[i - 1] : Date.parse(start) / 86_400_000));
          for (const g of gaps) expect(g).toBeGreaterThanOrEqual(0);
          expect(Math.max(...gaps) - Math.min(...gaps)).toBeLessThanOrEqual(1);
          expect(due[0] >= start).toBe(true);
        },
      ),
    );
  });
});

describe("moveItem (the course page's up and down buttons)", () => {
  it("moves up and down by one place", () => {
    expect(moveItem(["a", "b", "c"], 1, -1)).toEqual(["b", "a", "c"]);
    expect(moveItem(["a", "b", "c"], 1, 1)).toEqual(["a", "c", "b"]);
  });
  it("leaves the order as it was at either end", () => {
    expect(moveItem(["a", "b"], 0, -1)).toEqual(["a", "b"]);
    expect(moveItem(["a", "b"], 1, 1)).toEqual(["a", "b"]);
  });
});
