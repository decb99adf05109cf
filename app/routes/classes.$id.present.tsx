import { useCallback, useEffect, useMemo, useRef, useState } from "react";
import { Link, useLoaderData } from "react-router";
import { ChevronLeft, ChevronRight, Maximize, RotateCcw, X } from "lucide-react";
import type { Route } from "./+types/classes.$id.present";
import { requirePermission } from "~/lib/auth.server";
import { findClassFor } from "~/lib/classes.server";
import { readLiveState } from "~/lib/live.server";
import { presenterDecks } from "~/lib/present.server";
import { DECK_GROUP_LABELS, type DeckGroup } from "~/lib/present-groups";
import { Caution } from "~/components/caution";
import { PageErrorBoundary } from "~/components/error-boundary";
import { LiveRoof } from "~/components/classes/live-roof";
import { PublishState } from "~/components/classes/publish-state";
import { useLivePublisher } from "~/components/classes/use-live-publisher";

export const meta: Route.MetaFunction = ({ data }) => [
  { title: `Present · ${data?.cls.name ?? "Class"} · Fallwright` },
];

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requirePermission(request, "classes:manage");
  const cls = await findClassFor(user, params.id, "manage");
  const [decks, live] = await Promise.all([presenterDecks(user.id, cls.id), readLiveState(cls.id)]);
  return { cls: { id: cls.id, name: cls.name }, decks, live };
}

const BIG_BUTTON =
  "inline-flex items-center gap-1 rounded border-2 border-sheet px-3 py-2 text-xl font-medium hover:bg-sheet hover:text-ink disabled:cursor-not-allowed disabled:opacity-40";

function typingIn(target: EventTarget | null) {
  const el = target as HTMLElement | null;
  return !!el && (el.isContentEditable || ["INPUT", "TEXTAREA", "SELECT"].includes(el.tagName));
}

export default function Present() {
  const { cls, decks, live } = useLoaderData<typeof loader>();
  const resumed = live?.state && decks.some((d) => d.key === live.state!.deck) ? live.state : null;
  const [deckKey, setDeckKey] = useState(resumed?.deck ?? decks[0]?.key ?? "");
  const deck = decks.find((d) => d.key === deckKey) ?? decks[0];
  const count = deck?.roofs.length ?? 0;
  const [index, setIndex] = useState(() => Math.min(resumed?.step?.index ?? 0, Math.max(0, count - 1)));
  // The roof on screen: the step's original until the trainer edits it (or what was live before a reload).
  const [spec, setSpec] = useState<unknown>(resumed ? resumed.spec : deck?.roofs[index]?.spec);
  const [version, setVersion] = useState(0);
  const { publish, status } = useLivePublisher(cls.id, resumed ? live!.seq : null);
  // A step puts its roof in the workspace, which reports it back as a change: that one is already sent.
  const stepSpec = useRef<unknown>(null);
  const roof = deck?.roofs[index];

  const content = useCallback(
    (nextSpec: unknown, d = deck, i = index) => ({
      spec: nextSpec,
      title: d?.roofs[i]?.caption ?? "",
      source: d ? d.title.replace(/ \(assigned\)$/, "") : "",
      deck: d?.key ?? "",
      step: d ? { index: i, count: d.roofs.length } : null,
    }),
    [deck, index],
  );

  const goTo = useCallback(
    (d: (typeof decks)[number] | undefined, i: number) => {
      if (!d || i < 0 || i >= d.roofs.length) return;
      setDeckKey(d.key);
      setIndex(i);
      setSpec(d.roofs[i].spec);
      stepSpec.current = d.roofs[i].spec;
      setVersion((v) => v + 1);
      publish(content(d.roofs[i].spec, d, i));
    },
    [publish, content],
  );

  // Nothing live yet: what is on screen goes out at once.
  const started = useRef(false);
  useEffect(() => {
    if (started.current || resumed || !deck) return;
    started.current = true;
    publish(content(spec));
  }, [resumed, deck, spec, publish, content]);

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (typingIn(e.target) || e.altKey || e.ctrlKey || e.metaKey) return;
      if (e.key === "ArrowRight" || e.key === "PageDown") goTo(deck, index + 1);
      else if (e.key === "ArrowLeft" || e.key === "PageUp") goTo(deck, index - 1);
      else return;
      e.preventDefault();
    };
    window.addEventListener("keydown", onKey);
    return () => window.removeEventListener("keydown", onKey);
  }, [goTo, deck, index]);

  const onSpecChange = useCallback(
    (next: unknown) => {
      setSpec(next);
      if (next === stepSpec.current) return;
      publish(content(next));
    },
    [publish, content],
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

  return (
    <div className="flex min-h-screen flex-col bg-sheet text-ink">
      <header className="flex items-center gap-6 bg-ink px-6 py-3 text-sheet">
        <div className="min-w-0 flex-1">
          <p className="text-sm uppercase tracking-widest text-sheet/80">Presenting · {cls.name}</p>
          <h1
            className="line-clamp-2 text-2xl font-bold leading-tight xl:text-3xl"
            aria-live="polite"
            title={roof?.caption}
          >
            {roof?.caption ?? "No roofs to present"}
          </h1>
        </div>
        <nav aria-label="Steps" className="flex shrink-0 items-center gap-3">
          <button
            type="button"
            className={BIG_BUTTON}
            onClick={() => goTo(deck, index - 1)}
            disabled={index <= 0}
            aria-label="Previous roof (left arrow)"
          >
            <ChevronLeft aria-hidden="true" className="h-7 w-7" /> Back
          </button>
          <span
            className="min-w-24 text-center text-2xl font-bold tabular-nums"
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
          >
            Next <ChevronRight aria-hidden="true" className="h-7 w-7" />
          </button>
        </nav>
        <div className="flex shrink-0 items-center gap-2">
          <button
            type="button"
            className={BIG_BUTTON}
            onClick={() => void document.documentElement.requestFullscreen?.().catch(() => {})}
            aria-label="Full screen"
          >
            <Maximize aria-hidden="true" className="h-6 w-6" />
          </button>
          <Link to={`/classes/${cls.id}`} className={BIG_BUTTON} aria-label="Stop presenting">
            <X aria-hidden="true" className="h-6 w-6" /> Exit
          </Link>
        </div>
      </header>
      <div className="flex flex-wrap items-center gap-4 border-b-2 border-ink px-6 py-2 text-lg">
        <label className="flex items-center gap-2">
          <span className="font-medium">Roofs from</span>
          <select
            className="rounded border-2 border-ink bg-sheet px-2 py-1 text-lg"
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
        <button type="button" className="btn text-base" onClick={() => goTo(deck, index)} disabled={!roof}>
          <RotateCcw aria-hidden="true" className="h-4 w-4" /> Reset this roof
        </button>
        <PublishState status={status} />
      </div>
      <main id="main" className="flex flex-1 flex-col gap-3 px-6 py-4">
        {spec ? (
          <LiveRoof spec={spec} version={version} onSpecChange={onSpecChange} />
        ) : (
          <p className="text-2xl">
            There are no roofs to present yet: lessons appear here once synced, and your saved roofs under{" "}
            <Link className="underline" to="/roofs">
              Roofs
            </Link>
            .
          </p>
        )}
        <Caution compact />
      </main>
    </div>
  );
}

export { PageErrorBoundary as ErrorBoundary };
