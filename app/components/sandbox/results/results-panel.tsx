import { Caution } from "~/components/caution";
import { Advice } from "./results-advice";
import { Catchments } from "./results-catchments";
import { EdgeFalls } from "./results-edge-falls";
import { FallBands } from "./results-fall-bands";
import { FallLineSection } from "./results-fall-line";
import { HeightBudget } from "./results-height";
import { RuleSetSources } from "./results-rule-set";
import { Warnings } from "./results-warnings";
import { useSandbox } from "../state/store";

/** Everything the engine says about the roof, in reading order, with the caution on top. */
export function ResultsPanel() {
  const analysis = useSandbox((s) => s.analysis);
  const stale = useSandbox((s) => s.analysedSpec !== s.spec);
  return (
    <div className="grid gap-4" data-testid="results">
      <Caution />
      {!analysis ? (
        <p className="text-sm text-ink-soft">The results appear once the roof can be built.</p>
      ) : (
        <div className={`grid gap-4 ${stale ? "opacity-70" : ""}`}>
          <Warnings analysis={analysis} />
          <Advice analysis={analysis} />
          <HeightBudget analysis={analysis} />
          <FallLineSection analysis={analysis} />
          <EdgeFalls analysis={analysis} />
          <FallBands analysis={analysis} />
          <Catchments analysis={analysis} />
          <RuleSetSources analysis={analysis} />
        </div>
      )}
    </div>
  );
}
