import { useCallback, useState } from "react";
import { Link, useNavigate } from "react-router";
import { Copy } from "lucide-react";
import type { Route } from "./+types/classes.$id.follow";
import { requireUser } from "~/lib/auth.server";
import { findClassFor, isMember } from "~/lib/classes.server";
import { can } from "~/lib/permissions";
import { readLiveState } from "~/lib/live.server";
import { liveRoofKey } from "~/lib/live-caption";
import { Caution } from "~/components/caution";
import { GeneralErrorBoundary } from "~/components/error-boundary";
import { LiveRoof, sandboxHrefFor } from "~/components/classes/live-roof";
import { HandUpPanel } from "~/components/classes/hand-up-panel";
import { LiveStatus } from "~/components/classes/live-status";
import { RoofSummary } from "~/components/classes/roof-summary";
import { useLiveFeed } from "~/components/classes/use-live-feed";
import { useSteadyHeight } from "~/components/classes/use-steady-height";

export const meta: Route.MetaFunction = ({ data }) => [
  { title: `Follow live · ${data?.cls.name ?? "Class"} · Fallwright` },
];

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const cls = await findClassFor(user, params.id, "follow");
  const [snap, member] = await Promise.all([readLiveState(cls.id), isMember(cls.id, user.id)]);
  return {
    cls: { id: cls.id, name: cls.name, trainer: cls.trainer_name },
    initial: snap,
    canHandUp: member && can(user.role, "classes:hand-up"),
  };
}

const PHASE_NOTES = {
  paused: "The trainer has paused: the last roof they sent stays on screen until they carry on.",
  ended:
    "The trainer stopped presenting: this session has ended. The last roof stays here; copy it to your sandbox to keep working on it.",
} as const;

export default function Follow({ loaderData }: Route.ComponentProps) {
  const { cls, initial, canHandUp } = loaderData;
  const feed = useLiveFeed(cls.id);
  const navigate = useNavigate();
  const state = feed.seq !== null ? feed.state : (initial?.state ?? null);
  const seq = feed.seq ?? initial?.seq ?? 0;
  const phase = (feed.seq !== null ? feed.phase : initial?.phase) ?? (state ? "live" : "idle");
  const [tab, setTab] = useState<"screen" | "mine">("screen");
  // The trainee's own roof (hand-up), kept here so it survives switching tabs.
  const [mine, setMine] = useState<{ spec: unknown; key: number } | null>(null);
  const openMine = () => {
    if (!mine && state) setMine({ spec: state.spec, key: 0 });
    setTab("mine");
  };
  const onMineChange = useCallback((spec: unknown) => setMine((m) => (m ? { ...m, spec } : m)), []);
  const restartMine = () => state && setMine((m) => ({ spec: state.spec, key: (m?.key ?? 0) + 1 }));
  // One roof of the trainer's (a step, or a roof handed up): its caption block holds its height.
  const heading = useSteadyHeight<HTMLDivElement>(state ? liveRoofKey(state) : "");
  return (
    <div className="grid gap-4">
      <header className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <p className="text-sm">
            <Link className="underline" to="/classes">
              Classes
            </Link>{" "}
            / {cls.name}
          </p>
          <h1 className="text-display font-bold tracking-tight">Follow live</h1>
        </div>
        <LiveStatus status={feed.status} phase={phase} />
      </header>
      {(phase === "paused" || phase === "ended") && (
        <p className="card border-2 border-warn text-lg" data-testid="phase-note">
          {PHASE_NOTES[phase]}
        </p>
      )}
      {canHandUp && state && (
        <div role="tablist" aria-label="What to show" className="flex gap-2">
          <button
            type="button"
            role="tab"
            aria-selected={tab === "screen"}
            className={tab === "screen" ? "btn-primary" : "btn"}
            onClick={() => setTab("screen")}
          >
            Trainer’s screen
          </button>
          <button
            type="button"
            role="tab"
            aria-selected={tab === "mine"}
            className={tab === "mine" ? "btn-primary" : "btn"}
            onClick={openMine}
          >
            My roof · hand up
          </button>
        </div>
      )}
      {tab === "mine" && mine && canHandUp ? (
        <HandUpPanel
          key={mine.key}
          classId={cls.id}
          spec={mine.spec}
          onSpecChange={onMineChange}
          onRestart={restartMine}
          open={phase === "live" || phase === "paused"}
        />
      ) : state ? (
        <section aria-labelledby="live-title" className="grid gap-3" data-seq={seq}>
          <div
            ref={heading.ref}
            style={heading.style}
            className="flex flex-wrap content-start items-end justify-between gap-3"
            data-testid="live-heading"
          >
            <div>
              <h2 id="live-title" className="text-2xl font-bold">
                {state.title || "Untitled roof"}
              </h2>
              <p className="text-ink-soft">
                {state.source}
                {state.step ? ` · step ${state.step.index + 1} of ${state.step.count}` : ""} · presented by{" "}
                {state.presenter}
              </p>
            </div>
            <button type="button" className="btn-primary" onClick={() => navigate(sandboxHrefFor(state.spec))}>
              <Copy aria-hidden="true" className="h-4 w-4" /> Copy to my sandbox
            </button>
          </div>
          <RoofSummary spec={state.spec} />
          <LiveRoof spec={state.spec} version={seq} readOnly />
        </section>
      ) : (
        <p className="card text-lg text-ink-soft">
          Nothing is being presented yet. When {cls.trainer} starts presenting, the roof appears here by itself; keep
          this page open.
        </p>
      )}
      <Caution />
    </div>
  );
}

export function ErrorBoundary() {
  return <GeneralErrorBoundary />;
}
