import { describe, expect, it } from "vitest";
import { formatDateRange, isIsoDay, parseClassDetails } from "~/lib/class-form";
import { formatDay, formatWhen, pickLocale } from "~/lib/when";

const form = (fields: Record<string, string>) => {
  const f = new FormData();
  for (const [k, v] of Object.entries(fields)) f.set(k, v);
  return f;
};

describe("class details form", () => {
  it("takes only real calendar days", () => {
    expect(isIsoDay("2027-03-01")).toBe(true);
    expect(isIsoDay("2028-02-29")).toBe(true); // leap year
    expect(isIsoDay("2027-02-29")).toBe(false);
    expect(isIsoDay("2027-02-30")).toBe(false);
    expect(isIsoDay("2027-13-01")).toBe(false);
    expect(isIsoDay("1 March 2027")).toBe(false);
    expect(isIsoDay("0001-01-01")).toBe(false);
  });

  it("trims, turns empty dates into null, and refuses an end before the start", () => {
    const ok = parseClassDetails(form({ name: "  Spring  ", startsOn: "2027-03-01", endsOn: "", venue: " Bay 2 " }));
    expect(ok).toEqual({ ok: true, value: { name: "Spring", startsOn: "2027-03-01", endsOn: null, venue: "Bay 2" } });
    const bad = parseClassDetails(form({ name: "", startsOn: "2027-03-05", endsOn: "2027-03-01", venue: "" }));
    expect(bad.ok).toBe(false);
    if (!bad.ok) {
      expect(Object.keys(bad.errors).sort()).toEqual(["endsOn", "name"]);
      expect(bad.values.startsOn).toBe("2027-03-05");
    }
    const feb30 = parseClassDetails(form({ name: "x", startsOn: "2027-02-30", endsOn: "", venue: "" }));
    expect(feb30.ok).toBe(false);
  });

  it("says the dates as people read them", () => {
    expect(formatDateRange("2027-03-01", "2027-03-05")).toBe("1 Mar 2027 – 5 Mar 2027");
    expect(formatDateRange("2027-03-01", null)).toBe("from 1 Mar 2027");
    expect(formatDateRange(null, null)).toBe("Dates not set");
  });

  it("writes every date in one style, from the reader's locale (Accept-Language), the same for days and moments", () => {
    expect(formatDateRange("2027-03-01", "2027-03-05", "en-US")).toBe("Mar 1, 2027 – Mar 5, 2027");
    expect(formatDay("2027-03-01", "de-DE")).toBe("01.03.2027");
    expect(formatWhen("2027-03-01T17:25:00Z", "en-GB")).toBe("1 Mar 2027, 17:25 UTC");
    expect(formatWhen("2027-03-01T17:25:00Z", "en-GB").startsWith(formatDay("2027-03-01", "en-GB"))).toBe(true);
    expect(pickLocale("de-DE,de;q=0.9,en;q=0.8")).toBe("de-DE");
    expect(pickLocale("xx-invalid-tag-!!, fr-FR")).toBe("fr-FR");
    expect(pickLocale(null)).toBe("en-GB");
    expect(pickLocale("*")).toBe("en-GB");
  });
});
