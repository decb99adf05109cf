import { fallDetail, formatRatio } from "./format";

/** A fall as 1:N; degrees and percent on hover (and for screen readers). */
export function FallRatio({ ratio, className }: { ratio: number | null | undefined; className?: string }) {
  const detail = fallDetail(ratio);
  return (
    <abbr title={detail} aria-label={`${formatRatio(ratio)} (${detail})`} className={`cursor-help no-underline tabular-nums ${className ?? ""}`}>
      {formatRatio(ratio)}
    </abbr>
  );
}
