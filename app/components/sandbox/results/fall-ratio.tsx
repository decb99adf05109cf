import { useFormat } from "../format";

/** A fall as 1:N (US customary: "1/4 in per ft (1:48)"); degrees and percent on hover (and for screen readers). */
export function FallRatio({ ratio, className }: { ratio: number | null | undefined; className?: string }) {
  const { fall, fallDetail } = useFormat();
  const detail = fallDetail(ratio);
  return (
    <abbr
      title={detail}
      aria-label={`${fall(ratio)} (${detail})`}
      className={`cursor-help whitespace-nowrap no-underline tabular-nums ${className ?? ""}`}
    >
      {fall(ratio)}
    </abbr>
  );
}
