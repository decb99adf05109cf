/**
 * The saved roof's editor: the sandbox workspace (app/components/sandbox, another module) fed
 * with the saved spec. This is the one place the roofs pages touch the sandbox's interface.
 */
import { useState } from "react";
import type { Underlay } from "~/components/sandbox/underlay";
export { retraceSpec } from "~/lib/underlay";

export interface RoofWorkspaceProps {
  initialSpec: unknown;
  onSpecChange: (spec: unknown) => void;
  readOnly: boolean;
  underlay?: Underlay;
}

// TEMPORARY until <SandboxWorkspace> is exported by the sandbox module: a JSON editor of the spec.
export function RoofWorkspace({ initialSpec, onSpecChange, readOnly }: RoofWorkspaceProps) {
  const [text, setText] = useState(() => JSON.stringify(initialSpec, null, 2));
  const [error, setError] = useState<string | null>(null);
  return (
    <section className="card" aria-label="Roof spec">
      <label className="label" htmlFor="spec-json">Roof spec (JSON)</label>
      <textarea
        id="spec-json"
        className="field h-64 font-mono text-xs"
        value={text}
        readOnly={readOnly}
        onChange={(e) => {
          setText(e.target.value);
          try {
            onSpecChange(JSON.parse(e.target.value));
            setError(null);
          } catch {
            setError("Not valid JSON yet.");
          }
        }}
      />
      {error ? <p className="field-error">{error}</p> : null}
    </section>
  );
}
