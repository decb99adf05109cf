import { Link, useLoaderData, useNavigate } from "react-router";
import { Copy } from "lucide-react";
import type { Route } from "./+types/classes.$id.follow";
import { requireUser } from "~/lib/auth.server";
import { findClassFor } from "~/lib/classes.server";
import { readLiveState } from "~/lib/live.server";
import { Caution } from "~/components/caution";
import { GeneralErrorBoundary } from "~/components/error-boundary";
import { LiveRoof, sandboxHrefFor } from "~/components/classes/live-roof";
import { LiveStatus } from "~/components/classes/live-status";
import { RoofSummary } from "~/components/classes/roof-summary";
import { useLiveFeed } from "~/components/classes/use-live-feed";

export const meta: Route.MetaFunction = ({ data }) => [
  { title: `Follow live · ${data?.cls.name ?? "Class"} · Fallwright` },
];

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const cls = await findClassFor(user, params.id, "follow");
  const snap = await readLiveState(cls.id);
  return { cls: { id: cls.id, name: cls.name, trainer: cls.trainer_name }, initial: snap };
}

export default function Follow() {
  const { cls, initial } = useLoaderData<typeof loader>();
  const feed = useLiveFeed(cls.id);
  const navigate = useNavigate();
  const state = feed.seq !== null ? feed.state : (initial?.state ?? null);
  const seq = feed.seq ?? initial?.seq ?? 0;
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
        <LiveStatus status={feed.status} />
      </header>
      {state ? (
        <section aria-labelledby="live-title" className="grid gap-3" data-seq={seq}>
          <div className="flex flex-wrap items-end justify-between gap-3">
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
