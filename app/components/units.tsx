import { createContext, useCallback, useContext, useEffect, useId, useMemo, useState, type ReactNode } from "react";
import { useFetcher } from "react-router";
import {
  isUnitSystem,
  systemFor,
  UNIT_SYSTEM_LABELS,
  UNITS_STORAGE_KEY,
  type UnitSystem,
  type UnitsPreference,
} from "~/lib/unit-system";

interface UnitsState {
  /** What the person chose (null: follow the roof's rule set). */
  preference: UnitsPreference;
  /** The system to show in here: the choice, or the surrounding roof's rule set's. */
  system: UnitSystem;
  setPreference: (next: UnitsPreference) => void;
}

const UnitsContext = createContext<UnitsState>({ preference: null, system: "metric", setPreference: () => {} });

/**
 * The person's units for every page. A signed-in person's choice is saved with their account;
 * an anonymous visitor's is remembered in this browser (localStorage).
 */
export function UnitsProvider({
  saved,
  signedIn,
  children,
}: {
  saved: UnitsPreference | undefined;
  signedIn: boolean;
  children: ReactNode;
}) {
  const [preference, setLocal] = useState<UnitsPreference>(saved ?? null);
  const fetcher = useFetcher();

  useEffect(() => {
    if (signedIn) {
      setLocal(saved ?? null);
      return;
    }
    try {
      const stored = localStorage.getItem(UNITS_STORAGE_KEY);
      setLocal(isUnitSystem(stored) ? stored : null);
    } catch {
      // Storage refused (private mode): the choice lasts for this page only.
    }
  }, [signedIn, saved]);

  const { submit } = fetcher;
  const setPreference = useCallback(
    (next: UnitsPreference) => {
      setLocal(next);
      if (signedIn) {
        void submit({ intent: "units", units: next ?? "auto" }, { method: "post", action: "/account" });
        return;
      }
      try {
        if (next) localStorage.setItem(UNITS_STORAGE_KEY, next);
        else localStorage.removeItem(UNITS_STORAGE_KEY);
      } catch {
        // As above.
      }
    },
    [signedIn, submit],
  );

  const value = useMemo(
    () => ({ preference, system: systemFor(preference), setPreference }),
    [preference, setPreference],
  );
  return <UnitsContext.Provider value={value}>{children}</UnitsContext.Provider>;
}

/** Inside one roof: a person who has not chosen sees the roof's rule set's system. */
export function RoofUnits({ ruleSet, children }: { ruleSet: string | null | undefined; children: ReactNode }) {
  const outer = useContext(UnitsContext);
  const value = useMemo(() => ({ ...outer, system: systemFor(outer.preference, ruleSet) }), [outer, ruleSet]);
  return <UnitsContext.Provider value={value}>{children}</UnitsContext.Provider>;
}

/** The system to show lengths, levels and falls in here. */
export function useUnits(): UnitSystem {
  return useContext(UnitsContext).system;
}

export function useUnitsPreference(): UnitsState {
  return useContext(UnitsContext);
}

/** The choice of units, for the page header. */
export function UnitsSwitch({ className }: { className?: string }) {
  const id = useId();
  const { preference, setPreference } = useUnitsPreference();
  return (
    <div className={`flex items-center gap-1.5 ${className ?? ""}`}>
      <label htmlFor={id} className="text-ink-soft">
        Units
      </label>
      <select
        id={id}
        className="field w-auto min-h-11 py-1 sm:min-h-0"
        value={preference ?? "auto"}
        onChange={(e) => setPreference(isUnitSystem(e.target.value) ? e.target.value : null)}
        data-testid="units-switch"
      >
        <option value="auto">From the rule set</option>
        <option value="metric">{UNIT_SYSTEM_LABELS.metric}</option>
        <option value="us">{UNIT_SYSTEM_LABELS.us}</option>
      </select>
    </div>
  );
}
