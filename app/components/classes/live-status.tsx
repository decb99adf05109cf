import type { LiveFeed } from "~/components/classes/use-live-feed";

const LABELS: Record<LiveFeed["status"], string> = {
  connecting: "Connecting…",
  connected: "Live · connected",
  reconnecting: "Reconnecting…",
};

/** The follower's connection, in words and a shape (a filled dot when live, a ring otherwise). */
export function LiveStatus({ status, large = false }: { status: LiveFeed["status"]; large?: boolean }) {
  const live = status === "connected";
  return (
    <span
      role="status"
      aria-live="polite"
      data-status={status}
      className={`inline-flex items-center gap-2 rounded-full border-2 px-3 py-1 font-medium ${large ? "text-lg" : "text-sm"} ${live ? "border-ok text-ok" : "border-warn text-warn"}`}
    >
      <span
        aria-hidden="true"
        className={`inline-block h-2.5 w-2.5 rounded-full border-2 ${live ? "border-ok bg-ok" : "animate-pulse border-warn"}`}
      />
      {LABELS[status]}
    </span>
  );
}
