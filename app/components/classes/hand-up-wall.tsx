import { Monitor, X } from "lucide-react";
import { formatRatio, metres, mm } from "~/components/sandbox/format";
import { PlanThumb } from "~/components/classes/plan-thumb";
import type { HandUpView, WallView } from "~/components/classes/use-hand-up-wall";

function KeyFigure({ h }: { h: HandUpView }) {
  const f = h.figures;
  const tooFlat = f.worstFallRatio != null && f.worstFallRatio > f.minFallRatio * (1 + 1e-9);
  return (
    <dl className="grid grid-cols-2 gap-x-3 text-sm" data-testid="hand-up-figures">
      <dt className="text-ink-soft">High level</dt>
      <dd className="text-right text-lg font-bold tabular-nums">{mm(f.highLevel)}</dd>
      <dt className="text-ink-soft">Longest fall line</dt>
      <dd className="text-right tabular-nums">
        {f.longestFallLine ? `${metres(f.longestFallLine.length, 1)} at ${formatRatio(f.longestFallLine.ratio)}` : "–"}
      </dd>
      <dt className="text-ink-soft">Flattest fall line</dt>
      <dd className={`text-right tabular-nums ${tooFlat ? "font-bold text-bad" : ""}`}>
        {formatRatio(f.worstFallRatio)}
        {tooFlat ? ` (flatter than 1:${Math.round(f.minFallRatio)})` : ""}
      </dd>
    </dl>
  );
}

/** The trainer's wall: every roof the class handed up, each with its key figures, any one to the shared screen. */
export function HandUpWall({
  wall,
  shownId,
  onShow,
  onClose,
}: {
  wall: WallView | null;
  shownId: string | null;
  onShow: (h: HandUpView) => void;
  onClose: () => void;
}) {
  const hands = wall?.handUps ?? [];
  return (
    <section
      aria-labelledby="wall-title"
      className="absolute inset-0 z-10 flex flex-col gap-3 overflow-y-auto rounded border-2 border-ink bg-sheet p-4"
      data-testid="hand-up-wall"
    >
      <div className="flex items-center justify-between gap-3">
        <h2 id="wall-title" className="text-2xl font-bold">
          Hands up · {hands.length} roof{hands.length === 1 ? "" : "s"}
        </h2>
        <button type="button" className="btn text-base" onClick={onClose}>
          <X aria-hidden="true" className="h-5 w-5" /> Close the wall
        </button>
      </div>
      {hands.length === 0 ? (
        <p className="text-lg text-ink-soft">
          {wall ? "No hands up yet." : "Loading…"} Trainees send a roof with “Hand up” on their follow page; it appears
          here at once.
        </p>
      ) : (
        <ul className="grid gap-3 [grid-template-columns:repeat(auto-fill,minmax(15rem,1fr))]">
          {hands.map((h) => (
            <li
              key={h.id}
              className={`card grid gap-2 ${shownId === h.id ? "ring-4 ring-accent" : ""}`}
              data-testid="hand-up"
              aria-label={`${h.name}'s roof`}
            >
              <div className="flex items-baseline justify-between gap-2">
                <h3 className="truncate text-lg font-bold">{h.name}</h3>
                <time className="text-xs text-ink-soft" dateTime={h.at}>
                  {new Date(h.at).toLocaleTimeString([], { hour: "2-digit", minute: "2-digit" })}
                </time>
              </div>
              {h.title && <p className="text-sm">“{h.title}”</p>}
              <PlanThumb spec={h.spec} label={`Plan of ${h.name}'s roof`} className="h-32 w-full" />
              <KeyFigure h={h} />
              <button type="button" className="btn-primary justify-center text-base" onClick={() => onShow(h)}>
                <Monitor aria-hidden="true" className="h-5 w-5" />
                {shownId === h.id ? "On screen" : "Show to the class"}
              </button>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
