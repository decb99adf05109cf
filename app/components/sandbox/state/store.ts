import { createContext, useContext } from "react";
import { createStore, useStore, type StoreApi } from "zustand";
import type { Analysis, RoofSpec } from "~/engine";
import type { EngineClient } from "../engine-bridge/engine-client";
import type { RuleSetInfo } from "../engine-bridge/engine-protocol";
import type { EngineOutcome } from "../engine-bridge/analysis-outcome";

export type Selection =
  { kind: "vertex"; index: number } | { kind: "edge"; index: number } | { kind: "outlet"; index: number } | null;

export type CameraPreset = "orbit" | "plan" | "section";

export interface ViewSettings {
  snapToGrid: boolean;
  /** Grid and keyboard step, metres. */
  gridStep: number;
  snapRightAngles: boolean;
  showJoists: boolean;
  showWater: boolean;
  showContours: boolean;
  /** Contour interval, metres. */
  contourInterval: number;
  exaggeration: number;
  camera: CameraPreset;
  /** 0-based; -1 lets the view pick the joist that drops most. */
  sectionJoist: number;
  mode: "single" | "side-by-side";
  highlightFallLine: boolean;
}

/**
 * What a lesson task fixes, held by the editor: the parts listed cannot be changed by any edit
 * (mouse, keyboard, tables, settings), and `why` says so on screen.
 */
export interface Locks {
  /** Spec parts that are fixed: "outline", "edges", "outlets", "baseFall", "joists", "highLevel", … */
  parts: string[];
  why: string;
  /** Which fixed parts an edit would change (empty: allowed). */
  check: (before: RoofSpec, after: RoofSpec) => string[];
}

export interface EngineError {
  status: number;
  message: string;
  issues: { path: string; message: string }[];
}

export interface SandboxState {
  spec: RoofSpec;
  past: RoofSpec[];
  future: RoofSpec[];
  /** Key of the gesture (a drag) whose edits fold into one undo step. */
  gesture: string | null;
  selection: Selection;
  view: ViewSettings;
  /** Last good analysis; kept while a later spec fails so the views do not go blank. */
  analysis: Analysis | null;
  /** The spec that `analysis` belongs to. */
  analysedSpec: RoofSpec | null;
  engineError: EngineError | null;
  computing: boolean;
  readOnly: boolean;
  locks: Locks | null;
  /** The page's engine (a worker); null until the page runs in a browser. */
  engine: EngineClient | null;
  /** Rule sets the engine knows, for the picker (empty until the engine answers). */
  ruleSets: RuleSetInfo[];
  /** A short message for the status line (aria-live). */
  notice: string | null;
  edit: (recipe: (spec: RoofSpec) => RoofSpec, options?: { gesture?: string }) => void;
  endGesture: () => void;
  replaceSpec: (spec: RoofSpec, options?: { resetHistory?: boolean }) => void;
  undo: () => void;
  redo: () => void;
  select: (selection: Selection) => void;
  setView: (patch: Partial<ViewSettings>) => void;
  setOutcome: (spec: RoofSpec, outcome: EngineOutcome) => void;
  setComputing: (computing: boolean) => void;
  setNotice: (notice: string | null) => void;
}

export const DEFAULT_VIEW: ViewSettings = {
  snapToGrid: true,
  gridStep: 0.25,
  snapRightAngles: true,
  showJoists: true,
  showWater: true,
  showContours: false,
  contourInterval: 0.02,
  exaggeration: 10,
  camera: "orbit",
  sectionJoist: -1,
  mode: "single",
  highlightFallLine: true,
};

const HISTORY_LIMIT = 200;

export type SandboxStore = StoreApi<SandboxState>;

/**
 * One store per page (zustand's "initialize state with props" guide): the spec, its undo history,
 * the selection, view settings and the engine's latest answer. The engine runs in the browser
 * only (a worker), so the first render, on the server and in the browser alike, has no analysis yet.
 */
export function createSandboxStore(
  initialSpec: RoofSpec,
  options: { readOnly?: boolean; view?: Partial<ViewSettings>; locks?: Locks | null } = {},
) {
  return createStore<SandboxState>()((set, get) => ({
    spec: initialSpec,
    past: [],
    future: [],
    gesture: null,
    selection: null,
    view: { ...DEFAULT_VIEW, ...options.view },
    analysis: null,
    analysedSpec: null,
    engineError: null,
    computing: true,
    readOnly: options.readOnly ?? false,
    locks: options.locks ?? null,
    engine: null,
    ruleSets: [],
    notice: null,
    edit(recipe, { gesture } = {}) {
      const { spec, past, readOnly } = get();
      if (readOnly) return;
      const next = recipe(spec);
      if (next === spec) return;
      const locks = get().locks;
      const broken = locks ? locks.check(spec, next) : [];
      if (broken.length) {
        set({
          notice: `The ${broken.join(", ")} ${broken.length === 1 ? "is" : "are"} fixed by this task and cannot be changed. ${locks!.why}`,
        });
        return;
      }
      const continuing = gesture != null && gesture === get().gesture;
      set({
        spec: next,
        past: continuing ? past : [...past.slice(-(HISTORY_LIMIT - 1)), spec],
        future: [],
        gesture: gesture ?? null,
      });
    },
    endGesture() {
      if (get().gesture) set({ gesture: null });
    },
    replaceSpec(spec, { resetHistory = false } = {}) {
      const { spec: current, past } = get();
      set({
        spec,
        past: resetHistory ? [] : [...past.slice(-(HISTORY_LIMIT - 1)), current],
        future: [],
        gesture: null,
        selection: null,
      });
    },
    undo() {
      const { past, spec, future, readOnly } = get();
      if (readOnly || past.length === 0) return;
      set({
        spec: past[past.length - 1],
        past: past.slice(0, -1),
        future: [spec, ...future],
        gesture: null,
        selection: clampSelection(get().selection, past[past.length - 1]),
      });
    },
    redo() {
      const { past, spec, future, readOnly } = get();
      if (readOnly || future.length === 0) return;
      set({
        spec: future[0],
        past: [...past, spec],
        future: future.slice(1),
        gesture: null,
        selection: clampSelection(get().selection, future[0]),
      });
    },
    select(selection) {
      set({ selection });
    },
    setView(patch) {
      set({ view: { ...get().view, ...patch } });
    },
    setOutcome(spec, outcome) {
      if (outcome.ok) set({ analysis: outcome.analysis, analysedSpec: spec, engineError: null });
      else set({ engineError: outcome.error });
    },
    setComputing(computing) {
      if (get().computing !== computing) set({ computing });
    },
    setNotice(notice) {
      set({ notice });
    },
  }));
}

function clampSelection(selection: Selection, spec: RoofSpec): Selection {
  if (!selection) return null;
  const count = selection.kind === "outlet" ? spec.outlets.length : spec.outline.length;
  return selection.index < count ? selection : null;
}

export const SandboxStoreContext = createContext<SandboxStore | null>(null);

export function useSandboxStore(): SandboxStore {
  const store = useContext(SandboxStoreContext);
  if (!store) throw new Error("useSandbox needs a <SandboxStoreContext.Provider>");
  return store;
}

/** Read the store with a selector; return primitives or stable references (or wrap in useShallow). */
export function useSandbox<T>(selector: (state: SandboxState) => T): T {
  return useStore(useSandboxStore(), selector);
}
