import { lazy, Suspense, useEffect, useState } from "react";
import { usePointerWords } from "../use-pointer-words";
import { PRESENT_SHORTCUTS } from "~/lib/shortcuts";
import type { RoofSpec } from "~/engine";
import { RoofUnits } from "~/components/units";
import { ComparisonFigures } from "./results/comparison-figures";
import { DropSchedule } from "./schedule/drop-schedule";
import { EngineErrorNote } from "./engine-bridge/engine-error";
import { FallLegend } from "./results/fall-legend";
import { KeyFigures } from "./results/key-figures";
import { OutletTable } from "./inputs/outlet-table";
import { OutlineTable } from "./inputs/outline-table";
import { PlanEditor } from "./plan/plan-editor";
import { ResultsPanel } from "./results/results-panel";
import { SceneSummary } from "./results/scene-summary";
import { SettingsPanel } from "./inputs/settings-panel";
import {
  createSandboxStore,
  SandboxStoreContext,
  useSandbox,
  type Locks,
  type SandboxStore,
  type ViewSettings,
} from "./state/store";
import { Toolbar } from "./inputs/toolbar";
import type { Underlay } from "./plan/underlay";
import { useEngine } from "./engine-bridge/use-engine";
import { startEngineWorker } from "./engine-bridge/engine-client";
import { useSessionSpec } from "./state/use-session-spec";
import { useUndoShortcuts } from "./state/use-shortcuts";
import { ViewBoundary } from "./view-3d/view-boundary";
import { ViewControls } from "./view-3d/view-controls";

// Evaluated before React hydrates the page: the engine loads in its worker meanwhile.
startEngineWorker();

const RoofView3D = lazy(() => import("./view-3d/roof-view-3d"));
const SideBySide = lazy(() => import("./view-3d/side-by-side"));

export interface SandboxWorkspaceProps {
  /** The roof to open with (read once, when the workspace mounts). */
  initialSpec: RoofSpec;
  /** Called after every change of the spec (edits, undo/redo, replaceSpec). */
  onSpecChange?: (spec: RoofSpec) => void;
  /** View only: no handles, no inputs, no apply buttons. Can change while mounted. */
  readOnly?: boolean;
  /** A plan image drawn under the outline in the plan editor. */
  underlay?: Underlay;
  /** Rendered in the toolbar, inside the store's provider (so it may call useSandboxStore()). */
  toolbarExtra?: React.ReactNode;
  /** Keep the unsaved spec in sessionStorage under this key (/sandbox only)… */
  restoreKey?: string;
  /** …and open the one kept there instead of initialSpec (default true). */
  restore?: boolean;
  /** Opening view settings (e.g. a lesson that starts in side-by-side). */
  initialView?: Partial<ViewSettings>;
  /** What a lesson task fixes: those parts cannot be edited, and a lock says why. */
  locks?: Locks | null;
  /** Shown above the workspace, inside its store (e.g. a task's live criteria). */
  panel?: React.ReactNode;
  /**
   * "projector" (present mode): the 3D view fills the space given, the key figures are large, and
   * the plan and inputs sit in a scrolling column beside it; results and schedule are left out.
   */
  layout?: "page" | "projector";
}

function Card({
  title,
  children,
  aside,
  className = "",
  testId,
}: {
  title: string;
  children: React.ReactNode;
  aside?: React.ReactNode;
  className?: string;
  testId?: string;
}) {
  return (
    <section className={`card min-w-0 ${className}`} aria-label={title} data-testid={testId}>
      <div className="mb-2 flex flex-wrap items-baseline justify-between gap-2">
        <h2 className="text-lg font-bold">{title}</h2>
        {aside}
      </div>
      {children}
    </section>
  );
}

function useMounted() {
  const [mounted, setMounted] = useState(false);
  useEffect(() => setMounted(true), []);
  return mounted;
}

const loading3d = (
  <div className="flex h-full items-center justify-center text-sm text-ink-soft">Loading the 3D view…</div>
);

/**
 * The sandbox: plan editor, 3D fall map (or side-by-side), key figures, inputs, results and the
 * drop schedule around one per-page store. Used by /sandbox, and by saved roofs and lessons.
 */
export function SandboxWorkspace({
  initialSpec,
  onSpecChange,
  readOnly = false,
  underlay,
  toolbarExtra,
  restoreKey,
  restore = true,
  initialView,
  locks,
  panel,
  layout = "page",
}: SandboxWorkspaceProps) {
  const [store] = useState<SandboxStore>(() => createSandboxStore(initialSpec, { readOnly, view: initialView, locks }));
  useEngine(store);
  useUndoShortcuts(store);
  useSessionSpec(store, restoreKey, restore);

  useEffect(() => {
    if (store.getState().readOnly !== readOnly) store.setState({ readOnly, selection: null });
  }, [store, readOnly]);

  useEffect(() => {
    if (!onSpecChange) return;
    return store.subscribe((state, previous) => {
      if (state.spec !== previous.spec) onSpecChange(state.spec);
    });
  }, [store, onSpecChange]);

  return (
    <SandboxStoreContext.Provider value={store}>
      <WorkspaceUnits>
        {panel}
        {layout === "projector" ? (
          <ProjectorLayout toolbarExtra={toolbarExtra} />
        ) : (
          <Layout underlay={underlay} toolbarExtra={toolbarExtra} />
        )}
      </WorkspaceUnits>
    </SandboxStoreContext.Provider>
  );
}

/** Someone who has not chosen units sees this roof in its rule set's (US customary for a US code). */
function WorkspaceUnits({ children }: { children: React.ReactNode }) {
  const ruleSet = useSandbox((s) => s.spec.ruleSet);
  return <RoofUnits ruleSet={ruleSet}>{children}</RoofUnits>;
}

/** Present mode on a projector: the 3D view takes the screen, large figures and the editing tools beside it. */
function ProjectorLayout({ toolbarExtra }: { toolbarExtra?: React.ReactNode }) {
  const minRatio = useSandbox((s) => s.analysis?.minFall.ratio ?? 100);
  const mounted = useMounted();
  const [cameraReset, setCameraReset] = useState(0);
  return (
    <div
      className="grid h-full min-h-0 grid-cols-1 gap-3 md:grid-cols-[minmax(0,1fr)_22rem] 2xl:grid-cols-[minmax(0,1fr)_28rem]"
      data-testid="sandbox-workspace"
      data-layout="projector"
    >
      <section className="flex min-h-0 flex-col gap-2" aria-label="Fall map" data-testid="fall-map-card">
        <div className="min-h-[50vh] flex-1 overflow-hidden rounded border border-rule bg-paper-deep md:min-h-0">
          <ViewBoundary>
            {mounted ? (
              <Suspense fallback={loading3d}>
                <RoofView3D resetKey={cameraReset} />
              </Suspense>
            ) : (
              loading3d
            )}
          </ViewBoundary>
        </div>
        <FallLegend minRatio={minRatio} />
        <div className="sr-only">
          <SceneSummary />
        </div>
      </section>
      <aside className="grid min-h-0 content-start gap-3 overflow-y-auto pr-1" aria-label="Figures and changes">
        <div className="card p-0">
          <KeyFigures large />
        </div>
        <section className="card" aria-label="View">
          <ViewControls onReset={() => setCameraReset((n) => n + 1)} />
        </section>
        <Toolbar extra={toolbarExtra} shortcuts={[PRESENT_SHORTCUTS]} />
        <Card title="Plan" testId="plan-card">
          <PlanEditor />
          <div className="mt-2">
            <EngineErrorNote />
          </div>
        </Card>
        <Card title="Outline and outlets" testId="outline-card">
          <OutletTable />
          <details className="mt-2">
            <summary className="cursor-pointer text-sm font-medium">Corners</summary>
            <OutlineTable />
          </details>
        </Card>
        <details className="card">
          <summary className="cursor-pointer text-lg font-bold">Falls, joists and rules</summary>
          <div className="mt-2">
            <SettingsPanel />
          </div>
        </details>
      </aside>
    </div>
  );
}

function Layout({ underlay, toolbarExtra }: { underlay?: Underlay; toolbarExtra?: React.ReactNode }) {
  const mode = useSandbox((s) => s.view.mode);
  const minRatio = useSandbox((s) => s.analysis?.minFall.ratio ?? 100);
  const readOnly = useSandbox((s) => s.readOnly);
  const mounted = useMounted();
  const { click, doubleClick, coarse } = usePointerWords();
  const [cameraReset, setCameraReset] = useState(0);
  const resetCamera = () => setCameraReset((n) => n + 1);

  const plan = (
    <Card
      title="Plan"
      testId="plan-card"
      aside={
        <span className="text-xs text-ink-soft">
          {readOnly ? "view only" : `drag corners · ${click} an edge for an outlet · ${doubleClick} to add a corner`}
        </span>
      }
    >
      <PlanEditor underlay={underlay} />
      <div className="mt-2">
        <EngineErrorNote />
      </div>
    </Card>
  );

  return (
    // Every grid here has explicit minmax(0, 1fr) tracks (grid-cols-1): an implicit "auto" track grows to
    // its widest item's min-content (the drop schedule's table), which pushed the page past a phone's width.
    <div className="grid min-w-0 grid-cols-1 gap-4" data-testid="sandbox-workspace">
      <Toolbar extra={toolbarExtra} />
      <div className="card p-0">
        <KeyFigures />
      </div>

      {mode === "single" ? (
        <div className="grid grid-cols-1 gap-4 md:grid-cols-2">
          {plan}
          <Card
            title="Fall map"
            testId="fall-map-card"
            aside={<span className="text-xs text-ink-soft">drag to turn · {coarse ? "pinch" : "wheel"} to zoom</span>}
          >
            <ViewControls onReset={resetCamera} />
            <div className="mt-2 aspect-[4/3] w-full overflow-hidden rounded border border-rule bg-paper-deep">
              <ViewBoundary>
                {mounted ? (
                  <Suspense fallback={loading3d}>
                    <RoofView3D resetKey={cameraReset} />
                  </Suspense>
                ) : (
                  loading3d
                )}
              </ViewBoundary>
            </div>
            <div className="mt-2">
              <FallLegend minRatio={minRatio} />
            </div>
            <details className="mt-1 text-sm" open>
              <summary className="cursor-pointer text-xs font-medium uppercase tracking-wide text-ink-soft">
                What the view shows
              </summary>
              <SceneSummary />
            </details>
          </Card>
        </div>
      ) : (
        <div className="grid grid-cols-1 gap-4">
          <section className="card min-w-0" aria-label="Side-by-side views">
            <div className="mb-2 flex flex-wrap items-baseline justify-between gap-2">
              <h2 className="text-lg font-bold">Side-by-side</h2>
              <span className="text-xs text-ink-soft">the three views turn together</span>
            </div>
            <ViewControls onReset={resetCamera} />
            <div className="mt-2">
              <ViewBoundary>
                {mounted ? (
                  <Suspense fallback={<div className="h-64">{loading3d}</div>}>
                    <SideBySide resetKey={cameraReset} />
                  </Suspense>
                ) : (
                  <div className="h-64">{loading3d}</div>
                )}
              </ViewBoundary>
            </div>
            <div className="mt-2">
              <FallLegend minRatio={minRatio} />
            </div>
          </section>
          <div className="grid grid-cols-1 gap-4 lg:grid-cols-2">
            <ComparisonFigures />
            {plan}
          </div>
        </div>
      )}

      <div className="grid grid-cols-1 items-start gap-4 lg:grid-cols-2">
        <div className="grid min-w-0 grid-cols-1 gap-4">
          <Card title="Outline and outlets" testId="outline-card">
            <OutlineTable />
            <h3 className="mb-1 mt-3 text-sm font-bold uppercase tracking-wide">Outlets</h3>
            <OutletTable />
          </Card>
          <Card title="Falls, joists and rules" testId="inputs-card">
            <SettingsPanel />
          </Card>
        </div>
        <Card title="Results" testId="results-card">
          <ResultsPanel />
        </Card>
      </div>
      <DropSchedule />
    </div>
  );
}
