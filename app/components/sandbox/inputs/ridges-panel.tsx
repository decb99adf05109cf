import type { RoofSpec } from "~/engine";
import { NumberField } from "./number-field";
import {
  addRidge,
  addRidgePoint,
  defaultRidge,
  deleteRidge,
  deleteRidgePoint,
  setRidgePoint,
} from "../state/spec-edit";
import { useSandbox, useSandboxStore } from "../state/store";

/**
 * Ridges (docs/roof-method-plans.md P4, P5) as a table: each ridge's points by keyboard, a bend
 * added or removed, the ridge deleted. Every change is an edit of the spec, so it is undoable.
 */
export function RidgesPanel() {
  const store = useSandboxStore();
  const ridges = useSandbox((s) => s.spec.ridges) ?? [];
  const readOnly = useSandbox((s) => s.readOnly);
  const edit = (recipe: (s: RoofSpec) => RoofSpec, notice?: string) => {
    store.getState().edit(recipe);
    if (notice) store.getState().setNotice(notice);
  };
  return (
    <fieldset className="grid gap-2 border-t border-rule pt-3" data-testid="ridges">
      <legend className="pr-2 text-sm font-bold">Ridges</legend>
      {ridges.length === 0 && (
        <p className="text-sm text-ink-soft">
          No ridges: the roof is one drainage area. A ridge runs from wall to wall, level at the high level, and divides
          the roof into areas shaped on their own.
        </p>
      )}
      <ul className="grid gap-3">
        {ridges.map((r, i) => (
          <li key={i} className="grid gap-1 text-sm" data-testid={`ridge-${i}`}>
            <span className="font-bold">
              Ridge {i + 1}
              {r.kind === "cricket" ? " (cricket)" : ""}
            </span>
            <table className="text-sm">
              <thead>
                <tr>
                  <th scope="col">point</th>
                  <th scope="col">x</th>
                  <th scope="col">y</th>
                  <th scope="col">
                    <span className="sr-only">Actions</span>
                  </th>
                </tr>
              </thead>
              <tbody>
                {r.line.map((p, j) => (
                  <tr key={j}>
                    <td>{j + 1}</td>
                    <td className="w-24">
                      <NumberField
                        compact
                        label={`Ridge ${i + 1} point ${j + 1} x`}
                        value={p[0]}
                        length="length"
                        min={-1e6}
                        max={1e6}
                        disabled={readOnly}
                        onCommit={(v) => v != null && edit((s) => setRidgePoint(s, i, j, [v, p[1]]))}
                        testId={`ridge-${i}-point-${j}-x`}
                      />
                    </td>
                    <td className="w-24">
                      <NumberField
                        compact
                        label={`Ridge ${i + 1} point ${j + 1} y`}
                        value={p[1]}
                        length="length"
                        min={-1e6}
                        max={1e6}
                        disabled={readOnly}
                        onCommit={(v) => v != null && edit((s) => setRidgePoint(s, i, j, [p[0], v]))}
                        testId={`ridge-${i}-point-${j}-y`}
                      />
                    </td>
                    <td>
                      {!readOnly && r.line.length > 2 && (
                        <button
                          type="button"
                          className="btn"
                          aria-label={`Delete point ${j + 1} of ridge ${i + 1}`}
                          onClick={() => edit((s) => deleteRidgePoint(s, i, j))}
                        >
                          Delete
                        </button>
                      )}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
            {!readOnly && (
              <span className="flex gap-1">
                <button type="button" className="btn" onClick={() => edit((s) => addRidgePoint(s, i))}>
                  Add a bend
                </button>
                <button
                  type="button"
                  className="btn"
                  data-testid={`delete-ridge-${i}`}
                  onClick={() => edit((s) => deleteRidge(s, i), `Ridge ${i + 1} deleted.`)}
                >
                  Delete ridge
                </button>
              </span>
            )}
          </li>
        ))}
      </ul>
      {!readOnly && (
        <button
          type="button"
          className="btn justify-self-start"
          data-testid="add-ridge"
          onClick={() =>
            edit(
              (s) => addRidge(s, defaultRidge(s)),
              "Ridge added across the middle of the roof: set its ends on two walls, each area needs a drain.",
            )
          }
        >
          Add a ridge
        </button>
      )}
    </fieldset>
  );
}
