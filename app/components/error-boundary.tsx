import { useEffect } from "react";
import { isRouteErrorResponse, Link, useRouteError, useRouteLoaderData } from "react-router";
import { ArrowLeft } from "lucide-react";

let hydrated = false;

/**
 * Called by the root: after hydration an error comes from a later request, whose id this page does not know.
 * Also marks the document (`<html data-hydrated>`) once the page answers input: the root's effect
 * runs after every route's, so the bench (tests/bench/browser-section.ts) times the page from it.
 */
export function useMarkHydrated() {
  useEffect(() => {
    hydrated = true;
    document.documentElement.dataset.hydrated = "";
  }, []);
}

/** What a user can quote: the failing page load's request id, or for a later request the time. */
function useErrorReference(): string {
  const root = useRouteLoaderData("root") as { requestId?: string | null } | undefined;
  if (!hydrated && root?.requestId) return `reference ${root.requestId}`;
  return `time ${new Date().toISOString().slice(0, 19).replace("T", " ")} UTC`;
}

const MESSAGES: Record<number, { title: string; body: string }> = {
  400: {
    title: "That request did not make sense",
    body: "Something in the request was malformed. Go back and try again.",
  },
  403: {
    title: "Not yours to open",
    body: "Your account does not have access to this page. Ask a trainer or an admin if you think it should.",
  },
  404: { title: "Nothing here", body: "We could not find that page. It may have been moved or deleted." },
  429: { title: "Slow down a little", body: "Too many attempts in a short time. Wait a minute and try again." },
  503: {
    title: "Back in a moment",
    body: "The roof library is not answering right now. Your work in the page is kept; try again in a few seconds.",
  },
};

/** One friendly error page for every route: known statuses get their own words; no stack traces in production. */
export function GeneralErrorBoundary() {
  const error = useRouteError();
  let status = 500;
  let detail: string | undefined;
  let stack: string | undefined;
  if (isRouteErrorResponse(error)) {
    status = error.status;
    // A route's own words add to the page's; the router's ("No route matches URL …") and a
    // repeat of the page's own text do not.
    if (typeof error.data === "string" && error.data && status < 500 && !/^Error: No route matches/.test(error.data))
      detail = error.data;
  } else if (import.meta.env.DEV && error instanceof Error) {
    stack = error.stack;
  }
  const reference = useErrorReference();
  const msg = MESSAGES[status] ?? {
    title: "Something went wrong on our side",
    body: "The error has been logged. Try again, and tell your trainer or admin if it keeps happening.",
  };
  if (detail && (detail.trim() === msg.body || detail.trim() === msg.title)) detail = undefined;
  return (
    <section className="card mx-auto max-w-2xl" role="alert" data-testid="error-page">
      <title>{`${msg.title} · Fallwright`}</title>
      <p className="text-xs font-medium uppercase tracking-widest text-accent">Error {status}</p>
      <h1 className="mt-1 text-2xl font-bold tracking-tight">{msg.title}</h1>
      <p className="mt-2">{msg.body}</p>
      {status >= 500 ? (
        <p className="mt-2 text-sm text-ink-soft">
          If you report this, quote the <span data-testid="error-reference">{reference}</span>.
        </p>
      ) : null}
      {detail ? <p className="mt-2 text-ink-soft">{detail}</p> : null}
      {stack ? <pre className="mt-4 overflow-auto whitespace-pre-wrap text-xs text-ink-soft">{stack}</pre> : null}
      <nav aria-label="Ways back" className="mt-5 flex flex-wrap gap-2">
        <button type="button" className="btn min-h-11 sm:min-h-0" onClick={() => window.history.back()}>
          <ArrowLeft size={16} aria-hidden="true" /> Go back
        </button>
        <Link className="btn-primary min-h-11 sm:min-h-0" to="/">
          Home
        </Link>
        <Link className="btn min-h-11 sm:min-h-0" to="/sandbox">
          Sandbox
        </Link>
        <Link className="btn min-h-11 sm:min-h-0" to="/lessons">
          Lessons
        </Link>
        {status === 403 ? (
          <Link className="btn min-h-11 sm:min-h-0" to="/account">
            Your account
          </Link>
        ) : null}
      </nav>
    </section>
  );
}

/** A route's ErrorBoundary for pages that draw their own frame (the shell, the present view). */
export function PageErrorBoundary() {
  return (
    <div className="mx-auto max-w-2xl p-8">
      <GeneralErrorBoundary />
    </div>
  );
}
