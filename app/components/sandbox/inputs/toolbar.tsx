import { Columns3, FileText, Redo2, Square, Undo2 } from "lucide-react";
import { ShortcutsPanel } from "~/components/shortcuts-panel";
import { PLAN_SHORTCUTS, UNDO_SHORTCUTS, type ShortcutGroup } from "~/lib/shortcuts";
import { useEffect, useState } from "react";
import { SHEET_SESSION_KEY, sheetHref } from "~/lib/sheet-link";
import { useSandbox, useSandboxStore } from "../state/store";

function Progress() {
  const computing = useSandbox((s) => s.computing);
  const [shown, setShown] = useState(false);
  useEffect(() => {
    if (!computing) return setShown(false);
    // Quick answers should not flash a bar.
    const t = setTimeout(() => setShown(true), 120);
    return () => clearTimeout(t);
  }, [computing]);
  return (
    <span
      className="flex items-center gap-2 text-xs text-ink-soft"
      role="status"
      aria-live="polite"
      data-testid="engine-status"
      data-computing={computing ? "true" : "false"}
    >
      <span
        className={`block h-1.5 w-16 animate-pulse rounded bg-accent ${shown ? "" : "invisible"}`}
        aria-hidden="true"
      />
      {shown ? "Computing…" : ""}
    </span>
  );
}

/** Undo/redo, snapping, single or side-by-side, the check sheet, and the status line. */
/**
 * The sandbox's toolbar; `shortcuts` adds the screen's own keyboard shortcuts (present mode's) to
 * the plan's and undo's in the shortcuts panel.
 */
export function Toolbar({ extra, shortcuts = [] }: { extra?: React.ReactNode; shortcuts?: ShortcutGroup[] }) {
  const store = useSandboxStore();
  const canUndo = useSandbox((s) => s.past.length > 0);
  const canRedo = useSandbox((s) => s.future.length > 0);
  const readOnly = useSandbox((s) => s.readOnly);
  const view = useSandbox((s) => s.view);
  const notice = useSandbox((s) => s.notice);
  const hasAnalysis = useSandbox((s) => s.analysedSpec !== null);
  const set = store.getState().setView;

  useEffect(() => {
    if (!notice) return;
    const t = setTimeout(() => store.getState().setNotice(null), 8000);
    return () => clearTimeout(t);
  }, [notice, store]);

  function openSheet(e: React.MouseEvent<HTMLAnchorElement>) {
    const spec = store.getState().analysedSpec;
    if (!spec) return e.preventDefault();
    const { href, viaSession } = sheetHref(spec);
    if (viaSession) sessionStorage.setItem(SHEET_SESSION_KEY, JSON.stringify(spec));
    e.currentTarget.href = href;
    if (viaSession) e.currentTarget.removeAttribute("target");
  }

  return (
    <div
      className="flex flex-wrap items-center gap-x-3 gap-y-2 border-b border-rule pb-2"
      role="toolbar"
      aria-label="Sandbox tools"
    >
      {!readOnly && (
        <span className="flex gap-1">
          <button
            type="button"
            className="btn px-2"
            disabled={!canUndo}
            onClick={() => store.getState().undo()}
            aria-keyshortcuts="Control+Z"
            title="Undo (Ctrl+Z)"
            data-testid="undo"
          >
            <Undo2 size={16} aria-hidden="true" /> Undo
          </button>
          <button
            type="button"
            className="btn px-2"
            disabled={!canRedo}
            onClick={() => store.getState().redo()}
            aria-keyshortcuts="Control+Shift+Z"
            title="Redo (Ctrl+Shift+Z)"
            data-testid="redo"
          >
            <Redo2 size={16} aria-hidden="true" /> Redo
          </button>
        </span>
      )}
      {!readOnly && (
        <span className="flex flex-wrap items-center gap-2 text-sm">
          <label className="flex items-center gap-1.5">
            <input type="checkbox" checked={view.snapToGrid} onChange={(e) => set({ snapToGrid: e.target.checked })} />{" "}
            Snap to grid
          </label>
          <select
            className="field w-auto px-1 py-0.5"
            aria-label="Grid step"
            value={view.gridStep}
            onChange={(e) => set({ gridStep: Number(e.target.value) })}
          >
            {[0.05, 0.1, 0.25, 0.5, 1].map((v) => (
              <option key={v} value={v}>
                {v < 1 ? `${Math.round(v * 1000)} mm` : `${v} m`}
              </option>
            ))}
          </select>
          <label className="flex items-center gap-1.5">
            <input
              type="checkbox"
              checked={view.snapRightAngles}
              onChange={(e) => set({ snapRightAngles: e.target.checked })}
            />{" "}
            Right angles
          </label>
        </span>
      )}
      <span className="flex gap-1" role="group" aria-label="Layout">
        <button
          type="button"
          className={`btn px-2 ${view.mode === "single" ? "bg-ink text-sheet hover:bg-ink" : ""}`}
          aria-pressed={view.mode === "single"}
          onClick={() => set({ mode: "single" })}
        >
          <Square size={16} aria-hidden="true" /> Shaped roof
        </button>
        <button
          type="button"
          className={`btn px-2 ${view.mode === "side-by-side" ? "bg-ink text-sheet hover:bg-ink" : ""}`}
          aria-pressed={view.mode === "side-by-side"}
          onClick={() => set({ mode: "side-by-side", camera: view.camera === "section" ? "orbit" : view.camera })}
          data-testid="side-by-side-toggle"
        >
          <Columns3 size={16} aria-hidden="true" /> Side-by-side
        </button>
      </span>
      <a
        className={`btn px-2 ${hasAnalysis ? "" : "pointer-events-none opacity-50"}`}
        href="/sandbox/sheet"
        target="_blank"
        rel="noopener"
        onClick={openSheet}
        data-testid="check-sheet-link"
      >
        <FileText size={16} aria-hidden="true" /> Check sheet
      </a>
      <ShortcutsPanel groups={[...shortcuts, PLAN_SHORTCUTS, UNDO_SHORTCUTS]} />
      {extra}
      <span className="ml-auto flex items-center gap-3">
        {notice && (
          <span className="text-xs text-ink-soft" data-testid="notice">
            {notice}
          </span>
        )}
        <Progress />
      </span>
    </div>
  );
}
