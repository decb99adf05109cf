import type { Analysis } from "~/engine";
import { FallRatio } from "./fall-ratio";
import { formatRatio, useFormat } from "../format";
import { addOutletAt, setAreaJoistDirection, setJoistDirection } from "../state/spec-edit";
import { ResultsSection } from "./results-section";
import { useSandbox, useSandboxStore } from "../state/store";

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
  const worthChanging =
    target != null && Math.abs(currentBase - target) / target > 0.01 && suggested !== formatRatio(currentBase);
  return (
    <ResultsSection title="Advice" id="advice">
      <ul className="grid gap-3 text-sm">
        <li>
          {minimumBaseFall && suggested ? (
            <>
              <p>
                The flattest base fall that keeps every fall line at <FallRatio ratio={min} /> or steeper is{" "}
                <FallRatio ratio={minimumBaseFall.ratio} className="font-bold" /> (now <FallRatio ratio={currentBase} />
                ).
                {ruleWins && field && (
                  <>
                    {" "}
                    The rule set asks for at least <FallRatio ratio={field.value} /> in the field, which wins.
                  </>
                )}
                {!worthChanging && " The base fall is right where it should be."}
              </p>
              {!readOnly && worthChanging && (
                <button
                  type="button"
                  className="btn mt-1"
                  data-testid="apply-base-fall"
                  onClick={() => {
                    store.getState().edit((s) => ({ ...s, baseFall: suggested }));
                    store.getState().setNotice(`Base fall set to ${suggested}.`);
                  }}
                >
                  Set base fall to {suggested}
                </button>
              )}
            </>
          ) : (
            <p className="text-ink-soft">
              No base fall keeps every fall line at the minimum with these outlets: add an outlet or move one.
            </p>
          )}
        </li>
        {extraOutlet && (
          <li>
            <p>
              One more outlet at {point(extraOutlet.at)} on edge {extraOutlet.edge + 1} would take the longest fall line
              from <FallRatio ratio={extraOutlet.currentLongestFallRatio} /> to{" "}
              <FallRatio ratio={extraOutlet.longestFallRatio} className="font-bold" />.
            </p>
            {!readOnly && (
              <button
                type="button"
                className="btn mt-1"
                data-testid="apply-extra-outlet"
                onClick={() => {
                  store.getState().edit((s) => addOutletAt(s, extraOutlet.at));
                  store.getState().setNotice(`Outlet added at ${point(extraOutlet.at)}.`);
                }}
              >
                Add this outlet
              </button>
            )}
          </li>
        )}
        {analysis.shaped.areas.length > 1 ? (
          <AreaJoistDirections analysis={analysis} readOnly={readOnly} />
        ) : (
          analysis.advice.joistDirections.length > 1 && <JoistDirections analysis={analysis} readOnly={readOnly} />
        )}
      </ul>
    </ResultsSection>
  );
}

const angleOf = (d: [number, number]) => `${(((Math.atan2(d[1], d[0]) * 180) / Math.PI + 360) % 360).toFixed(0)}°`;

type Option = Analysis["advice"]["joistDirections"][number];

/** Each candidate joist direction side by side, the best flagged, with a one-click apply. */
function JoistDirections({ analysis, readOnly }: { analysis: Analysis; readOnly: boolean }) {
  const store = useSandboxStore();
  const options = analysis.advice.joistDirections;
  const best = options.find((o) => o.best);
  return (
    <li data-testid="joist-directions">
      <p>Joist direction: the figures each candidate gives (from an outlet edge or eaves edge, and the current one).</p>
      <DirectionTable options={options} />
      {!readOnly && best && !best.current && (
        <button
          type="button"
          className="btn mt-1"
          data-testid="apply-joist-direction"
          onClick={() => {
            store.getState().edit((s) => setJoistDirection(s, best.direction));
            store.getState().setNotice(`Joists turned to ${angleOf(best.direction)}.`);
          }}
        >
          Turn the joists to {angleOf(best.direction)}
        </button>
      )}
    </li>
  );
}

/**
 * A roof divided by ridges: each drainage area's candidates (docs/roof-method-plans.md P8), each
 * worked up to the high level the whole roof would then need, and its best applied to that area
 * alone (an entry in the roof's area settings).
 */
function AreaJoistDirections({ analysis, readOnly }: { analysis: Analysis; readOnly: boolean }) {
  const store = useSandboxStore();
  const all = analysis.advice.joistDirections;
  return (
    <li data-testid="joist-directions">
      <p>
        Joist direction, area by area: the figures each candidate gives (from an outlet edge or eaves edge of the area,
        and its current one), with the high level the whole roof would then stand at.
      </p>
      {analysis.shaped.areas.map((area, k) => {
        const options = all.filter((o) => o.area === area.id);
        const best = options.find((o) => o.best);
        const name = `Area ${k + 1}`;
        const drains = area.outlets.length ? ` (outlet ${area.outlets.map((o) => `O${o + 1}`).join(", ")})` : "";
        return (
          <div key={area.id} className="mt-2" data-testid={`joist-directions-area-${k}`}>
            <p className="font-bold">
              {name}
              {drains}
            </p>
            {options.length > 1 ? (
              <DirectionTable options={options} />
            ) : (
              <p>
                Only its current direction, {angleOf(area.joistDirection)}: no other wall of this area holds an outlet
                or is eaves.
              </p>
            )}
            {!readOnly && best && !best.current && (
              <button
                type="button"
                className="btn mt-1"
                data-testid={`apply-joist-direction-area-${k}`}
                onClick={() => {
                  store.getState().edit((s) => setAreaJoistDirection(s, area, best.direction));
                  store.getState().setNotice(`${name}: joists turned to ${angleOf(best.direction)}.`);
                }}
              >
                Turn {name.toLowerCase()}&apos;s joists to {angleOf(best.direction)}
              </button>
            )}
          </div>
        );
      })}
    </li>
  );
}

function DirectionTable({ options }: { options: Option[] }) {
  return (
    <table className="mt-1 w-full text-left text-xs">
      <thead>
        <tr>
          <th scope="col">Direction</th>
          <th scope="col">High level</th>
          <th scope="col">Longest fall line</th>
          <th scope="col">Flattest fall line</th>
          <th scope="col">Flatter than minimum</th>
        </tr>
      </thead>
      <tbody>
        {options.map((o, i) => (
          <tr key={i} className={o.best ? "font-bold" : undefined}>
            <td>
              {angleOf(o.direction)}
              {o.current ? " (current)" : ""}
              {o.best ? " best" : ""}
            </td>
            <td>{Math.round(o.highLevel * 1000)} mm</td>
            <td>{o.longestFallRatio != null ? <FallRatio ratio={o.longestFallRatio} /> : "none"}</td>
            <td>{o.worstFallRatio != null ? <FallRatio ratio={o.worstFallRatio} /> : "none"}</td>
            <td>{o.flatterThanMinimumArea.toFixed(1)} m²</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
