/**
 * The classroom's one door into the sandbox workspace (another module): the presenter edits
 * through it, followers and reviewers see the same workspace read-only.
 */
import { memo, useEffect, useMemo, useState } from "react";
import { createStore, type StoreApi } from "zustand/vanilla";
import type { RoofSpec } from "~/engine";
import { isSuperseded } from "~/components/sandbox/engine-bridge/engine-server";
import { encodeSpec } from "~/lib/sheet-link";
import { useSandboxStore } from "~/components/sandbox/state/store";
import { SandboxWorkspace } from "~/components/sandbox/workspace";

export interface LiveRoofProps {
  spec: unknown;
  /** Bumped when `spec` comes from outside (a step, a live update) and must replace what is shown. */
  version?: number;
  readOnly?: boolean;
  onSpecChange?: (spec: unknown) => void;
  /** "projector": present mode's full-screen layout (see SandboxWorkspace). */
  layout?: "page" | "projector";
}

interface Outside {
  spec: unknown;
  version: number;
}

/**
 * Inside the workspace's store provider: puts a new outside spec on screen (no undo history across
 * it). The roof and its analysis arrive in one store update: the engine's worker is asked at once,
 * not on the next animation frame, and the views never draw the new roof with the old figures
 * (on a slow machine each extra redraw of the 3D view is what makes a follower lag).
 */
function SpecSync({ outside }: { outside: StoreApi<Outside> }) {
  const store = useSandboxStore();
  useEffect(() => {
    let shown = outside.getState().version;
    return outside.subscribe(({ spec, version }) => {
      if (version === shown) return;
      shown = version;
      const next = spec as RoofSpec;
      const engine = store.getState().engine;
      if (!engine) return store.getState().replaceSpec(next, { resetHistory: true });
      void engine.analyse(next).then((outcome) => {
        // A newer roof came while this one was analysed: that one goes on screen instead.
        if (shown !== version) return;
        const state = store.getState();
        // Superseded (a newer analysis came first): the roof goes on screen and the page's engine analyses it.
        if (!isSuperseded(outcome) && outcome.ok) state.setOutcome(next, outcome);
        state.replaceSpec(next, { resetHistory: true });
      });
    });
  }, [store, outside]);
  return null;
}

// The workspace reads its props once or keeps them stable, so a page that re-renders for every
// live update (or every edit the presenter makes) does not redraw the workspace each time.
const Workspace = memo(SandboxWorkspace);

export function LiveRoof({ spec, version = 0, readOnly = false, onSpecChange, layout }: LiveRoofProps) {
  const [outside] = useState(() => createStore<Outside>(() => ({ spec, version })));
  const [initialSpec] = useState(() => spec as RoofSpec);
  useEffect(() => {
    outside.setState({ spec, version });
  }, [outside, spec, version]);
  const sync = useMemo(() => <SpecSync outside={outside} />, [outside]);
  return (
    <Workspace
      initialSpec={initialSpec}
      readOnly={readOnly}
      onSpecChange={onSpecChange}
      toolbarExtra={sync}
      layout={layout}
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
