import { useSandbox } from "../state/store";
import { FallRatio } from "./fall-ratio";
import { useFormat } from "../format";

function Figure({
  label,
  children,
  testId,
  tone,
  large,
}: {
  label: string;
  children: React.ReactNode;
  testId?: string;
  tone?: "bad" | "ok";
  large?: boolean;
}) {
  return (
    <div className="min-w-0 px-3 py-2">
      <dt className={`${large ? "text-base" : "text-[11px]"} font-medium uppercase tracking-wide text-ink-soft`}>
        {label}
      </dt>
      <dd
        className={`${large ? "text-4xl" : "text-xl"} font-bold tabular-nums ${tone === "bad" ? "text-bad" : ""}`}
        data-testid={testId}
      >
        {children}
      </dd>
    </div>
  );
}

/**
 * The four figures a class watches while the roof changes: height budget, longest and flattest fall
 * lines, flat area. `large`: for a projector, two to a row, readable from the back of a room.
 */
export function KeyFigures({ large = false }: { large?: boolean } = {}) {
  const { area, metres, mm } = useFormat();
  const analysis = useSandbox((s) => s.analysis);
  const stale = useSandbox((s) => s.analysedSpec !== s.spec);
  const failed = useSandbox((s) => s.engineError !== null);
  if (!analysis) {
    return (
      <p className="px-3 py-4 text-sm text-ink-soft" data-testid="key-figures-empty">
        {failed ? "No figures: the roof cannot be built yet (see the plan)." : "Working out the figures…"}
      </p>
    );
  }
  const { shaped, minFall } = analysis;
  const worst = shaped.worstFallRatio;
  const tooFlat = worst != null && worst > minFall.ratio * (1 + 1e-9);
  return (
    <dl
      className={`grid grid-cols-2 divide-rule ${large ? "" : "sm:grid-cols-4 sm:divide-x"} ${stale ? "opacity-60" : ""}`}
      aria-live="polite"
      data-testid="key-figures"
    >
      <Figure label={`High level (${shaped.highLevelSource})`} testId="high-level-figure" large={large}>
        {mm(shaped.highLevel)}
      </Figure>
      <Figure label="Longest fall line" testId="longest-fall-figure" large={large}>
        {shaped.longestFallLine ? (
          <>
            {metres(shaped.longestFallLine.length, 1)}{" "}
            <span className={`${large ? "text-2xl" : "text-base"} font-medium`}>
              at <FallRatio ratio={shaped.longestFallLine.ratio} />
            </span>
          </>
        ) : (
          "–"
        )}
      </Figure>
      <Figure
        label={`Flattest fall line (min ${`1:${Math.round(minFall.ratio)}`})`}
        testId="worst-fall-figure"
        tone={tooFlat ? "bad" : undefined}
        large={large}
      >
        <FallRatio ratio={worst} />
        {tooFlat && <span className="sr-only"> (flatter than the minimum)</span>}
      </Figure>
      <Figure label="Flatter than minimum" testId="flat-area-figure" large={large}>
        {area(shaped.fallMap.flatterThanMinimumArea)}
      </Figure>
    </dl>
  );
}
