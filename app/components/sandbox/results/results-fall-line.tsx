import type { Analysis } from "~/engine";
// One light file of the engine: this page's main thread carries no engine and no mathjs (docs/decisions/0015-lazy-unit-reader.md).
import { drainName } from "~/engine/names";
import { FallRatio } from "./fall-ratio";
import { useFormat } from "../format";
import { ResultsSection } from "./results-section";
import { useSandbox, useSandboxStore } from "../state/store";

/** The longest fall line (and the flattest, when it is another one): the path water takes from the rim. */
export function FallLineSection({ analysis }: { analysis: Analysis }) {
  const { metres, mm, point } = useFormat();
  const store = useSandboxStore();
  const highlight = useSandbox((s) => s.view.highlightFallLine);
  const { longestFallLine: longest, worstFallLine: worst } = analysis.shaped;
  const min = analysis.minFall.ratio;
  const lines = [
    longest,
    worst !== longest && worst && longest && worst.from.join() !== longest.from.join() ? worst : null,
  ];
  return (
    <ResultsSection
      title="Fall lines"
      id="fall-lines"
      aside={
        <label className="flex items-center gap-1.5 text-xs">
          <input
            type="checkbox"
            checked={highlight}
            onChange={(e) => store.getState().setView({ highlightFallLine: e.target.checked })}
          />
          highlight in plan and 3D
        </label>
      }
    >
      {!longest ? (
        <p className="text-sm text-ink-soft">No fall line: the roof has no drain the water can reach.</p>
      ) : (
        <table className="data-table w-full">
          <thead>
            <tr>
              <th scope="col">line</th>
              <th scope="col">from → to</th>
              <th scope="col" className="text-right">
                length
              </th>
              <th scope="col" className="text-right">
                drop
              </th>
              <th scope="col" className="text-right">
                fall
              </th>
            </tr>
          </thead>
          <tbody>
            {lines.map((l, i) =>
              l ? (
                <tr key={i}>
                  <td>{i === 0 ? "longest" : "flattest"}</td>
                  <td>
                    {point(l.from)} → {drainName(l.drain)}
                  </td>
                  <td className="text-right">{metres(l.length)}</td>
                  <td className="text-right">{mm(l.drop)}</td>
                  <td className={`text-right ${l.ratio > min * (1 + 1e-9) ? "font-bold text-bad" : ""}`}>
                    <FallRatio ratio={l.ratio} />
                  </td>
                </tr>
              ) : null,
            )}
          </tbody>
        </table>
      )}
      <p className="mt-1 text-xs text-ink-soft">
        Every fall line must be no flatter than the minimum, <FallRatio ratio={min} />. Flattest of all{" "}
        {analysis.shaped.fallLines.length}: <FallRatio ratio={analysis.shaped.worstFallRatio} />.
      </p>
    </ResultsSection>
  );
}
