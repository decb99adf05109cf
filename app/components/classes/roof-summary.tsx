import type { RoofSpec } from "~/engine";
import { RoofUnits, useUnits } from "~/components/units";
import { formatLength } from "~/lib/units";

/** A line of text that says what roof is on screen: for screen readers, and to check the live view at a glance. */
export function RoofSummary({ spec, className = "" }: { spec: unknown; className?: string }) {
  const s = spec as Partial<RoofSpec> | null;
  if (!s || !Array.isArray(s.outline) || s.outline.length < 3) return null;
  return (
    <RoofUnits ruleSet={s.ruleSet}>
      <Summary s={s as Partial<RoofSpec> & Pick<RoofSpec, "outline">} className={className} />
    </RoofUnits>
  );
}

function Summary({ s, className }: { s: Partial<RoofSpec> & Pick<RoofSpec, "outline">; className: string }) {
  const system = useUnits();
  const m = (v: number) => (system === "us" ? formatLength(v, "us") : `${Number(v.toFixed(2))} m`);
  const at = (v: number) => (system === "us" ? formatLength(v, "us") : String(Number(v.toFixed(2))));
  const xs = s.outline.map((p) => p[0]);
  const ys = s.outline.map((p) => p[1]);
  const outlets = Array.isArray(s.outlets) ? s.outlets : [];
  return (
    <p className={`text-sm ${className}`} data-testid="roof-summary">
      <span className="font-medium">Plan</span> {m(Math.max(...xs) - Math.min(...xs))} ×{" "}
      {m(Math.max(...ys) - Math.min(...ys))}, {s.outline.length} edges ·{" "}
      <span className="font-medium">{outlets.length === 1 ? "Outlet" : `${outlets.length} outlets`}</span>{" "}
      {outlets.length ? outlets.map((o) => `at (${at(o.at[0])}, ${at(o.at[1])})`).join(", ") : "none"} ·{" "}
      <span className="font-medium">Base fall</span> {String(s.baseFall ?? "—")}
    </p>
  );
}
