/**
 * What the host knows about the request being served, reachable from any loader or action
 * without passing it down: its id (shown on error pages, in logs and in `X-Request-Id`) and,
 * once a session is found, the user's id for the request's log line. The store lives on
 * globalThis so the host and the built app share one instance.
 */
import { AsyncLocalStorage } from "node:async_hooks";

export interface RequestInfo {
  id: string;
  userId?: string;
}

declare global {
  var __fallwrightRequests: AsyncLocalStorage<RequestInfo> | undefined;
}

export function requestStore(): AsyncLocalStorage<RequestInfo> {
  globalThis.__fallwrightRequests ??= new AsyncLocalStorage<RequestInfo>();
  return globalThis.__fallwrightRequests;
}

/** The request being served, or undefined outside one (tests, start-up). */
export function currentRequest(): RequestInfo | undefined {
  return requestStore().getStore();
}

/** Notes who is signed in for the request's log line. */
export function noteUser(userId: string | null | undefined) {
  const info = currentRequest();
  if (info && userId) info.userId = userId;
}
