import { useFormat } from "../format";
import { ResultsSection } from "./results-section";
import type { Analysis } from "~/engine";

/** The height budget: what each way of draining this roof costs in build-up height at the high perimeter. */
export function HeightBudget({ analysis }: { analysis: Analysis }) {
  const { mm } = useFormat();
  const { shaped, gutter, openEdge, comparison } = analysis;
  return (
    <ResultsSection title="Height budget" id="height-budget">
      <table className="data-table w-full">
        <tbody>
          <tr>
            <th scope="row" className="font-normal">
              Shaped roof, high level H ({shaped.highLevelSource})
            </th>
            <td className="text-right font-bold" data-testid="height-shaped">
              {mm(shaped.highLevel)}
            </td>
          </tr>
          <tr>
            <th scope="row" className="font-normal">
              Gutter layout
            </th>
            <td className="text-right">{gutter.comparable ? mm(gutter.highLevel) : "not comparable"}</td>
          </tr>
          <tr>
            <th scope="row" className="font-normal">
              Open edge (one plane to edge {openEdge.edge + 1})
            </th>
            <td className="text-right">{mm(openEdge.highLevel)}</td>
          </tr>
          <tr>
            <th scope="row" className="font-normal">
              Saved against the gutter layout
            </th>
            <td className="text-right">{comparison.heightSaved == null ? "–" : mm(comparison.heightSaved)}</td>
          </tr>
        </tbody>
      </table>
    </ResultsSection>
  );
}
