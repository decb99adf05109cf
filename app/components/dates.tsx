import { useRouteLoaderData } from "react-router";
import { DEFAULT_LOCALE, formatDateRange, formatDay, formatWhen } from "~/lib/when";

/** The reader's locale, from their browser's Accept-Language (read once by the root loader). */
export function useLocale(): string {
  const root = useRouteLoaderData("root") as { locale?: string } | undefined;
  return root?.locale ?? DEFAULT_LOCALE;
}

/** A moment in the one date style of the app: the reader's locale, medium date and time, UTC. */
export function When({ iso }: { iso: string | Date | null | undefined }) {
  const locale = useLocale();
  if (!iso) return <>—</>;
  return <time dateTime={typeof iso === "string" ? iso : iso.toISOString()}>{formatWhen(iso, locale)}</time>;
}

/** A day (due date, class dates) in the same style, without the time. */
export function Day({ iso }: { iso: string | null | undefined }) {
  const locale = useLocale();
  if (!iso) return null;
  return <time dateTime={iso.slice(0, 10)}>{formatDay(iso, locale)}</time>;
}

export function DateRange({
  from,
  to,
  empty = "Dates not set",
}: {
  from: string | null;
  to: string | null;
  empty?: string;
}) {
  const locale = useLocale();
  return <>{formatDateRange(from, to, locale) || empty}</>;
}
