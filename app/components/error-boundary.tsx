import { isRouteErrorResponse, Link, useRouteError } from "react-router";

const MESSAGES: Record<number, { title: string; body: string }> = {
  400: { title: "That request did not make sense", body: "Something in the request was malformed. Go back and try again." },
  403: { title: "Not yours to open", body: "Your account does not have access to this page. Ask a trainer or an admin if you think it should." },
  404: { title: "Nothing here", body: "We could not find that page. It may have been moved or deleted." },
  429: { title: "Slow down a little", body: "Too many attempts in a short time. Wait a minute and try again." },
  503: { title: "Back in a moment", body: "The roof library is not answering right now. Your work in the page is kept; try again in a few seconds." },
};

/** One friendly error page for every route: known statuses get their own words; no stack traces in production. */
export function GeneralErrorBoundary() {
  const error = useRouteError();
  let status = 500;
  let detail: string | undefined;
  if (isRouteErrorResponse(error)) {
    status = error.status;
    if (typeof error.data === "string" && error.data && status < 500) detail = error.data;
  } else if (import.meta.env.DEV && error instanceof Error) {
    detail = error.stack;
  }
  const msg = MESSAGES[status] ?? { title: "Something went wrong on our side", body: "The error has been logged. Try again, and tell your trainer or admin if it keeps happening." };
  return (
    <section className="card" role="alert">
      <p className="text-sm font-medium text-ink-soft">Error {status}</p>
      <h1 className="mt-1 text-2xl font-bold">{msg.title}</h1>
      <p className="mt-2">{msg.body}</p>
      {detail ? <pre className="mt-4 overflow-auto whitespace-pre-wrap text-xs text-ink-soft">{detail}</pre> : null}
      <p className="mt-4"><Link className="underline" to="/">Go to Home</Link></p>
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
