import type { LiveFeed, LivePhaseView } from "~/components/classes/use-live-feed";

const CONNECTION: Record<Exclude<LiveFeed["status"], "connected">, string> = {
  connecting: "Connecting…",
  reconnecting: "Reconnecting…",
};

/** The follower's session in words: waiting, live, paused or ended (and the connection when it is not up). */
export const PHASE_LABELS: Record<LivePhaseView, string> = {
  idle: "Waiting · not started yet",
  live: "Live · connected",
  paused: "Paused by the trainer",
  ended: "Ended · the trainer stopped presenting",
};

export type FollowerState = "waiting" | "live" | "paused" | "ended" | "connecting" | "reconnecting";

export function followerState(status: LiveFeed["status"], phase: LivePhaseView): FollowerState {
  // An ended session stays ended whatever the connection does.
  if (phase === "ended") return "ended";
  if (status !== "connected") return status;
  return phase === "idle" ? "waiting" : phase;
}

/** The follower's state, in words and a shape (a filled dot when live, a ring otherwise). */
export function LiveStatus({
  status,
  phase = "live",
  large = false,
}: {
  status: LiveFeed["status"];
  phase?: LivePhaseView;
  large?: boolean;
}) {
  const state = followerState(status, phase);
  const live = state === "live";
  const text = state === "connecting" || state === "reconnecting" ? CONNECTION[state] : PHASE_LABELS[phase];
  const tone = live
    ? "border-ok text-ok"
    : state === "ended"
      ? "border-ink-soft text-ink-soft"
      : "border-warn text-warn";
  return (
    <span
      role="status"
      aria-live="polite"
      data-status={status}
      data-state={state}
      className={`inline-flex items-center gap-2 rounded-full border-2 px-3 py-1 font-medium ${large ? "text-lg" : "text-sm"} ${tone}`}
    >
      <span
        aria-hidden="true"
        className={`inline-block h-2.5 w-2.5 rounded-full border-2 ${live ? "border-ok bg-ok" : state === "ended" ? "border-ink-soft" : "animate-pulse border-warn"}`}
      />
      {text}
    </span>
  );
}
