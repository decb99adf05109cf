import { useSandboxStore } from "~/components/sandbox/state/store";
import type { RoofSpec } from "~/engine";

/** Toolbar button that puts a given roof back in the editor (one undoable step) and says so. */
export function ResetRoofButton({
  spec,
  notice,
  children,
}: {
  spec: RoofSpec;
  notice: string;
  children: React.ReactNode;
}) {
  const store = useSandboxStore();
  return (
    <button
      type="button"
      className="btn px-2"
      onClick={() => {
        store.getState().replaceSpec(structuredClone(spec));
        store.getState().setNotice(notice);
      }}
    >
      {children}
    </button>
  );
}
