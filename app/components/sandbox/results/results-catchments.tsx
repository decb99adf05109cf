import type { Analysis } from "~/engine";
import { formatIntensity } from "~/lib/units";
import { useFormat } from "../format";
import { ResultsSection } from "./results-section";

/** Where the water goes: each drain's catchment and design flow, and any ponding. */
export function Catchments({ analysis }: { analysis: Analysis }) {
  const { area, flow, point, mm, system } = useFormat();
  const { catchments, ponding } = analysis.shaped;
  return (
    <ResultsSection title="Catchments and flows" id="catchments">
      <table className="data-table w-full">
        <thead>
          <tr>
            <th scope="col">drain</th>
            <th scope="col" className="text-right">
              area
            </th>
            <th scope="col" className="text-right">
              design flow
            </th>
            <th scope="col" className="text-right">
              capacity
            </th>
          </tr>
        </thead>
        <tbody>
          {catchments.map((c) => (
            <tr key={c.drain}>
              <td>{c.label}</td>
              <td className="text-right">{area(c.area)}</td>
              <td className={`text-right ${c.capacity != null && c.flow > c.capacity ? "font-bold text-bad" : ""}`}>
                {flow(c.flow)}
              </td>
              <td className="text-right">{c.capacity == null ? "–" : flow(c.capacity)}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <p className="mt-1 text-xs text-ink-soft">
        Q = i·A/3600 at {formatIntensity(analysis.rainfall.intensity, system)}
        {analysis.rainfall.assumed ? " (assumed)" : ""}, runoff coefficient 1 (rational method, ASCE 7-05 Commentary
        C8). Capacity: rough, at an assumed head.
      </p>
      <h4 className="mt-3 text-xs font-bold uppercase tracking-wide">Ponding</h4>
      {ponding.length === 0 ? (
        <p className="text-sm text-ok" data-testid="no-ponding">
          No ponding: every point drains to an outlet or an eaves edge.
        </p>
      ) : (
        <ul className="text-sm">
          {ponding.map((p, i) => (
            <li key={i} className="text-bad">
              Low point at {point(p.at)}, level {mm(p.level)}: {area(p.area)} drains to it.
            </li>
          ))}
        </ul>
      )}
    </ResultsSection>
  );
}
