import { Html } from "@react-three/drei";
import type { SceneFrame } from "./scene-frame";

export interface LevelLabel {
  at: [number, number];
  level: number;
  kind: "corner" | "outlet" | "joist" | "note";
  name: string;
  /** Shown instead of the level in mm (notes). */
  text?: string;
}

/** Levels in millimetres at corners and outlets, as HTML labels (no font files fetched). */
export function LevelLabels({
  labels,
  frame,
  exaggeration,
}: {
  labels: LevelLabel[];
  frame: SceneFrame;
  exaggeration: number;
}) {
  return (
    <group name="labels">
      {labels.map((l, i) => (
        <Html
          key={i}
          position={[l.at[0] - frame.cx, l.level * exaggeration + frame.radius * 0.03, -(l.at[1] - frame.cy)]}
          center
          zIndexRange={[20, 0]}
          style={{ pointerEvents: "none" }}
        >
          <span
            className={`whitespace-nowrap rounded-sm border px-1 text-[11px] leading-4 tabular-nums shadow-sm ${
              l.kind === "outlet"
                ? "border-accent-deep bg-accent text-sheet"
                : l.kind === "joist" || l.kind === "note"
                  ? "border-ink bg-ink text-sheet"
                  : "border-ink/40 bg-sheet/90 text-ink"
            }`}
            title={l.name}
          >
            {l.text ?? Math.round(l.level * 1000)}
          </span>
        </Html>
      ))}
    </group>
  );
}
