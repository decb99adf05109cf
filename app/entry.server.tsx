import { PassThrough } from "node:stream";
import type { AppLoadContext, EntryContext, HandleErrorFunction } from "react-router";
import { createReadableStreamFromReadable } from "@react-router/node";
import { isRouteErrorResponse, ServerRouter } from "react-router";
import { isbot } from "isbot";
import { renderToPipeableStream, type RenderToPipeableStreamOptions } from "react-dom/server";
import { isDbUnavailable } from "~/lib/db.server";
import { log } from "~/lib/log.server";
import { currentRequest } from "~/lib/request-context.server";

export const streamTimeout = 5_000;

declare module "react-router" {
  interface AppLoadContext {
    cspNonce?: string;
    /** Set by handleError when a loader found the database down (production hides the error itself). */
    dbUnavailable?: boolean;
    /** The client's address as the Express host sees it (rate limits, audit log). */
    clientIp?: string;
    /** The id of this request in the logs (`X-Request-Id`), shown on error pages. */
    requestId?: string;
  }
}

/** A page whose data could not be read because PostgreSQL is down answers 503, not 500. */
function statusFor(code: number, context: EntryContext): number {
  const errors = context.staticHandlerContext.errors;
  if (!errors) return code;
  for (const e of Object.values(errors)) {
    if (isDbUnavailable(e) || (isRouteErrorResponse(e) && e.status === 503)) return 503;
  }
  return code;
}

export default function handleRequest(
  request: Request,
  responseStatusCode: number,
  responseHeaders: Headers,
  routerContext: EntryContext,
  loadContext: AppLoadContext,
) {
  responseStatusCode = loadContext?.dbUnavailable ? 503 : statusFor(responseStatusCode, routerContext);
  if (responseStatusCode === 503) responseHeaders.set("Retry-After", "5");
  if (request.method.toUpperCase() === "HEAD") {
    return new Response(null, { status: responseStatusCode, headers: responseHeaders });
  }
  const nonce = loadContext?.cspNonce;
  return new Promise((resolve, reject) => {
    let shellRendered = false;
    const userAgent = request.headers.get("user-agent");
    const readyOption: keyof RenderToPipeableStreamOptions =
      (userAgent && isbot(userAgent)) || routerContext.isSpaMode ? "onAllReady" : "onShellReady";
    let timeoutId: ReturnType<typeof setTimeout> | undefined = setTimeout(() => abort(), streamTimeout + 1000);

    const { pipe, abort } = renderToPipeableStream(
      <ServerRouter context={routerContext} url={request.url} nonce={nonce} />,
      {
        nonce,
        [readyOption]() {
          shellRendered = true;
          const body = new PassThrough({
            final(callback) {
              clearTimeout(timeoutId);
              timeoutId = undefined;
              callback();
            },
          });
          const stream = createReadableStreamFromReadable(body);
          responseHeaders.set("Content-Type", "text/html; charset=utf-8");
          pipe(body);
          resolve(new Response(stream, { headers: responseHeaders, status: responseStatusCode }));
        },
        onShellError(error: unknown) {
          reject(error);
        },
        onError(error: unknown) {
          responseStatusCode = 500;
          if (shellRendered) log().error({ reqId: currentRequest()?.id, err: error }, "render failed");
        },
      },
    );
  });
}

export const handleError: HandleErrorFunction = (error, { request, context }) => {
  if (request.signal.aborted) return;
  // The load context carries the id even where a driver's callback lost the async context.
  const reqId = (context as AppLoadContext | undefined)?.requestId ?? currentRequest()?.id;
  if (isDbUnavailable(error)) {
    if (context && typeof context === "object") (context as { dbUnavailable?: boolean }).dbUnavailable = true;
    log().warn({ reqId }, "database unavailable");
    return;
  }
  // Logged once, here, with its stack and the request's id (the error page shows the same id).
  log().error({ reqId, err: error }, "request failed");
};
