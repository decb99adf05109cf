import { Plus, Trash2 } from "lucide-react";
import type { EdgeKind } from "~/engine";
import { useFormat } from "../format";
import { NumberField } from "./number-field";
import {
  addOutlet,
  deleteVertex,
  edgeKindsOf,
  edgeLength,
  insertVertex,
  moveVertex,
  outletsOnEdge,
  setEdgeKind,
} from "../state/spec-edit";
import { useSandbox, useSandboxStore } from "../state/store";

/** The outline as numbers: each vertex's x and y, and the edge that leaves it (kind, length, outlet, split). */
export function OutlineTable() {
  const store = useSandboxStore();
  const spec = useSandbox((s) => s.spec);
  const readOnly = useSandbox((s) => s.readOnly);
  const outlineLocked = useSandbox((s) => !!s.locks?.parts.includes("outline"));
  const edgesLocked = useSandbox((s) => !!s.locks?.parts.includes("edges"));
  const selection = useSandbox((s) => s.selection);
  const kinds = edgeKindsOf(spec);
  const n = spec.outline.length;
  const edit = store.getState().edit;
  const { metres, system } = useFormat();
  const lengthUnit = system === "us" ? "ft, in" : "m";

  function changeKind(edge: number, kind: EdgeKind) {
    const lost = kind === "eaves" ? outletsOnEdge(spec, edge) : 0;
    edit((s) => setEdgeKind(s, edge, kind));
    store
      .getState()
      .setNotice(
        `Edge ${edge + 1} is now ${kind}${lost ? `; ${lost} outlet${lost > 1 ? "s" : ""} on it removed (undo brings ${lost > 1 ? "them" : "it"} back)` : ""}.`,
      );
  }

  return (
    <div className="overflow-x-auto">
      <table className="data-table card-table w-full" data-testid="vertex-table">
        <caption className="sr-only">Outline vertices and the edge from each to the next</caption>
        <thead>
          <tr>
            <th scope="col">#</th>
            <th scope="col">x ({lengthUnit})</th>
            <th scope="col">y ({lengthUnit})</th>
            <th scope="col">edge to next</th>
            <th scope="col">length</th>
            <th scope="col">
              <span className="sr-only">actions</span>
            </th>
          </tr>
        </thead>
        <tbody>
          {spec.outline.map((p, i) => {
            const selected =
              (selection?.kind === "vertex" && selection.index === i) ||
              (selection?.kind === "edge" && selection.index === i);
            return (
              <tr key={i} className={selected ? "bg-accent-wash" : undefined}>
                <th scope="row" className="w-8 border-b border-rule text-sm font-medium normal-case max-sm:w-auto">
                  <span className="sm:hidden">Corner </span>
                  {i + 1}
                </th>
                <td className="w-24" data-label={`x (${lengthUnit})`}>
                  <NumberField
                    compact
                    label={`Vertex ${i + 1} x`}
                    value={p[0]}
                    length="length"
                    min={-1e6}
                    max={1e6}
                    disabled={readOnly || outlineLocked}
                    onCommit={(v) => v != null && edit((s) => moveVertex(s, i, [v, s.outline[i][1]]))}
                    testId={`vertex-${i}-x`}
                  />
                </td>
                <td className="w-24" data-label={`y (${lengthUnit})`}>
                  <NumberField
                    compact
                    label={`Vertex ${i + 1} y`}
                    value={p[1]}
                    length="length"
                    min={-1e6}
                    max={1e6}
                    disabled={readOnly || outlineLocked}
                    onCommit={(v) => v != null && edit((s) => moveVertex(s, i, [s.outline[i][0], v]))}
                    testId={`vertex-${i}-y`}
                  />
                </td>
                <td data-label="edge to next">
                  <label className="sr-only" htmlFor={`edge-kind-${i}`}>
                    Edge {i + 1} to {((i + 1) % n) + 1} kind
                  </label>
                  <select
                    id={`edge-kind-${i}`}
                    className="field w-auto px-1.5 py-1 max-sm:w-full"
                    value={kinds[i]}
                    disabled={readOnly || edgesLocked}
                    onChange={(e) => changeKind(i, e.target.value as EdgeKind)}
                  >
                    <option value="parapet">parapet</option>
                    <option value="eaves">eaves</option>
                  </select>
                </td>
                <td className="whitespace-nowrap text-ink-soft max-sm:self-center" data-label="length">
                  {metres(edgeLength(spec.outline, i))}
                </td>
                <td className="card-wide whitespace-nowrap text-right">
                  {!readOnly && (
                    <span className="inline-flex flex-wrap gap-1">
                      <button
                        type="button"
                        className="btn px-1.5 py-0.5 text-xs"
                        disabled={kinds[i] === "eaves"}
                        title={kinds[i] === "eaves" ? "Outlets go on parapet edges" : undefined}
                        aria-label={`Add an outlet half-way along edge ${i + 1}`}
                        onClick={() => edit((s) => addOutlet(s, i, 0.5))}
                      >
                        + outlet
                      </button>
                      <button
                        type="button"
                        className="btn px-1.5 py-0.5 text-xs"
                        aria-label={`Add a vertex half-way along edge ${i + 1}`}
                        onClick={() => edit((s) => insertVertex(s, i))}
                        disabled={n >= 200}
                      >
                        <Plus size={14} aria-hidden="true" /> vertex
                      </button>
                      <button
                        type="button"
                        className="btn px-1.5 py-0.5 text-xs"
                        aria-label={`Delete vertex ${i + 1}`}
                        disabled={n <= 3}
                        onClick={() => edit((s) => deleteVertex(s, i))}
                      >
                        <Trash2 size={14} aria-hidden="true" />
                      </button>
                    </span>
                  )}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
