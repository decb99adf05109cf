import type { RoofSpec, RuleSetId } from "~/engine";
import { FieldRow } from "~/components/field-row";
import { FallField } from "./fall-field";
import { formatRatio, useFormat } from "../format";
import { NumberField } from "./number-field";
import { OpeningsPanel } from "./openings-panel";
import { RidgesPanel } from "./ridges-panel";
import { useSandbox, useSandboxStore } from "../state/store";

const degreesOf = (d: [number, number] | undefined) =>
  d ? ((Math.atan2(d[1], d[0]) * 180) / Math.PI + 360) % 360 : undefined;

function Group({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <fieldset className="grid grid-cols-2 gap-x-3 gap-y-2 border-t border-rule pt-3 sm:grid-cols-3">
      <legend className="pr-2 text-sm font-bold">{title}</legend>
      {children}
    </fieldset>
  );
}

/** Every number of the roof that is not the outline: falls, joists, gutter, rain, rule set, high level. */
export function SettingsPanel() {
  const store = useSandboxStore();
  const spec = useSandbox((s) => s.spec);
  const readOnly = useSandbox((s) => s.readOnly);
  const locked = useSandbox((s) => s.locks?.parts);
  const fixed = (part: string) => readOnly || !!locked?.includes(part);
  const analysis = useSandbox((s) => s.analysis);
  const ruleSets = useSandbox((s) => s.ruleSets);
  const ruleSet = spec.ruleSet ?? "common-practice";
  const edit = (patch: (s: RoofSpec) => RoofSpec) => store.getState().edit(patch);
  const joists = spec.joists ?? {};
  const gutter = spec.gutter ?? {};
  const autoAngle = degreesOf(analysis?.shaped.joistDirection);
  const { mm } = useFormat();
  const hint = (m: number) => mm(m).replace(/\u00a0/g, " ");

  return (
    <div className="grid gap-4" data-testid="settings">
      <Group title="Falls">
        <FallField
          label={fixed("baseFall") && !readOnly ? "Base fall (fixed by the task)" : "Base fall"}
          value={spec.baseFall}
          disabled={fixed("baseFall")}
          testId="base-fall"
          onCommit={(v) => v && edit((s) => ({ ...s, baseFall: v }))}
        />
        <FallField
          label="Minimum fall"
          value={spec.minFall}
          optional
          disabled={readOnly}
          placeholder={analysis ? formatRatio(analysis.minFall.ratio) : "1:100"}
          testId="min-fall"
          onCommit={(v) => edit((s) => ({ ...s, minFall: v }))}
        />
        <NumberField
          label="High level"
          length="level"
          unit="mm"
          scale={1000}
          digits={0}
          optional
          value={spec.highLevel}
          disabled={fixed("highLevel")}
          min={-100000}
          max={100000}
          placeholder={
            analysis && analysis.shaped.highLevelSource === "derived"
              ? `auto: ${hint(analysis.shaped.highLevel)}`
              : "auto"
          }
          hint="Empty: derived from the base fall"
          testId="high-level"
          onCommit={(v) => edit((s) => ({ ...s, highLevel: v }))}
        />
      </Group>
      <Group title={fixed("joists") && !readOnly ? "Joists (fixed by the task)" : "Joists"}>
        <NumberField
          label="Spacing"
          length="level"
          unit="mm"
          scale={1000}
          digits={0}
          value={joists.spacing}
          optional
          placeholder={hint(0.4)}
          min={50}
          max={20000}
          disabled={fixed("joists")}
          testId="joist-spacing"
          onCommit={(v) => edit((s) => ({ ...s, joists: { ...s.joists, spacing: v } }))}
        />
        <NumberField
          label="Direction"
          unit="° from x"
          digits={1}
          value={degreesOf(joists.direction)}
          optional
          placeholder={autoAngle != null ? `auto: ${autoAngle.toFixed(0)}` : "auto"}
          min={0}
          max={360}
          disabled={fixed("joists")}
          hint="Empty: square to the first outlet's edge"
          testId="joist-direction"
          onCommit={(v) =>
            edit((s) => {
              const direction: [number, number] | undefined =
                v == null
                  ? undefined
                  : [
                      Number(Math.cos((v * Math.PI) / 180).toFixed(9)),
                      Number(Math.sin((v * Math.PI) / 180).toFixed(9)),
                    ];
              return { ...s, joists: { ...s.joists, direction } };
            })
          }
        />
        <NumberField
          label="First joist offset"
          length="length"
          unit="m"
          value={joists.fromOutlets ? undefined : joists.offset}
          optional
          placeholder={joists.fromOutlets && analysis ? `from outlets: ${hint(analysis.shaped.setOut.offset)}` : "0"}
          min={0}
          max={100000}
          disabled={fixed("joists") || joists.fromOutlets === true}
          testId="joist-offset"
          onCommit={(v) => edit((s) => ({ ...s, joists: { ...s.joists, offset: v } }))}
        />
        <label className="col-span-2 flex items-start gap-2 text-sm sm:col-span-3">
          <input
            type="checkbox"
            className="mt-1"
            checked={joists.fromOutlets === true}
            disabled={fixed("joists")}
            data-testid="joists-from-outlets"
            onChange={(e) => {
              const on = e.target.checked;
              edit((s) => ({ ...s, joists: { ...s.joists, fromOutlets: on || undefined } }));
            }}
          />
          <span>
            Set out from the outlets: place the first joist so a joist lands on each outlet where the spacing allows
            (outlets it cannot reach are listed in the warnings, to be trimmed round).
          </span>
        </label>
      </Group>
      <OpeningsPanel />
      <RidgesPanel />
      <Group title="Gutter layout (for the comparison)">
        <NumberField
          label="Gutter width"
          length="level"
          unit="mm"
          scale={1000}
          digits={0}
          value={gutter.width}
          optional
          placeholder={hint(analysis ? analysis.gutter.width : 0.3)}
          min={1}
          max={5000}
          disabled={readOnly}
          onCommit={(v) => edit((s) => ({ ...s, gutter: { ...s.gutter, width: v } }))}
        />
        <NumberField
          label="Depth at high end"
          length="level"
          unit="mm"
          scale={1000}
          digits={0}
          value={gutter.depth}
          optional
          placeholder={hint(analysis ? analysis.gutter.depth : 0.05)}
          min={0}
          max={2000}
          disabled={readOnly}
          onCommit={(v) => edit((s) => ({ ...s, gutter: { ...s.gutter, depth: v } }))}
        />
        <FallField
          label="Sole fall"
          value={gutter.fall}
          optional
          disabled={readOnly}
          placeholder={analysis ? formatRatio(analysis.gutter.fall.ratio) : "1:100"}
          onCommit={(v) => edit((s) => ({ ...s, gutter: { ...s.gutter, fall: v } }))}
        />
      </Group>
      <Group title="Rain and rules">
        <NumberField
          label="Rainfall intensity"
          unit="mm/h"
          digits={1}
          value={spec.rainfall?.intensity}
          optional
          placeholder={analysis ? String(analysis.rainfall.intensity) : "100"}
          min={0.1}
          max={2000}
          disabled={readOnly}
          testId="rainfall"
          onCommit={(v) => edit((s) => ({ ...s, rainfall: v == null ? undefined : { intensity: v } }))}
        />
        <FieldRow
          className="col-span-2"
          label="Rule set"
          hint="Empty fields above take this set's values; its sources are listed with the results."
        >
          {(control) => (
            <select
              {...control}
              className="field"
              value={ruleSet}
              disabled={readOnly}
              data-testid="rule-set"
              onChange={(e) => edit((s) => ({ ...s, ruleSet: e.target.value as RuleSetId }))}
            >
              {ruleSets.length === 0 && <option value={ruleSet}>{analysis?.ruleSet.name ?? ruleSet}</option>}
              {ruleSets.map((r) => (
                <option key={r.id} value={r.id}>
                  {r.name}
                </option>
              ))}
            </select>
          )}
        </FieldRow>
      </Group>
    </div>
  );
}
