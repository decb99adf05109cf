import { AlertTriangle } from "lucide-react";
import type { Analysis } from "~/engine";
import { ResultsSection } from "./results-section";

/** The engine's warnings, in its words, with where they are. */
export function Warnings({ analysis }: { analysis: Analysis }) {
  const { warnings } = analysis;
  return (
    <ResultsSection title={`Warnings (${warnings.length})`} id="warnings">
      {warnings.length === 0 ? (
        <p className="text-sm text-ok">None.</p>
      ) : (
        <ul className="grid gap-1.5">
          {warnings.map((w, i) => (
            <li key={i} className="flex gap-2 text-sm" data-code={w.code}>
              <AlertTriangle size={16} className="mt-0.5 shrink-0 text-warn" aria-hidden="true" />
              <span>{w.message}</span>
            </li>
          ))}
        </ul>
      )}
    </ResultsSection>
  );
}
