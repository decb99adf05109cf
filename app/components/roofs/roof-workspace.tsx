/**
 * The saved roof's editor: the sandbox workspace (app/components/sandbox, another module) fed
 * with the saved spec. This is the one place the roofs pages touch the sandbox's interface.
 */
import { useEffect } from "react";
import type { RoofSpec } from "~/engine";
import { SandboxWorkspace } from "~/components/sandbox/workspace";
import { useSandboxStore, type SandboxStore } from "~/components/sandbox/state/store";
import type { Underlay } from "~/components/sandbox/plan/underlay";
export { retraceSpec } from "~/lib/underlay";

export interface RoofWorkspaceProps {
  initialSpec: RoofSpec;
  onSpecChange: (spec: RoofSpec) => void;
  readOnly: boolean;
  underlay?: Underlay;
  /** Receives the workspace's store so the page can replace the spec as an undoable edit. */
  onStore?: (store: SandboxStore | null) => void;
}

function StoreBridge({ onStore }: { onStore: (store: SandboxStore | null) => void }) {
  const store = useSandboxStore();
  useEffect(() => {
    onStore(store);
    return () => onStore(null);
  }, [store, onStore]);
  return null;
}

export function RoofWorkspace({ initialSpec, onSpecChange, readOnly, underlay, onStore }: RoofWorkspaceProps) {
  return (
    <SandboxWorkspace
      initialSpec={initialSpec}
      onSpecChange={onSpecChange}
      readOnly={readOnly}
      underlay={underlay}
      toolbarExtra={onStore ? <StoreBridge onStore={onStore} /> : undefined}
    />
  );
}
