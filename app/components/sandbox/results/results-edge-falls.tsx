import type { Analysis } from "~/engine";
import { FallRatio } from "./fall-ratio";
import { useFormat } from "../format";
import { ResultsSection } from "./results-section";

/** Each rising piece of an outlet edge, from the outlet up to the level rim. */
export function EdgeFalls({ analysis }: { analysis: Analysis }) {
  const { fallDetail, point } = useFormat();
  const rows = analysis.shaped.edgeFalls;
  return (
    <ResultsSection title="Edge falls" id="edge-falls">
      {rows.length === 0 ? (
        <p className="text-sm text-ink-soft">No outlet edges: every parapet edge is level at H.</p>
      ) : (
        <table className="data-table w-full">
          <thead>
            <tr>
              <th scope="col">edge</th>
              <th scope="col">from (low)</th>
              <th scope="col">to (high)</th>
              <th scope="col" className="text-right">
                fall
              </th>
              <th scope="col" className="text-right">
                ° · %
              </th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r, i) => (
              <tr key={i}>
                <td>{r.edge + 1}</td>
                <td>{point(r.from)}</td>
                <td>{point(r.to)}</td>
                <td className="text-right">
                  <FallRatio ratio={r.ratio} />
                </td>
                <td className="text-right text-ink-soft">{fallDetail(r.ratio)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </ResultsSection>
  );
}
