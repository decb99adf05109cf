import type { Analysis } from "~/engine";
import { FallRatio } from "./fall-ratio";
import { formatRatio, useFormat } from "./format";
import { addOutletAt } from "./spec-edit";
import { ResultsSection } from "./results-section";
import { useSandbox, useSandboxStore } from "./store";

/** Round a suggested ratio toward the steeper side, so the applied fall still meets the advice. */
export function steeperRound(ratio: number): string {
  const n = ratio >= 10 ? Math.floor(ratio) : Math.floor(ratio * 10) / 10;
  return `1:${n}`;
}

/** What to change, each with a one-click apply (undoable like any edit). */
export function Advice({ analysis }: { analysis: Analysis }) {
  const store = useSandboxStore();
  const readOnly = useSandbox((s) => s.readOnly);
  const { point } = useFormat();
  const { minimumBaseFall, extraOutlet } = analysis.advice;
  const min = analysis.minFall.ratio;
  const field = analysis.ruleSet.used.find((u) => u.key === "fieldFall");
  const currentBase = analysis.baseFall.ratio;
  // The rule set's field fall may be steeper than the fall lines need: then it sets the target.
  const ruleWins = !!(minimumBaseFall && field && minimumBaseFall.ratio > field.value * (1 + 1e-9));
  const target = minimumBaseFall ? (ruleWins && field ? field.value : minimumBaseFall.ratio) : null;
  const suggested = target ? steeperRound(target) : null;
  const worthChanging = target != null && Math.abs(currentBase - target) / target > 0.01 && suggested !== formatRatio(currentBase);
  return (
    <ResultsSection title="Advice" id="advice">
      <ul className="grid gap-3 text-sm">
        <li>
          {minimumBaseFall && suggested ? (
            <>
              <p>
                The flattest base fall that keeps every fall line at <FallRatio ratio={min} /> or steeper is{" "}
                <FallRatio ratio={minimumBaseFall.ratio} className="font-bold" /> (now <FallRatio ratio={currentBase} />).
                {ruleWins && field && (
                  <> The rule set asks for at least <FallRatio ratio={field.value} /> in the field, which wins.</>
                )}
                {!worthChanging && " The base fall is right where it should be."}
              </p>
              {!readOnly && worthChanging && (
                <button type="button" className="btn mt-1" data-testid="apply-base-fall"
                  onClick={() => {
                    store.getState().edit((s) => ({ ...s, baseFall: suggested }));
                    store.getState().setNotice(`Base fall set to ${suggested}.`);
                  }}>
                  Set base fall to {suggested}
                </button>
              )}
            </>
          ) : (
            <p className="text-ink-soft">No base fall keeps every fall line at the minimum with these outlets: add an outlet or move one.</p>
          )}
        </li>
        {extraOutlet && (
          <li>
            <p>
              One more outlet at {point(extraOutlet.at)} on edge {extraOutlet.edge + 1} would take the longest fall line from{" "}
              <FallRatio ratio={extraOutlet.currentLongestFallRatio} /> to <FallRatio ratio={extraOutlet.longestFallRatio} className="font-bold" />.
            </p>
            {!readOnly && (
              <button type="button" className="btn mt-1" data-testid="apply-extra-outlet"
                onClick={() => {
                  store.getState().edit((s) => addOutletAt(s, extraOutlet.at));
                  store.getState().setNotice(`Outlet added at ${point(extraOutlet.at)}.`);
                }}>
                Add this outlet
              </button>
            )}
          </li>
        )}
      </ul>
    </ResultsSection>
  );
}
