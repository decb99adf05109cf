import { useEffect } from "react";
import type { SandboxStore } from "./store";

const EDITABLE = new Set(["INPUT", "TEXTAREA", "SELECT"]);

/** Ctrl+Z / Ctrl+Shift+Z (and Ctrl+Y) anywhere on the page except in text fields, which keep their own undo. */
export function useUndoShortcuts(store: SandboxStore) {
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (!(e.ctrlKey || e.metaKey) || e.altKey) return;
      const target = e.target as HTMLElement | null;
      if (target && (EDITABLE.has(target.tagName) || target.isContentEditable)) return;
      const key = e.key.toLowerCase();
      if (key === "z" && !e.shiftKey) {
        e.preventDefault();
        store.getState().undo();
      } else if ((key === "z" && e.shiftKey) || key === "y") {
        e.preventDefault();
        store.getState().redo();
      }
    };
    document.addEventListener("keydown", onKey);
    return () => document.removeEventListener("keydown", onKey);
  }, [store]);
}
