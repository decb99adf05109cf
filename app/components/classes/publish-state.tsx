import type { PublishStatus } from "~/components/classes/use-live-publisher";

/** The presenter's line: is what I show on screen what the class sees? */
export function PublishState({ status, onDark = false }: { status: PublishStatus; onDark?: boolean }) {
  const text =
    status.state === "error"
      ? `Not sent: ${status.message ?? "try again"}`
      : status.state === "sending"
        ? "Sending to the class…"
        : status.seq !== null
          ? `Live · the class sees this (update ${status.seq})`
          : "Live · waiting for your first change";
  return (
    <span
      role="status"
      aria-live="polite"
      data-state={status.state}
      className={`ml-auto font-medium ${
        status.state === "error" ? (onDark ? "text-accent-wash" : "text-bad") : onDark ? "text-sheet" : "text-ok"
      }`}
    >
      <span aria-hidden="true">{status.state === "error" ? "⚠ " : "● "}</span>
      {text}
    </span>
  );
}
