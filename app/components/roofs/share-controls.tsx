import { useState } from "react";
import { useFetcher } from "react-router";
import { Link2, Share2 } from "lucide-react";
import type { RoofPageActionData } from "~/lib/roof-page";

/** The owner's switch that shares the roof read-only with the organisation, and a copy-link button. */
export function ShareControls({ shared }: { shared: boolean }) {
  const fetcher = useFetcher<RoofPageActionData>();
  const [copied, setCopied] = useState<"yes" | "failed" | null>(null);
  const pending = fetcher.formData?.get("shared");
  const isShared = typeof pending === "string" ? pending === "true" : shared;
  async function copyLink() {
    try {
      await navigator.clipboard.writeText(window.location.origin + window.location.pathname);
      setCopied("yes");
    } catch {
      setCopied("failed");
    }
    setTimeout(() => setCopied(null), 4000);
  }
  return (
    <div className="flex items-center gap-2">
      <fetcher.Form method="post">
        <input type="hidden" name="intent" value="share" />
        <input type="hidden" name="shared" value={isShared ? "false" : "true"} />
        <button
          type="submit"
          className={isShared ? "btn-primary" : "btn"}
          role="switch"
          aria-checked={isShared}
          title="Colleagues in your organisation can open it read-only at this page's address"
        >
          <Share2 aria-hidden="true" className="h-4 w-4" />{" "}
          {isShared ? "Shared in organisation" : "Share in organisation"}
        </button>
      </fetcher.Form>
      {isShared ? (
        <button type="button" className="btn" onClick={() => void copyLink()}>
          <Link2 aria-hidden="true" className="h-4 w-4" /> {copied === "yes" ? "Link copied" : "Copy link"}
        </button>
      ) : null}
      {copied === "failed" ? (
        <span role="alert" className="text-xs text-bad">
          Copy this address from the address bar.
        </span>
      ) : null}
    </div>
  );
}
