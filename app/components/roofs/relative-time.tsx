import { useEffect, useState } from "react";
import { formatDistanceToNow } from "date-fns";
import { useLocale } from "~/components/dates";
import { formatWhen } from "~/lib/when";

/**
 * "5 minutes ago", with the exact time as a tooltip. The server renders a UTC date so the first
 * client render matches it; the relative wording follows once the page is live.
 */
export function RelativeTime({ iso }: { iso: string }) {
  const locale = useLocale();
  const [live, setLive] = useState(false);
  const [, setTick] = useState(0);
  useEffect(() => {
    setLive(true);
    const t = setInterval(() => setTick((n) => n + 1), 60_000);
    return () => clearInterval(t);
  }, []);
  const date = new Date(iso);
  return (
    <time dateTime={iso} title={live ? formatWhen(date, locale) : undefined}>
      {live ? formatDistanceToNow(date, { addSuffix: true }) : formatWhen(date, locale)}
    </time>
  );
}
