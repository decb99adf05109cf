/** The safety caution every results view and printed sheet carries (docs/product.md, Cautions). */
export function Caution({ compact = false }: { compact?: boolean }) {
  return (
    <p role="note" className={compact ? "text-xs text-ink-soft" : "rounded border border-warn/40 bg-accent-wash px-3 py-2 text-sm"}>
      <strong>Caution:</strong> these figures are a teaching and early-design aid. Falls, outlets and
      overflows, structure and fixing must be confirmed by the designer of record against the local
      building code and by licensed practitioners. Standing water loads roofs; leaks rot structures.
    </p>
  );
}
