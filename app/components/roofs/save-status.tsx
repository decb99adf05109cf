import { AlertTriangle, Check, CloudOff, Loader2 } from "lucide-react";
import type { RoofSnapshot, SaveState } from "./use-autosave";

/** "Saved · v7", "Saving…", "Offline, will retry": one live region the screen reader hears. */
export function SaveStatus({ state }: { state: SaveState }) {
  const { icon, text, tone } = describe(state);
  return (
    <p
      role="status"
      aria-live="polite"
      data-testid="save-status"
      className={`flex items-center gap-1.5 rounded border px-2 py-1 text-sm ${tone}`}
    >
      {icon}
      {text}
    </p>
  );
}

function describe(state: SaveState) {
  const ok = "border-ok/40 text-ok bg-sheet";
  const soft = "border-rule text-ink-soft bg-sheet";
  const bad = "border-bad/40 text-bad bg-sheet";
  switch (state.kind) {
    case "saved":
      return { icon: <Check aria-hidden="true" className="h-4 w-4" />, text: `Saved · v${state.version}`, tone: ok };
    case "pending":
      return { icon: <Loader2 aria-hidden="true" className="h-4 w-4" />, text: "Unsaved changes…", tone: soft };
    case "saving":
      return { icon: <Loader2 aria-hidden="true" className="h-4 w-4 animate-spin" />, text: "Saving…", tone: soft };
    case "offline":
      return {
        icon: <CloudOff aria-hidden="true" className="h-4 w-4" />,
        text: "Offline, will retry",
        tone: "border-warn/40 text-warn bg-sheet",
      };
    case "invalid":
      return {
        icon: <AlertTriangle aria-hidden="true" className="h-4 w-4" />,
        text: `Not saved: ${state.message}`,
        tone: bad,
      };
    case "conflict":
      return {
        icon: <AlertTriangle aria-hidden="true" className="h-4 w-4" />,
        text: "Not saved: changed elsewhere",
        tone: bad,
      };
    case "error":
      return {
        icon: <AlertTriangle aria-hidden="true" className="h-4 w-4" />,
        text: `Not saved: ${state.message}`,
        tone: bad,
      };
  }
}

/** Shown when a save lost the race: both versions are kept until the user picks. */
export function ConflictBanner({
  current,
  onReload,
  onKeepMine,
  error,
}: {
  current: RoofSnapshot;
  onReload: () => void;
  onKeepMine: () => void;
  error: string | null;
}) {
  return (
    <div role="alert" className="rounded border-2 border-bad bg-sheet px-4 py-3" data-testid="conflict-banner">
      <p className="font-bold">
        This roof was saved somewhere else while you were editing (now version {current.version}).
      </p>
      <p className="mt-1 text-sm">
        Your changes here are not saved yet and nothing has been lost. Choose what to keep:
      </p>
      <div className="mt-3 flex flex-wrap gap-2">
        <button type="button" className="btn" onClick={onReload}>
          Reload theirs (drop my changes)
        </button>
        <button type="button" className="btn-primary" onClick={onKeepMine}>
          Keep mine as a copy
        </button>
      </div>
      {error ? <p className="field-error">{error}</p> : null}
    </div>
  );
}
