import { useEffect, useRef } from "react";
import { useFetcher, useRevalidator } from "react-router";
import { History } from "lucide-react";
import type { RoofPageActionData, RoofSnapshot } from "~/lib/roof-page";
import type { RoofVersionRow } from "~/lib/roofs.server";
import { RelativeTime } from "./relative-time";

/** The roof's saved versions, newest first; restoring one makes it the newest. */
export function VersionHistory({
  versions,
  busy,
  expected,
  onRestored,
}: {
  versions: RoofVersionRow[];
  busy: boolean;
  expected: () => number;
  onRestored: (r: RoofSnapshot) => void;
}) {
  const revalidator = useRevalidator();
  const fetcher = useFetcher<RoofPageActionData>();
  const handled = useRef<unknown>(null);
  useEffect(() => {
    if (fetcher.state === "idle" && fetcher.data?.restored && handled.current !== fetcher.data) {
      handled.current = fetcher.data;
      onRestored(fetcher.data.restored);
      void revalidator.revalidate();
    }
  }, [fetcher.state, fetcher.data, onRestored, revalidator]);
  // Each finished save is a new version: refresh the list quietly.
  const wasBusy = useRef(busy);
  useEffect(() => {
    if (wasBusy.current && !busy) void revalidator.revalidate();
    wasBusy.current = busy;
  }, [busy, revalidator]);
  const restoredFrom = fetcher.data?.restored?.from;
  return (
    <details className="card group">
      <summary className="flex cursor-pointer list-none items-center justify-between gap-2">
        <h2 id="history-title" className="flex items-center gap-2 text-lg font-bold">
          <span aria-hidden="true" className="inline-block transition-transform group-open:rotate-90">
            ▸
          </span>
          <History aria-hidden="true" className="h-5 w-5" /> Version history
        </h2>
        <span className="text-sm text-ink-soft">
          {versions.length} {versions.length === 1 ? "version" : "versions"}
          {versions.length >= 30 ? " (latest 30)" : ""}
        </span>
      </summary>
      <div className="my-2 flex justify-end">
        <button
          type="button"
          className="btn"
          onClick={() => void revalidator.revalidate()}
          disabled={revalidator.state !== "idle"}
        >
          {revalidator.state !== "idle" ? "Refreshing…" : "Refresh"}
        </button>
      </div>
      {restoredFrom ? (
        <p role="status" className="mb-2 text-sm text-ok">
          Version {restoredFrom} restored as a new version.
        </p>
      ) : null}
      {fetcher.data?.conflict ? (
        <p role="alert" className="mb-2 text-sm text-bad">
          The roof changed elsewhere; refresh and try again.
        </p>
      ) : null}
      <ol className="max-h-80 divide-y divide-rule overflow-y-auto text-sm">
        {versions.map((v, i) => (
          <li key={v.version} className="flex items-center justify-between gap-2 py-1.5">
            <span>
              <strong>v{v.version}</strong> · {v.name}{" "}
              <span className="text-ink-soft">
                · <RelativeTime iso={v.savedAt} />
                {v.savedBy ? ` · ${v.savedBy}` : ""}
              </span>
            </span>
            {i === 0 ? (
              <span className="text-xs text-ink-soft">latest</span>
            ) : (
              <fetcher.Form method="post">
                <input type="hidden" name="intent" value="restore-version" />
                <input type="hidden" name="version" value={v.version} />
                <input type="hidden" name="expected" value={expected()} />
                <button className="btn py-0.5 text-xs" type="submit" disabled={busy || fetcher.state !== "idle"}>
                  Restore<span className="sr-only"> version {v.version}</span>
                </button>
              </fetcher.Form>
            )}
          </li>
        ))}
      </ol>
      <p className="mt-2 text-xs text-ink-soft">
        Every save is a version; restoring one makes it the newest, and nothing is overwritten.
      </p>
    </details>
  );
}
