import { CAUTION_TEXT } from "~/lib/caution";

/** The safety caution every results view and printed sheet carries (docs/product.md, cautions). */
export function Caution({ compact = false }: { compact?: boolean }) {
  return (
    <p
      role="note"
      className={compact ? "text-xs text-ink-soft" : "rounded border border-warn/40 bg-accent-wash px-3 py-2 text-sm"}
    >
      <strong>Caution:</strong> {CAUTION_TEXT}
    </p>
  );
}
