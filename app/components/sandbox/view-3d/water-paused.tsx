import { WATER_IDLE_MS } from "./cpu-drawing";

/**
 * Says why the water stopped: this computer draws the 3D view without a graphics card, so the
 * animation rests after a while without input (use-animation-allowed.ts) and any input restarts it.
 */
export function WaterPaused({ className = "" }: { className?: string }) {
  return (
    <p
      role="status"
      data-testid="water-paused"
      className={`z-30 rounded bg-paper/95 px-2 py-1 text-xs text-ink-soft shadow-sm ${className}`}
    >
      Water paused after {WATER_IDLE_MS / 1000} s idle, to spare this computer (3D drawn without a graphics card).
      Touch, move the pointer or press a key to restart it.
    </p>
  );
}
