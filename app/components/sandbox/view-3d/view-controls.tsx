import { RotateCcw } from "lucide-react";
import { sectionJoistIndex } from "./section-joist";
import { useSandbox, useSandboxStore, type CameraPreset } from "../state/store";

const PRESETS: { id: CameraPreset; label: string }[] = [
  { id: "orbit", label: "Orbit" },
  { id: "plan", label: "Plan" },
  { id: "section", label: "Section" },
];

/** What the 3D view shows and from where. */
export function ViewControls({ onReset }: { onReset: () => void }) {
  const store = useSandboxStore();
  const view = useSandbox((s) => s.view);
  const joistCount = useSandbox((s) => s.analysis?.shaped.joists.length ?? 0);
  const joist =
    useSandbox((s) => (s.analysis ? sectionJoistIndex(s.analysis.shaped.joists, s.view.sectionJoist) : 0)) + 1;
  const set = store.getState().setView;
  const sideBySide = view.mode === "side-by-side";
  return (
    <div className="flex flex-wrap items-center gap-x-4 gap-y-2 text-sm" data-testid="view-controls">
      <fieldset className="flex items-center gap-1">
        <legend className="sr-only">Camera</legend>
        {PRESETS.map((p) => {
          const disabled = sideBySide && p.id === "section";
          return (
            <label
              key={p.id}
              className={`touch-target inline-flex cursor-pointer items-center rounded border px-2 py-0.5 ${view.camera === p.id ? "border-ink bg-ink text-sheet" : "border-rule bg-sheet"} ${disabled ? "opacity-40" : ""} has-[:focus-visible]:outline-2 has-[:focus-visible]:outline-accent`}
            >
              <input
                type="radio"
                name="camera"
                className="sr-only"
                value={p.id}
                checked={view.camera === p.id}
                disabled={disabled}
                onChange={() => set({ camera: p.id })}
              />
              {p.label}
            </label>
          );
        })}
        <button
          type="button"
          className="touch-target ml-1 inline-flex items-center rounded p-1 hover:bg-paper-deep"
          onClick={onReset}
          aria-label="Put the camera back"
          title="Put the camera back"
        >
          <RotateCcw size={15} aria-hidden="true" />
        </button>
      </fieldset>
      {view.camera === "section" && !sideBySide && joistCount > 0 && (
        <label className="flex items-center gap-2">
          <span>Joist</span>
          <input
            type="range"
            min={1}
            max={joistCount}
            value={joist}
            onChange={(e) => set({ sectionJoist: Number(e.target.value) - 1 })}
            aria-valuetext={`joist ${joist} of ${joistCount}`}
            data-testid="section-joist"
          />
          <span className="w-14 tabular-nums">
            {joist} / {joistCount}
          </span>
        </label>
      )}
      <label className="flex items-center gap-2">
        <span>Vertical ×</span>
        <input
          type="range"
          min={1}
          max={40}
          step={1}
          value={view.exaggeration}
          onChange={(e) => set({ exaggeration: Number(e.target.value) })}
          aria-label="Vertical exaggeration"
          data-testid="exaggeration"
        />
        <span className="w-6 tabular-nums">{view.exaggeration}</span>
      </label>
      <label className="flex items-center gap-1.5">
        <input type="checkbox" checked={view.showJoists} onChange={(e) => set({ showJoists: e.target.checked })} />{" "}
        Joists
      </label>
      <label className="flex items-center gap-1.5">
        <input type="checkbox" checked={view.showWater} onChange={(e) => set({ showWater: e.target.checked })} /> Water
        paths
      </label>
      <span className="flex items-center gap-1.5">
        <label className="flex items-center gap-1.5">
          <input
            type="checkbox"
            checked={view.showContours}
            onChange={(e) => set({ showContours: e.target.checked })}
          />{" "}
          Contours every
        </label>
        <select
          className="field w-auto px-1 py-0.5"
          aria-label="Contour interval"
          value={view.contourInterval}
          onChange={(e) => set({ contourInterval: Number(e.target.value), showContours: true })}
        >
          {[0.005, 0.01, 0.02, 0.025, 0.05, 0.1].map((v) => (
            <option key={v} value={v}>
              {Math.round(v * 1000)} mm
            </option>
          ))}
        </select>
      </span>
    </div>
  );
}
