import { useState } from "react";
import { Hand, RotateCcw } from "lucide-react";
import { LiveRoof } from "~/components/classes/live-roof";

type Sent =
  { state: "idle" } | { state: "sending" } | { state: "sent"; at: Date } | { state: "error"; message: string };

/**
 * A trainee's own copy of the presented roof, to change and hand up to the trainer (who may put
 * it on the shared screen). Hands go up only while the trainer presents.
 */
export function HandUpPanel({
  classId,
  spec,
  onSpecChange,
  onRestart,
  open,
}: {
  classId: string;
  /** The trainee's roof, kept by the page so it survives switching back to the trainer's screen. */
  spec: unknown;
  onSpecChange: (spec: unknown) => void;
  /** Start again from the roof on the trainer's screen. */
  onRestart: () => void;
  open: boolean;
}) {
  const [start] = useState(spec);
  const [title, setTitle] = useState("");
  const [sent, setSent] = useState<Sent>({ state: "idle" });

  const handUp = async () => {
    setSent({ state: "sending" });
    try {
      const res = await fetch(`/classes/${classId}/hand-ups`, {
        method: "POST",
        headers: { "Content-Type": "application/json", Accept: "application/json" },
        body: JSON.stringify({ spec, title }),
      });
      const json = (await res.json().catch(() => null)) as { error?: { message?: string } } | null;
      if (res.ok) setSent({ state: "sent", at: new Date() });
      else setSent({ state: "error", message: json?.error?.message ?? `The server answered ${res.status}.` });
    } catch {
      setSent({ state: "error", message: "No connection to the server. Try again." });
    }
  };

  return (
    <section aria-labelledby="my-roof-title" className="grid gap-3" data-testid="hand-up-panel">
      <div className="card grid gap-2">
        <h2 id="my-roof-title" className="text-xl font-bold">
          My roof
        </h2>
        <p className="text-sm text-ink-soft">
          Your own copy of the roof on the trainer’s screen. Change it, then hand it up: the trainer sees it with the
          class’s other roofs and may show it to everyone.
        </p>
        <div className="flex flex-wrap items-end gap-3">
          <label className="grid gap-1 text-sm">
            <span className="font-medium">A note for the trainer (optional)</span>
            <input
              className="rounded border border-ink bg-sheet px-2 py-1.5"
              name="title"
              maxLength={120}
              value={title}
              onChange={(e) => setTitle(e.target.value)}
            />
          </label>
          <button
            type="button"
            className="btn-primary"
            onClick={() => void handUp()}
            disabled={!open || sent.state === "sending"}
          >
            <Hand aria-hidden="true" className="h-4 w-4" /> {sent.state === "sent" ? "Hand up again" : "Hand up"}
          </button>
          <button type="button" className="btn" onClick={onRestart}>
            <RotateCcw aria-hidden="true" className="h-4 w-4" /> Start again from the trainer’s roof
          </button>
          <span role="status" aria-live="polite" className="text-sm font-medium" data-state={sent.state}>
            {!open
              ? "Hands go up while the trainer presents."
              : sent.state === "sending"
                ? "Sending…"
                : sent.state === "sent"
                  ? `Your hand is up (sent ${sent.at.toLocaleTimeString([], { hour: "2-digit", minute: "2-digit" })}).`
                  : sent.state === "error"
                    ? `Not sent: ${sent.message}`
                    : ""}
          </span>
        </div>
      </div>
      <LiveRoof spec={start} onSpecChange={onSpecChange} />
    </section>
  );
}
