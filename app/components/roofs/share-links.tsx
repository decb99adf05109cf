import { useState } from "react";
import { useFetcher } from "react-router";
import { Link2 } from "lucide-react";
import type { RoofPageActionData } from "~/lib/roof-page";
import type { ShareLinkRow } from "~/lib/share-links.server";
import { RelativeTime } from "./relative-time";

/** The owner's read-only links: make one (shown once), list and revoke them. */
export function ShareLinks({ links }: { links: ShareLinkRow[] }) {
  const make = useFetcher<RoofPageActionData>();
  const revoke = useFetcher<RoofPageActionData>();
  const [copied, setCopied] = useState(false);
  const made = make.data?.shareLink;
  const url = made && typeof window !== "undefined" ? window.location.origin + made.path : made?.path;
  async function copy() {
    if (!url) return;
    try {
      await navigator.clipboard.writeText(url);
      setCopied(true);
      setTimeout(() => setCopied(false), 4000);
    } catch {
      setCopied(false);
    }
  }
  return (
    <section className="card" aria-labelledby="share-links-title" data-testid="share-links">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h2 id="share-links-title" className="flex items-center gap-2 text-lg font-bold">
          <Link2 aria-hidden="true" className="h-5 w-5" /> Read-only links
        </h2>
        <make.Form method="post">
          <input type="hidden" name="intent" value="share-link-create" />
          <button type="submit" className="btn" disabled={make.state !== "idle"} data-testid="share-link-create">
            {make.state !== "idle" ? "Making a link…" : "Make a read-only link"}
          </button>
        </make.Form>
      </div>
      <p className="mt-1 text-sm text-ink-soft">
        Anyone with a link sees this roof, its figures and its downloads without signing in, and cannot change it.
        Revoke a link to stop it working.
      </p>
      {make.data?.error ? (
        <p role="alert" className="mt-2 text-sm text-bad">
          {make.data.error}
        </p>
      ) : null}
      {url ? (
        <div
          className="mt-2 flex flex-wrap items-center gap-2 rounded border border-ok/40 bg-sheet px-3 py-2"
          role="status"
        >
          <label htmlFor="share-link-url" className="text-sm">
            New link (shown once; copy it now):
          </label>
          <input
            id="share-link-url"
            readOnly
            value={url}
            className="field min-w-72 flex-1 font-mono text-xs"
            data-testid="share-link-url"
            onFocus={(e) => e.currentTarget.select()}
          />
          <button type="button" className="btn" onClick={() => void copy()}>
            {copied ? "Copied" : "Copy"}
          </button>
        </div>
      ) : null}
      {revoke.data?.error ? (
        <p role="alert" className="mt-2 text-sm text-bad">
          {revoke.data.error}
        </p>
      ) : null}
      {links.length ? (
        <ul className="mt-2 divide-y divide-rule text-sm" data-testid="share-link-list">
          {links.map((l) => (
            <li key={l.id} className="flex items-center justify-between gap-2 py-1.5">
              <span>
                Link made <RelativeTime iso={l.createdAt} />
              </span>
              <revoke.Form method="post">
                <input type="hidden" name="intent" value="share-link-revoke" />
                <input type="hidden" name="linkId" value={l.id} />
                <button
                  type="submit"
                  className="btn py-0.5 text-xs"
                  disabled={revoke.state !== "idle"}
                  data-testid="share-link-revoke"
                >
                  Revoke
                </button>
              </revoke.Form>
            </li>
          ))}
        </ul>
      ) : (
        <p className="mt-2 text-sm text-ink-soft">No working links.</p>
      )}
    </section>
  );
}
