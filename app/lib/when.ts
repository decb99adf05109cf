/** The locale when the browser names none (or none Intl knows). */
export const DEFAULT_LOCALE = "en-GB";

/** The first language of an Accept-Language header that Intl can format dates in. */
export function pickLocale(acceptLanguage: string | null | undefined): string {
  for (const part of (acceptLanguage ?? "").split(",")) {
    const tag = part.split(";")[0].trim();
    if (!tag || tag === "*" || tag.length > 35) continue;
    try {
      const [supported] = Intl.DateTimeFormat.supportedLocalesOf([tag]);
      if (supported) return supported;
    } catch {
      // A malformed tag: try the next.
    }
  }
  return DEFAULT_LOCALE;
}

const formats = new Map<string, { when: Intl.DateTimeFormat; day: Intl.DateTimeFormat }>();
function formatsFor(locale: string) {
  let f = formats.get(locale);
  if (!f) {
    // One style everywhere: the locale's medium date ("1 Mar 2027", "Mar 1, 2027", "01.03.2027"),
    // with the time after it for moments. UTC, so server and browser render the same text.
    f = {
      when: new Intl.DateTimeFormat(locale, { timeZone: "UTC", dateStyle: "medium", timeStyle: "short" }),
      day: new Intl.DateTimeFormat(locale, { timeZone: "UTC", dateStyle: "medium" }),
    };
    if (formats.size > 50) formats.clear();
    formats.set(locale, f);
  }
  return f;
}

const toDate = (iso: string | Date) => (typeof iso === "string" ? new Date(iso) : iso);

/** A moment, the same on server and browser: "1 Dec 2026, 17:25 UTC" (en-GB). */
export function formatWhen(iso: string | Date | null | undefined, locale: string = DEFAULT_LOCALE): string {
  if (!iso) return "—";
  const d = toDate(iso);
  return Number.isNaN(d.getTime()) ? "—" : `${formatsFor(locale).when.format(d)} UTC`;
}

/** A day (a due date, a class's first day): "1 Mar 2027" (en-GB), "Mar 1, 2027" (en-US). */
export function formatDay(iso: string | Date | null | undefined, locale: string = DEFAULT_LOCALE): string {
  if (!iso) return "";
  const d = typeof iso === "string" ? new Date(`${iso.slice(0, 10)}T00:00:00Z`) : iso;
  return Number.isNaN(d.getTime()) ? "" : formatsFor(locale).day.format(d);
}

export function formatDateRange(from: string | null, to: string | null, locale: string = DEFAULT_LOCALE): string {
  if (from && to)
    return from === to ? formatDay(from, locale) : `${formatDay(from, locale)} – ${formatDay(to, locale)}`;
  if (from) return `from ${formatDay(from, locale)}`;
  if (to) return `until ${formatDay(to, locale)}`;
  return "";
}

/** "Firefox on Linux" from a User-Agent header, or "Unknown device". */
export function describeDevice(userAgent: string | null | undefined): string {
  const ua = userAgent ?? "";
  const browser = /Edg\//.test(ua)
    ? "Edge"
    : /Firefox\//.test(ua)
      ? "Firefox"
      : /Chrom(e|ium)\//.test(ua)
        ? "Chrome"
        : /Safari\//.test(ua)
          ? "Safari"
          : null;
  const os = /Android/.test(ua)
    ? "Android"
    : /iPhone|iPad/.test(ua)
      ? "iOS"
      : /Windows/.test(ua)
        ? "Windows"
        : /Mac OS X/.test(ua)
          ? "macOS"
          : /Linux/.test(ua)
            ? "Linux"
            : null;
  if (browser && os) return `${browser} on ${os}`;
  return browser ?? os ?? (ua ? ua.slice(0, 40) : "Unknown device");
}
