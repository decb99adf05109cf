/**
 * The classroom's one door into the sandbox workspace (another module): the presenter edits
 * through it, followers and reviewers see the same workspace read-only.
 */
import { useEffect, useRef } from "react";
import type { RoofSpec } from "~/engine";
import { encodeSpec } from "~/components/sandbox/sheet-link";
import { useSandboxStore } from "~/components/sandbox/store";
import { SandboxWorkspace } from "~/components/sandbox/workspace";

export interface LiveRoofProps {
  spec: unknown;
  /** Bumped when `spec` comes from outside (a step, a live update) and must replace what is shown. */
  version?: number;
  readOnly?: boolean;
  onSpecChange?: (spec: unknown) => void;
}

/**
 * Inside the workspace's store provider: puts a new outside spec on screen (no undo history across
 * it). The roof and its analysis arrive in one store update: the engine's worker is asked at once,
 * not on the next animation frame, and the views never draw the new roof with the old figures
 * (on a slow machine each extra redraw of the 3D view is what makes a follower lag).
 */
function SpecSync({ spec, version }: { spec: unknown; version: number }) {
  const store = useSandboxStore();
  const shown = useRef(version);
  useEffect(() => {
    if (version === shown.current) return;
    shown.current = version;
    const next = spec as RoofSpec;
    const engine = store.getState().engine;
    if (!engine) return store.getState().replaceSpec(next, { resetHistory: true });
    void engine.analyse(next).then((outcome) => {
      // A newer roof came while this one was analysed: that one goes on screen instead.
      if (shown.current !== version) return;
      const state = store.getState();
      if (outcome.ok) state.setOutcome(next, outcome);
      state.replaceSpec(next, { resetHistory: true });
    });
  }, [store, spec, version]);
  return null;
}

export function LiveRoof({ spec, version = 0, readOnly = false, onSpecChange }: LiveRoofProps) {
  return (
    <SandboxWorkspace
      initialSpec={spec as RoofSpec}
      readOnly={readOnly}
      onSpecChange={onSpecChange}
      toolbarExtra={<SpecSync spec={spec} version={version} />}
    />
  );
}

export function ReadOnlyRoof({ spec }: { spec: unknown }) {
  return <LiveRoof spec={spec} readOnly />;
}

/** Where "Copy to my sandbox" goes: /sandbox opens the roof carried in `?spec=` (base64url JSON). */
export function sandboxHrefFor(spec: unknown): string {
  return `/sandbox?spec=${encodeSpec(spec as RoofSpec)}`;
}
