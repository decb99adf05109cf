import { AlertTriangle } from "lucide-react";
import type { Analysis } from "~/engine";
import { localiseSentence } from "~/lib/units";
import { useFormat } from "../format";
import { ResultsSection } from "./results-section";
import { addRidge } from "../state/spec-edit";
import { useSandbox, useSandboxStore } from "../state/store";

/** The engine's warnings, in its words, with where they are; held water offers its cricket in one click. */
export function Warnings({ analysis }: { analysis: Analysis }) {
  const { warnings } = analysis;
  const store = useSandboxStore();
  const readOnly = useSandbox((s) => s.readOnly);
  const { system } = useFormat();
  return (
    <ResultsSection title={`Warnings (${warnings.length})`} id="warnings">
      {warnings.length === 0 ? (
        <p className="text-sm text-ok">None.</p>
      ) : (
        <ul className="grid gap-1.5">
          {warnings.map((w, i) => (
            <li key={i} className="flex gap-2 text-sm" data-code={w.code}>
              <AlertTriangle size={16} className="mt-0.5 shrink-0 text-warn" aria-hidden="true" />
              <span>
                {localiseSentence(w.message, system)}
                {w.code === "water-held-behind-upstand" && w.cricket && !readOnly && (
                  <button
                    type="button"
                    className="btn ml-2"
                    data-testid="add-cricket"
                    onClick={() => {
                      // docs/roof-method-plans.md P5: the suggested diverting ridge, added as one undoable edit.
                      const line = w.cricket!.line;
                      store.getState().edit((s) => addRidge(s, { line, kind: "cricket" }));
                      store.getState().setNotice("Diverting ridge (cricket) added: undo to take it away.");
                    }}
                  >
                    Add a diverting ridge
                  </button>
                )}
              </span>
            </li>
          ))}
        </ul>
      )}
    </ResultsSection>
  );
}
