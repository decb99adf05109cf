import { Trash2 } from "lucide-react";
import { useFormat } from "../format";
import { usePointerWords } from "../../use-pointer-words";
import { NumberField } from "./number-field";
import { attachOutlet, deleteOutlet, setOutlet } from "../state/spec-edit";
import { useSandbox, useSandboxStore } from "../state/store";

/** Outlets as numbers: place (snapped onto the nearest edge by the engine), level and size. */
export function OutletTable() {
  const store = useSandboxStore();
  const spec = useSandbox((s) => s.spec);
  const readOnly = useSandbox((s) => s.readOnly);
  const selection = useSandbox((s) => s.selection);
  const edit = store.getState().edit;
  const { system } = useFormat();
  const lengthUnit = system === "us" ? "ft, in" : "m";
  const levelUnit = system === "us" ? "in" : "mm";
  const { Click } = usePointerWords();
  if (spec.outlets.length === 0) {
    return (
      <p className="rounded border border-dashed border-rule p-3 text-sm text-ink-soft" data-testid="no-outlets">
        No outlets yet. {Click} a parapet edge on the plan (or use “+ outlet” in the outline table) to place one.
        Without an outlet or an eaves edge the water has nowhere to go.
      </p>
    );
  }
  return (
    <div className="overflow-x-auto">
      <table className="data-table card-table w-full" data-testid="outlet-table">
        <caption className="sr-only">Outlets</caption>
        <thead>
          <tr>
            <th scope="col">outlet</th>
            <th scope="col">x ({lengthUnit})</th>
            <th scope="col">y ({lengthUnit})</th>
            <th scope="col">edge</th>
            <th scope="col">level ({levelUnit})</th>
            <th scope="col">size ({levelUnit})</th>
            <th scope="col">
              <span className="sr-only">actions</span>
            </th>
          </tr>
        </thead>
        <tbody>
          {spec.outlets.map((o, k) => (
            <tr
              key={k}
              className={selection?.kind === "outlet" && selection.index === k ? "bg-accent-wash" : undefined}
            >
              <th scope="row">O{k + 1}</th>
              <td className="w-24" data-label={`x (${lengthUnit})`}>
                <NumberField
                  compact
                  label={`Outlet O${k + 1} x`}
                  value={o.at[0]}
                  length="length"
                  disabled={readOnly}
                  min={-1e6}
                  max={1e6}
                  onCommit={(v) => v != null && edit((s) => setOutlet(s, k, { at: [v, s.outlets[k].at[1]] }))}
                />
              </td>
              <td className="w-24" data-label={`y (${lengthUnit})`}>
                <NumberField
                  compact
                  label={`Outlet O${k + 1} y`}
                  value={o.at[1]}
                  length="length"
                  disabled={readOnly}
                  min={-1e6}
                  max={1e6}
                  onCommit={(v) => v != null && edit((s) => setOutlet(s, k, { at: [s.outlets[k].at[0], v] }))}
                />
              </td>
              <td className="text-ink-soft" data-label="edge">
                {attachOutlet(spec, o.at).edge + 1}
              </td>
              <td className="w-24" data-label={`level (${levelUnit})`}>
                <NumberField
                  compact
                  label={`Outlet O${k + 1} level`}
                  value={o.level}
                  length="level"
                  scale={1000}
                  digits={0}
                  optional
                  placeholder="0"
                  min={-1000}
                  max={1000}
                  disabled={readOnly}
                  onCommit={(v) => edit((s) => setOutlet(s, k, { level: v }))}
                />
              </td>
              <td className="w-24" data-label={`size (${levelUnit})`}>
                <NumberField
                  compact
                  label={`Outlet O${k + 1} size`}
                  value={o.size}
                  length="level"
                  scale={1000}
                  digits={0}
                  optional
                  placeholder={system === "us" ? "4" : "100"}
                  min={10}
                  max={2000}
                  disabled={readOnly}
                  onCommit={(v) => edit((s) => setOutlet(s, k, { size: v }))}
                />
              </td>
              <td className="text-right max-sm:self-end">
                {!readOnly && (
                  <button
                    type="button"
                    className="btn px-1.5 py-0.5 text-xs"
                    aria-label={`Delete outlet O${k + 1}`}
                    onClick={() => edit((s) => deleteOutlet(s, k))}
                  >
                    <Trash2 size={14} aria-hidden="true" />
                  </button>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
