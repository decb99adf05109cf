import type { Analysis } from "~/engine";
import { FallRatio } from "./fall-ratio";
import { ResultsSection } from "./results-section";
import { useSandbox } from "../state/store";
import { citation, RULE_KEY_NAMES } from "~/lib/pack/rule-keys";

/** The rule set the results used, value by value, each with its document and clause. */
export function RuleSetSources({ analysis }: { analysis: Analysis }) {
  const { ruleSet } = analysis;
  const notes = useSandbox((s) => s.ruleSets.find((r) => r.id === analysis.ruleSet.id)?.notes) ?? [];
  return (
    <ResultsSection title="Rule set and sources" id="rule-set">
      <p className="mb-2 text-sm font-medium">{ruleSet.name}</p>
      <table className="data-table w-full">
        <thead>
          <tr>
            <th scope="col">value</th>
            <th scope="col"></th>
            <th scope="col">source</th>
          </tr>
        </thead>
        <tbody>
          {ruleSet.used.map((u) => (
            <tr key={u.key}>
              <td>{RULE_KEY_NAMES[u.key] ?? u.key}</td>
              <td className="whitespace-nowrap">
                {u.unit === "ratio" ? (
                  <FallRatio ratio={u.value} />
                ) : u.unit === "m" ? (
                  `${Math.round(u.value * 1000)} mm`
                ) : (
                  `× ${u.value}`
                )}
              </td>
              <td className="text-xs">
                {citation(u)}
                {u.ruleSet !== ruleSet.id ? " (not in this set: common practice used)" : ""}
                {u.note && <span className="block text-ink-soft">{u.note}</span>}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      {notes.length > 0 && (
        <ul className="mt-1 list-disc pl-5 text-xs text-ink-soft">
          {notes.map((n) => (
            <li key={n}>{n}</li>
          ))}
        </ul>
      )}
    </ResultsSection>
  );
}
