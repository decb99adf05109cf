/**
 * /s/<token>: a roof shared read-only by link, for someone without an account: its 3D view,
 * figures, drop schedule and downloads, with the caution. 404 for an unknown or revoked link.
 */
import { data } from "react-router";
import type { Route } from "./+types/s.$token";
import { parseSpec } from "~/engine";
import { findSharedRoof } from "~/lib/share-links.server";
import { Caution } from "~/components/caution";
import { GeneralErrorBoundary } from "~/components/error-boundary";
import { PackDownloads } from "~/components/pack/downloads";
import { SandboxWorkspace } from "~/components/sandbox/workspace";

export const meta: Route.MetaFunction = ({ data }) => [
  { title: `${data?.name ?? "Shared roof"} · Fallwright` },
  // A share link is a secret: keep it out of search engines and out of other sites' logs.
  { name: "robots", content: "noindex, nofollow" },
  { name: "referrer", content: "no-referrer" },
];

export async function loader({ params }: Route.LoaderArgs) {
  const shared = await findSharedRoof(params.token);
  if (!shared) throw data("This link does not work: it was never made, or its owner has revoked it.", { status: 404 });
  const parsed = parseSpec(shared.spec);
  return {
    name: shared.name,
    token: params.token,
    spec: parsed.ok ? parsed.spec : null,
    problem: parsed.ok ? null : parsed.error.message,
  };
}

export default function SharedRoof({ loaderData }: Route.ComponentProps) {
  const { name, token, spec, problem } = loaderData;
  return (
    <div className="grid gap-3" data-testid="shared-roof">
      <header className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <p className="text-xs font-medium uppercase tracking-widest text-accent">Shared read-only view</p>
          <h1 className="text-3xl font-bold tracking-tight">{name}</h1>
        </div>
        <PackDownloads base={`/s/${token}`} />
      </header>
      <Caution />
      {spec ? (
        <SandboxWorkspace initialSpec={spec} readOnly restore={false} />
      ) : (
        <p role="alert" className="card">
          This roof cannot be shown as saved: {problem}
        </p>
      )}
    </div>
  );
}

export function ErrorBoundary() {
  return <GeneralErrorBoundary />;
}
