import { useFetcher } from "react-router";

/** What a colleague sees on a roof shared with the organisation, with a button to copy it. */
export function ReadOnlyBanner({ owner, name }: { owner: string; name: string }) {
  const fetcher = useFetcher();
  return (
    <div className="flex flex-wrap items-center justify-between gap-3 rounded border border-rule bg-paper-deep px-4 py-3">
      <p>
        <strong>Read-only.</strong> {owner} shared this roof with your organisation. You can look around; make your own
        copy to change it.
      </p>
      <fetcher.Form method="post">
        <input type="hidden" name="intent" value="duplicate" />
        <input type="hidden" name="name" value={`${name.slice(0, 112)} (copy)`} />
        <button className="btn-primary" type="submit" disabled={fetcher.state !== "idle"}>
          {fetcher.state !== "idle" ? "Copying…" : "Copy to my roofs"}
        </button>
      </fetcher.Form>
    </div>
  );
}
