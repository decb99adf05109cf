import type { Analysis } from "~/engine";
import { fallColourCss } from "~/lib/fall-colour";
import { useFormat } from "../format";
import { ResultsSection } from "./results-section";

/** How much of the roof falls at each band of steepness. */
export function FallBands({ analysis }: { analysis: Analysis }) {
  const { area } = useFormat();
  const { areaByBand, area: total, flatterThanMinimumArea } = analysis.shaped.fallMap;
  return (
    <ResultsSection title="Fall bands" id="fall-bands">
      <table className="data-table w-full">
        <thead>
          <tr>
            <th scope="col">band</th>
            <th scope="col" className="text-right">
              area
            </th>
            <th scope="col" className="w-1/3">
              share
            </th>
          </tr>
        </thead>
        <tbody>
          {areaByBand.map((b) => {
            const mid =
              b.maxRatio == null
                ? b.minRatio * 1.5
                : b.minRatio === 0
                  ? b.maxRatio * 0.75
                  : Math.sqrt(b.minRatio * b.maxRatio);
            const share = total > 0 ? b.area / total : 0;
            return (
              <tr key={b.label}>
                <td>
                  <span
                    className="mr-2 inline-block h-3 w-3 rounded-sm border border-ink/30 align-middle"
                    style={{ background: fallColourCss(mid) }}
                    aria-hidden="true"
                  />
                  {b.label}
                </td>
                <td className="text-right">{area(b.area)}</td>
                <td>
                  <span className="flex items-center gap-2">
                    <span
                      className="h-2 rounded-sm bg-ink/70"
                      style={{ width: `${Math.max(share * 100, 0.5)}%` }}
                      aria-hidden="true"
                    />
                    <span className="shrink-0 whitespace-nowrap text-xs text-ink-soft">
                      {(share * 100).toFixed(0)}&nbsp;%
                    </span>
                  </span>
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      <p className="mt-1 text-xs text-ink-soft">
        Flatter than the minimum: {area(flatterThanMinimumArea)} (hatched in the fall map). These zones sit by the level
        rim near the high corners and carry little water.
      </p>
    </ResultsSection>
  );
}
