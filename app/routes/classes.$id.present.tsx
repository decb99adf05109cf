import { useCallback, useEffect, useMemo, useRef, useState } from "react";
import { Link, useNavigate } from "react-router";
import { ChevronLeft, ChevronRight, Hand, Maximize, Pause, Play, RotateCcw, X } from "lucide-react";
import type { Route } from "./+types/classes.$id.present";
import { requirePermission } from "~/lib/auth.server";
import { findClassFor } from "~/lib/classes.server";
import { readLiveState } from "~/lib/live.server";
import { CHANGED_LIVE, liveCaption, type CaptionBase } from "~/lib/live-caption";
import { presenterDecks } from "~/lib/present.server";
import { DECK_GROUP_LABELS, type DeckGroup } from "~/lib/present-groups";
import { Caution } from "~/components/caution";
import { PageErrorBoundary } from "~/components/error-boundary";
import { LiveRoof } from "~/components/classes/live-roof";
import { HandUpWall } from "~/components/classes/hand-up-wall";
import { PublishState } from "~/components/classes/publish-state";
import { useHandUpWall, type HandUpView } from "~/components/classes/use-hand-up-wall";
import { useLivePublisher } from "~/components/classes/use-live-publisher";

export const meta: Route.MetaFunction = ({ data }) => [
  { title: `Present · ${data?.cls.name ?? "Class"} · Fallwright` },
];

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requirePermission(request, "classes:manage");
  const cls = await findClassFor(user, params.id, "manage");
  const [decks, live] = await Promise.all([
    presenterDecks(user.id, cls.id, cls.organisation_id),
    readLiveState(cls.id),
  ]);
  return { cls: { id: cls.id, name: cls.name }, decks, live };
}

const BIG_BUTTON =
  "inline-flex items-center gap-1 rounded border-2 border-sheet px-3 py-2 text-xl font-medium hover:bg-sheet hover:text-ink disabled:cursor-not-allowed disabled:opacity-40";

function typingIn(target: EventTarget | null) {
  const el = target as HTMLElement | null;
  return !!el && (el.isContentEditable || ["INPUT", "TEXTAREA", "SELECT"].includes(el.tagName));
}

/** The caption's type, shared by the heading and the unseen step caption that holds its height. */
const CAPTION = "text-3xl font-bold leading-tight [grid-area:1/1] 2xl:text-4xl";

/** What the caption was written for: a deck step's roof, or a roof a trainee handed up. */
interface Origin extends CaptionBase {
  source: string;
  step: { index: number; count: number } | null;
  handUpId: string | null;
}

interface DeckView {
  key: string;
  title: string;
  roofs: { caption: string; spec: unknown }[];
}

const deckSource = (d: DeckView) => d.title.replace(/ \(assigned\)$/, "");

function stepOrigin(d: DeckView | undefined, i: number): Origin | null {
  const r = d?.roofs[i];
  if (!d || !r) return null;
  return {
    caption: r.caption,
    spec: r.spec,
    source: deckSource(d),
    step: { index: i, count: d.roofs.length },
    handUpId: null,
  };
}

function Key({ children }: { children: React.ReactNode }) {
  return (
    <kbd className="rounded border border-current px-1.5 font-mono text-base leading-tight" aria-hidden="true">
      {children}
    </kbd>
  );
}

export default function Present({ loaderData }: Route.ComponentProps) {
  const { cls, decks, live } = loaderData;
  const navigate = useNavigate();
  // A session still live or paused (a presenter who reloaded or came back) carries on where it was;
  // after "Stop presenting" a new one starts from the first roof.
  const resumed =
    live?.state && live.phase !== "ended" && decks.some((d) => d.key === live.state!.deck) ? live.state : null;
  const [deckKey, setDeckKey] = useState(resumed?.deck ?? decks[0]?.key ?? "");
  const deck = decks.find((d) => d.key === deckKey) ?? decks[0];
  const count = deck?.roofs.length ?? 0;
  const [index, setIndex] = useState(() => Math.min(resumed?.step?.index ?? 0, Math.max(0, count - 1)));
  // The roof on screen: the step's original until the trainer edits it (or what was live before a reload).
  const [spec, setSpec] = useState<unknown>(resumed ? resumed.spec : deck?.roofs[index]?.spec);
  const [origin, setOrigin] = useState<Origin | null>(() => stepOrigin(deck, index));
  const [version, setVersion] = useState(0);
  const [paused, setPaused] = useState(!!resumed && live?.phase === "paused");
  const [wallOpen, setWallOpen] = useState(false);
  const [ending, setEnding] = useState(false);
  const { publish, setPhase, end, status } = useLivePublisher(cls.id, resumed ? live!.seq : null);
  const { wall } = useHandUpWall(cls.id);
  // A step puts its roof in the workspace, which reports it back as a change: that one is already sent.
  const stepSpec = useRef<unknown>(null);
  const pausedRef = useRef(paused);
  pausedRef.current = paused;

  const caption = liveCaption(origin, spec);
  const content = useCallback(
    (o: Origin | null, nextSpec: unknown, d: DeckView | undefined = deck) => {
      const c = liveCaption(o, nextSpec);
      return {
        spec: nextSpec,
        title: c.title,
        source: o ? `${o.source}${c.changed ? CHANGED_LIVE : ""}` : "",
        deck: d?.key ?? "",
        step: o?.step ?? null,
      };
    },
    [deck],
  );

  const show = useCallback(
    (o: Origin, d: DeckView | undefined = deck) => {
      setOrigin(o);
      setSpec(o.spec);
      stepSpec.current = o.spec;
      setVersion((v) => v + 1);
      if (!pausedRef.current) publish(content(o, o.spec, d));
    },
    [publish, content, deck],
  );

  const goTo = useCallback(
    (d: DeckView | undefined, i: number) => {
      const o = stepOrigin(d, i);
      if (!d || !o) return;
      setDeckKey(d.key);
      setIndex(i);
      show(o, d);
    },
    [show],
  );

  const showHandUp = useCallback(
    (h: HandUpView) => {
      show({
        caption: `Handed up by ${h.name}${h.title ? `: “${h.title}”` : ""}`,
        spec: h.spec,
        source: `Hands up · ${h.name}`,
        step: null,
        handUpId: h.id,
      });
      setWallOpen(false);
    },
    [show],
  );

  // Nothing live yet (or the last session ended or was paused): what is on screen goes out at once.
  const started = useRef(false);
  useEffect(() => {
    if (started.current || !deck) return;
    started.current = true;
    if (resumed && live?.phase !== "ended") return;
    publish(content(origin, spec));
  }, [resumed, live, deck, spec, origin, publish, content]);

  const togglePause = useCallback(() => {
    if (pausedRef.current) {
      setPaused(false);
      pausedRef.current = false;
      // Resuming sends the roof as it is now (edits made while paused included).
      publish(content(origin, spec));
    } else {
      setPaused(true);
      pausedRef.current = true;
      setPhase("paused");
    }
  }, [publish, setPhase, content, origin, spec]);

  const stop = useCallback(async () => {
    setEnding(true);
    if (await end()) navigate(`/classes/${cls.id}`);
    else setEnding(false);
  }, [end, navigate, cls.id]);

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (typingIn(e.target) || e.altKey || e.ctrlKey || e.metaKey) return;
      if (e.key === "ArrowRight" || e.key === "PageDown") goTo(deck, index + 1);
      else if (e.key === "ArrowLeft" || e.key === "PageUp") goTo(deck, index - 1);
      else if (e.key === "Escape" && wallOpen) setWallOpen(false);
      else return;
      e.preventDefault();
    };
    window.addEventListener("keydown", onKey);
    return () => window.removeEventListener("keydown", onKey);
  }, [goTo, deck, index, wallOpen]);

  const onSpecChange = useCallback(
    (next: unknown) => {
      setSpec(next);
      if (next === stepSpec.current || pausedRef.current) return;
      publish(content(origin, next));
    },
    [publish, content, origin],
  );
  // The list in its parts (assigned, other lessons, my roofs), each in course order, with a divider between.
  const deckGroups = useMemo(
    () =>
      (Object.keys(DECK_GROUP_LABELS) as DeckGroup[])
        .map((group) => ({
          group,
          label: DECK_GROUP_LABELS[group],
          options: decks
            .filter((d) => d.group === group)
            .map((d) => ({
              key: d.key,
              title: `${d.title} · ${d.roofs.length} roof${d.roofs.length === 1 ? "" : "s"}`,
            })),
        }))
        .filter((g) => g.options.length),
    [decks],
  );
  const hands = wall?.handUps.length ?? 0;

  return (
    <div className="flex h-screen flex-col overflow-hidden bg-sheet text-ink">
      <header className="flex flex-wrap items-center gap-x-6 gap-y-2 bg-ink px-6 py-3 text-sheet">
        <div className="min-w-0 flex-1 basis-[28rem]">
          <div className="flex flex-wrap items-baseline gap-x-4">
            <p className="text-base uppercase tracking-widest text-sheet/80">
              Presenting · {cls.name}
              {origin ? ` · ${origin.source}` : ""}
            </p>
            {paused ? (
              <span role="status" className="ml-auto font-medium text-accent-wash">
                ‖ Paused · the class keeps the last roof sent
              </span>
            ) : (
              <PublishState status={status} onDark />
            )}
          </div>
          {/* The step's own caption, unseen, shares the heading's cell while an edit has replaced it,
              so a shorter "Changed live" caption does not grow the 3D view below: each resize of
              the view reallocates its drawing buffer and redraws it, which on a CPU-drawn machine
              froze the page for over a second at the first edit. */}
          <div className="grid">
            <h1 className={CAPTION} aria-live="polite" data-changed={caption.changed}>
              {spec ? caption.title : "No roofs to present"}
            </h1>
            {!!spec && caption.changed && origin && (
              <p aria-hidden="true" className={`invisible ${CAPTION}`} data-testid="caption-reserve">
                {origin.caption}
              </p>
            )}
          </div>
        </div>
        <nav aria-label="Steps" className="flex shrink-0 items-center gap-3">
          <button
            type="button"
            className={BIG_BUTTON}
            onClick={() => goTo(deck, index - 1)}
            disabled={index <= 0}
            aria-label="Previous roof (left arrow)"
            aria-keyshortcuts="ArrowLeft PageUp"
          >
            <ChevronLeft aria-hidden="true" className="h-7 w-7" /> Back <Key>←</Key>
          </button>
          <span
            className="min-w-24 text-center text-3xl font-bold tabular-nums"
            aria-label={`Step ${index + 1} of ${count}`}
          >
            {count ? `${index + 1} / ${count}` : "—"}
          </span>
          <button
            type="button"
            className={BIG_BUTTON}
            onClick={() => goTo(deck, index + 1)}
            disabled={index >= count - 1}
            aria-label="Next roof (right arrow)"
            aria-keyshortcuts="ArrowRight PageDown"
          >
            <Key>→</Key> Next <ChevronRight aria-hidden="true" className="h-7 w-7" />
          </button>
        </nav>
      </header>
      <div className="flex flex-wrap items-center gap-3 border-b-2 border-ink px-6 py-2 text-base">
        <label className="flex items-center gap-2">
          <span className="font-medium">Roofs from</span>
          <select
            className="max-w-[18rem] rounded border-2 border-ink bg-sheet px-2 py-1 text-base 2xl:max-w-[26rem]"
            value={deck?.key ?? ""}
            onChange={(e) =>
              goTo(
                decks.find((d) => d.key === e.target.value),
                0,
              )
            }
            disabled={!decks.length}
          >
            {deckGroups.map((g) => (
              <optgroup key={g.group} label={g.label}>
                {g.options.map((d) => (
                  <option key={d.key} value={d.key}>
                    {d.title}
                  </option>
                ))}
              </optgroup>
            ))}
          </select>
        </label>
        <button type="button" className="btn text-base" onClick={() => goTo(deck, index)} disabled={!deck}>
          <RotateCcw aria-hidden="true" className="h-4 w-4" /> Reset this roof
        </button>
        <button
          type="button"
          className="btn text-base"
          onClick={() => setWallOpen((o) => !o)}
          aria-expanded={wallOpen}
          data-testid="wall-toggle"
        >
          <Hand aria-hidden="true" className="h-4 w-4" /> Hands up ({hands})
        </button>
        <button type="button" className="btn text-base" onClick={togglePause} aria-pressed={paused} disabled={!spec}>
          {paused ? <Play aria-hidden="true" className="h-4 w-4" /> : <Pause aria-hidden="true" className="h-4 w-4" />}
          {paused ? "Resume" : "Pause"}
        </button>
        <button
          type="button"
          className="btn ml-auto text-base"
          onClick={() => void document.documentElement.requestFullscreen?.().catch(() => {})}
          aria-label="Full screen"
        >
          <Maximize aria-hidden="true" className="h-4 w-4" />
        </button>
        <button type="button" className="btn text-base" onClick={() => void stop()} disabled={ending}>
          <X aria-hidden="true" className="h-4 w-4" /> {ending ? "Ending…" : "Stop presenting"}
        </button>
      </div>
      <main id="main" className="relative flex min-h-0 flex-1 flex-col gap-2 px-4 py-3">
        {spec ? (
          <LiveRoof spec={spec} version={version} onSpecChange={onSpecChange} layout="projector" />
        ) : (
          <p className="text-2xl">
            There are no roofs to present yet: lessons appear here once synced, and your saved roofs under{" "}
            <Link className="underline" to="/roofs">
              Roofs
            </Link>
            .
          </p>
        )}
        {wallOpen && (
          <HandUpWall
            wall={wall}
            shownId={origin?.handUpId ?? null}
            onShow={showHandUp}
            onClose={() => setWallOpen(false)}
          />
        )}
      </main>
      <footer className="px-6 pb-2">
        <Caution compact />
      </footer>
    </div>
  );
}

export { PageErrorBoundary as ErrorBoundary };
