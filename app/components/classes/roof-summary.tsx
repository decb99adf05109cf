import type { RoofSpec } from "~/engine";

const m = (v: number) => `${Number(v.toFixed(2))} m`;

/** A line of text that says what roof is on screen: for screen readers, and to check the live view at a glance. */
export function RoofSummary({ spec, className = "" }: { spec: unknown; className?: string }) {
  const s = spec as Partial<RoofSpec> | null;
  if (!s || !Array.isArray(s.outline) || s.outline.length < 3) return null;
  const xs = s.outline.map((p) => p[0]);
  const ys = s.outline.map((p) => p[1]);
  const outlets = Array.isArray(s.outlets) ? s.outlets : [];
  return (
    <p className={`text-sm ${className}`} data-testid="roof-summary">
      <span className="font-medium">Plan</span> {m(Math.max(...xs) - Math.min(...xs))} × {m(Math.max(...ys) - Math.min(...ys))}, {s.outline.length} edges ·{" "}
      <span className="font-medium">{outlets.length === 1 ? "Outlet" : `${outlets.length} outlets`}</span>{" "}
      {outlets.length ? outlets.map((o) => `at (${Number(o.at[0].toFixed(2))}, ${Number(o.at[1].toFixed(2))})`).join(", ") : "none"} ·{" "}
      <span className="font-medium">Base fall</span> {String(s.baseFall ?? "—")}
    </p>
  );
}
