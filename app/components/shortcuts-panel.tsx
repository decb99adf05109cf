import { Keyboard } from "lucide-react";
import { useEffect, useRef } from "react";
import { HELP_SHORTCUT, type ShortcutGroup } from "~/lib/shortcuts";

const EDITABLE = new Set(["INPUT", "TEXTAREA", "SELECT"]);

/**
 * A "Keyboard shortcuts" button and the panel it opens, listing the screen's shortcuts. `?`
 * anywhere outside a text field opens it too; Esc or the close button shuts it (a native dialog,
 * so focus returns to where it was).
 */
export function ShortcutsPanel({ groups, className = "" }: { groups: ShortcutGroup[]; className?: string }) {
  const dialog = useRef<HTMLDialogElement>(null);
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (e.key !== "?" || e.ctrlKey || e.metaKey || e.altKey) return;
      const target = e.target as HTMLElement | null;
      if (target && (EDITABLE.has(target.tagName) || target.isContentEditable)) return;
      if (dialog.current && !dialog.current.open) {
        e.preventDefault();
        dialog.current.showModal();
      }
    };
    document.addEventListener("keydown", onKey);
    return () => document.removeEventListener("keydown", onKey);
  }, []);
  return (
    <>
      <button
        type="button"
        className={`btn px-2 ${className}`}
        onClick={() => dialog.current?.showModal()}
        aria-keyshortcuts="?"
        title="Keyboard shortcuts (?)"
        data-testid="shortcuts-open"
      >
        <Keyboard size={16} aria-hidden="true" /> Shortcuts
      </button>
      <dialog
        ref={dialog}
        aria-labelledby="shortcuts-title"
        className="m-auto w-[min(36rem,calc(100vw-2rem))] rounded border border-rule bg-sheet p-5 text-ink shadow-lg backdrop:bg-ink/40"
        data-testid="shortcuts-panel"
      >
        <div className="mb-3 flex items-center gap-3">
          <h2 id="shortcuts-title" className="text-lg font-bold">
            Keyboard shortcuts
          </h2>
          <form method="dialog" className="ml-auto">
            <button type="submit" className="btn px-2" autoFocus>
              Close
            </button>
          </form>
        </div>
        {[...groups, { title: "Help", items: [HELP_SHORTCUT] }].map((g) => (
          <section key={g.title} className="mb-3">
            <h3 className="text-xs font-bold tracking-wide text-ink-soft uppercase">{g.title}</h3>
            <dl className="mt-1 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
              {g.items.map((s) => (
                <div key={s.keys.join("+") + s.does} className="contents">
                  <dt className="whitespace-nowrap">
                    {s.keys.map((k, i) => (
                      <span key={k}>
                        {i > 0 && <span aria-hidden="true"> + </span>}
                        <kbd className="rounded border border-rule bg-paper px-1.5 py-0.5 font-mono text-xs">{k}</kbd>
                      </span>
                    ))}
                  </dt>
                  <dd>{s.does}</dd>
                </div>
              ))}
            </dl>
          </section>
        ))}
      </dialog>
    </>
  );
}
