import { useId, useRef, useState } from "react";
import { Link, useFetcher, useRouteLoaderData } from "react-router";
import { useSandboxStore } from "~/components/sandbox/state/store";
import type { SessionUser } from "~/lib/session.server";
import { newRequestKey } from "~/lib/request-key";

interface SaveError {
  error?: { message: string; issues?: { path: string; message: string }[] };
  name?: string;
}

/** Sandbox toolbar: save the roof on screen to my library (POST /roofs/new), or sign in to do so. */
export function SaveToLibrary() {
  // The shell route (routes/_shell.tsx) loads `{ user }` for every page under it.
  const shell = useRouteLoaderData("routes/_shell") as { user: SessionUser | null } | undefined;
  const store = useSandboxStore();
  const fetcher = useFetcher<SaveError>();
  const [open, setOpen] = useState(false);
  const keyRef = useRef<string>("");
  const inputId = useId();
  if (!shell?.user) {
    return (
      <Link className="btn px-2" to="/login?redirectTo=/sandbox">
        Sign in to save
      </Link>
    );
  }
  if (!open) {
    return (
      <button type="button" className="btn px-2" onClick={() => setOpen(true)}>
        Save to my roofs
      </button>
    );
  }
  const busy = fetcher.state !== "idle";
  const error = fetcher.data?.error;
  return (
    <fetcher.Form
      method="post"
      action="/roofs/new"
      className="flex flex-wrap items-center gap-2"
      onSubmit={(event) => {
        const form = event.currentTarget;
        keyRef.current ||= newRequestKey();
        (form.elements.namedItem("spec") as HTMLInputElement).value = JSON.stringify(store.getState().spec);
        (form.elements.namedItem("idempotencyKey") as HTMLInputElement).value = keyRef.current;
      }}
    >
      <label htmlFor={inputId} className="sr-only">
        Roof name
      </label>
      <input
        id={inputId}
        name="name"
        className="field w-44"
        placeholder="Roof name"
        defaultValue={fetcher.data?.name ?? ""}
        autoFocus
        maxLength={120}
        aria-invalid={error ? true : undefined}
      />
      <input type="hidden" name="spec" />
      <input type="hidden" name="idempotencyKey" />
      <button type="submit" className="btn-primary px-2" disabled={busy}>
        {busy ? "Saving…" : "Save"}
      </button>
      <button type="button" className="btn px-2" onClick={() => setOpen(false)} disabled={busy}>
        Cancel
      </button>
      {error ? (
        <span role="alert" className="field-error basis-full">
          {error.message}
          {error.issues?.length ? ` (${error.issues.map((i) => `${i.path}: ${i.message}`).join("; ")})` : ""}
        </span>
      ) : null}
    </fetcher.Form>
  );
}
