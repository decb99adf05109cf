import { fallPosition, legendGradient, LEGEND_TICKS, SCALE_FLAT, SCALE_STEEP } from "~/lib/fall-colour";
import { useFormat } from "../format";

/** The fall map's key: the continuous scale in 1:N on a log axis, and the hatch for "flatter than the minimum". */
export function FallLegend({ minRatio }: { minRatio: number }) {
  const minAt = fallPosition(minRatio) * 100;
  const { fallDetail, fall, system } = useFormat();
  return (
    <div className="text-xs" data-testid="fall-legend">
      <div className="flex flex-wrap items-end gap-x-3 gap-y-1">
        <div className="min-w-48 flex-1">
          <div className="flex justify-between text-ink-soft">
            <span>← steeper</span>
            <span>fall 1:N</span>
            <span>flatter →</span>
          </div>
          <div
            className="relative mt-0.5 h-3 rounded-sm border border-ink/40"
            style={{ background: legendGradient() }}
            aria-hidden="true"
          >
            <div
              className="absolute inset-y-0 right-0 opacity-80"
              style={{
                left: `${minAt}%`,
                background: "repeating-linear-gradient(135deg, #1f2933 0 2px, transparent 2px 6px)",
              }}
            />
            <div className="absolute -inset-y-1 w-0.5 bg-accent" style={{ left: `${minAt}%` }} />
          </div>
          <div className="relative h-4 text-ink-soft" aria-hidden="true">
            {LEGEND_TICKS.map((n) => (
              <span
                key={n}
                className="absolute -translate-x-1/2 tabular-nums"
                style={{ left: `${fallPosition(n) * 100}%` }}
                title={fallDetail(n)}
              >
                1:{n}
              </span>
            ))}
          </div>
        </div>
        <div className="flex items-center gap-1.5 pb-4">
          <span
            className="inline-block h-3 w-5 rounded-sm border border-ink/40"
            style={{ background: "repeating-linear-gradient(135deg, #1f2933 0 2px, #e8d96a 2px 6px)" }}
            aria-hidden="true"
          />
          <span>flatter than the minimum {system === "us" ? fall(minRatio) : `1:${Math.round(minRatio)}`}</span>
        </div>
      </div>
      <p className="sr-only">
        Colours run from dark blue for falls of 1:{SCALE_STEEP} or steeper to yellow for 1:{SCALE_FLAT} or flatter;
        faces flatter than the minimum 1:{Math.round(minRatio)} are hatched.
      </p>
    </div>
  );
}
