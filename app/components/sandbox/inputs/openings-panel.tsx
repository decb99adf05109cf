import type { RoofSpec } from "~/engine";
import { FieldRow } from "~/components/field-row";
import { NumberField } from "./number-field";
import { addOpening, centreOf, deleteOpening, moveOpening, setOpening } from "../state/spec-edit";
import { useSandbox, useSandboxStore } from "../state/store";

const KINDS = ["rooflight", "hatch", "plant", "other"] as const;
const NUDGE = 0.1;

/**
 * Openings (rooflights, hatches, plant bases) as a list: add one, set its kind and upstand, move it
 * with the arrow buttons, delete it. Every change is an edit of the spec, so it is undoable.
 */
export function OpeningsPanel() {
  const store = useSandboxStore();
  const spec = useSandbox((s) => s.spec);
  const readOnly = useSandbox((s) => s.readOnly);
  const openings = spec.openings ?? [];
  const edit = (recipe: (s: RoofSpec) => RoofSpec, notice?: string) => {
    store.getState().edit(recipe);
    if (notice) store.getState().setNotice(notice);
  };
  return (
    <fieldset className="grid gap-2 border-t border-rule pt-3" data-testid="openings">
      <legend className="pr-2 text-sm font-bold">Openings</legend>
      {openings.length === 0 && (
        <p className="text-sm text-ink-soft">No rooflights, hatches or plant bases on this roof.</p>
      )}
      <ul className="grid gap-2">
        {openings.map((o, i) => (
          <li key={i} className="flex flex-wrap items-end gap-2 text-sm" data-testid={`opening-${i}`}>
            <span className="font-bold">{i + 1}</span>
            <FieldRow label="Kind">
              {(control) => (
                <select
                  {...control}
                  className="field"
                  value={o.kind ?? "other"}
                  disabled={readOnly}
                  aria-label={`Opening ${i + 1} kind`}
                  onChange={(e) => edit((s) => setOpening(s, i, { kind: e.target.value as (typeof KINDS)[number] }))}
                >
                  {KINDS.map((k) => (
                    <option key={k} value={k}>
                      {k}
                    </option>
                  ))}
                </select>
              )}
            </FieldRow>
            <NumberField
              label="Upstand"
              unit="mm"
              scale={1000}
              digits={0}
              value={o.upstand}
              optional
              placeholder="150"
              min={0}
              max={2000}
              disabled={readOnly}
              testId={`opening-${i}-upstand`}
              onCommit={(v) => edit((s) => setOpening(s, i, { upstand: v }))}
            />
            {!readOnly && (
              <span className="flex gap-1" role="group" aria-label={`Move opening ${i + 1} by ${NUDGE * 1000} mm`}>
                {(
                  [
                    ["←", -NUDGE, 0, "left"],
                    ["→", NUDGE, 0, "right"],
                    ["↓", 0, -NUDGE, "down"],
                    ["↑", 0, NUDGE, "up"],
                  ] as const
                ).map(([sym, dx, dy, name]) => (
                  <button
                    key={name}
                    type="button"
                    className="btn min-h-6 min-w-6"
                    aria-label={`Move opening ${i + 1} ${name}`}
                    onClick={() => edit((s) => moveOpening(s, i, dx, dy))}
                  >
                    {sym}
                  </button>
                ))}
                <button
                  type="button"
                  className="btn"
                  data-testid={`delete-opening-${i}`}
                  onClick={() => edit((s) => deleteOpening(s, i), `Opening ${i + 1} deleted.`)}
                >
                  Delete
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
          data-testid="add-opening"
          onClick={() =>
            edit((s) => addOpening(s, centreOf(s.outline)), "Rooflight (1 × 1 m) added in the middle of the roof.")
          }
        >
          Add a rooflight
        </button>
      )}
    </fieldset>
  );
}
