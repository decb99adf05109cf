import { useEffect, useMemo, useState } from "react";
import { data, Link } from "react-router";
import type { Route } from "./+types/sandbox.sheet";
import { parseSpec, type RoofSpec } from "~/engine";
import { CheckSheet } from "~/components/pack/check-sheet";
import { ROOF_NAME_MAX } from "~/lib/roof-file";
import { readLinkedSpec } from "~/lib/linked-spec.server";
import { GeneralErrorBoundary } from "~/components/error-boundary";
import { runAnalysis } from "~/components/sandbox/engine-bridge/run-analysis";
import { SHEET_SESSION_KEY } from "~/lib/sheet-link";

export const meta: Route.MetaFunction = ({ data }) => [
  { title: `${data?.name ?? "Check sheet"} · check sheet · Fallwright` },
];

/** The sheet carries its own caution: the page footer leaves its copy out (one caution per sheet). */
export const handle = { ownCaution: true };

/** The roof comes in the link (`spec`, base64url JSON) or, for long ones, from the sandbox's sessionStorage. */
export async function loader({ request }: Route.LoaderArgs) {
  const url = new URL(request.url);
  const linked = readLinkedSpec(url);
  if (linked.error) throw data(linked.error.message, { status: linked.error.status });
  const name = (url.searchParams.get("name") ?? "").trim().slice(0, ROOF_NAME_MAX) || "Sandbox roof";
  return { spec: linked.spec, name, fromSession: !linked.spec && url.searchParams.get("from") === "session" };
}

function CheckSheetOf({ spec, name }: { spec: RoofSpec; name: string }) {
  const outcome = useMemo(() => runAnalysis(spec), [spec]);
  if (!outcome.ok) {
    return (
      <div className="card mx-auto max-w-xl" role="alert">
        <h1 className="text-xl font-bold">Check sheet</h1>
        <p className="mt-2 text-sm">{outcome.error.message}</p>
      </div>
    );
  }
  return (
    <CheckSheet
      name={name}
      spec={spec}
      analysis={outcome.analysis}
      back={
        <Link className="btn" to="/sandbox">
          Back to the sandbox
        </Link>
      }
    />
  );
}

export default function CheckSheetPage({ loaderData }: Route.ComponentProps) {
  const loaded = loaderData;
  const [spec, setSpec] = useState<RoofSpec | null>(loaded.spec);
  const [missing, setMissing] = useState(false);

  // A long roof comes through the sandbox's sessionStorage, which only the browser has.
  useEffect(() => {
    if (loaded.spec || !loaded.fromSession) return;
    try {
      const parsed = parseSpec(JSON.parse(sessionStorage.getItem(SHEET_SESSION_KEY) ?? "null"));
      if (parsed.ok) setSpec(parsed.spec);
      else setMissing(true);
    } catch {
      setMissing(true);
    }
  }, [loaded]);

  if (!spec) {
    return (
      <div className="card mx-auto max-w-xl">
        <h1 className="text-xl font-bold">Check sheet</h1>
        <p className="mt-2 text-sm">
          {loaded.fromSession && !missing
            ? "Reading the roof from the sandbox…"
            : "There is no roof to print here. Open the sandbox and press “Check sheet”."}
        </p>
        <p className="mt-3">
          <Link className="btn" to="/sandbox">
            Open the sandbox
          </Link>
        </p>
      </div>
    );
  }
  return <CheckSheetOf spec={spec} name={loaded.name} />;
}

export function ErrorBoundary() {
  return <GeneralErrorBoundary />;
}
