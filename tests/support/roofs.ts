/** Helpers for the saved-roofs tests: sign-in cookies, calling route modules. */
export { makePng } from "./png";
import type { RoofSpec } from "~/engine";
import { db } from "~/lib/db.server";
import { createSession } from "~/lib/session.server";
import { checkApiResponse } from "./openapi";

export const BASE = "http://localhost";

export async function userId(email: string): Promise<string> {
  const u = await db()("users").whereRaw("lower(email) = ?", [email.toLowerCase()]).first("id");
  if (!u) throw new Error(`no user ${email}`);
  return u.id;
}

/** A session cookie for a demo user, made the way sign-in makes it. */
export async function cookieFor(email: string): Promise<string> {
  const setCookie = await createSession(new Request(`${BASE}/login`), await userId(email));
  return setCookie.split(";")[0];
}

type RouteFn = (args: never) => unknown;

/**
 * Runs a loader or action as React Router would; a thrown Response (redirect, 401, 404) is
 * returned. Every /api/v1 answer is checked against the OpenAPI document on the way.
 */
export async function call(fn: RouteFn, request: Request, params: Record<string, string> = {}): Promise<Response> {
  const res = await run(fn, request, params);
  await checkApiResponse(request.method, request.url, res);
  return res;
}

async function run(fn: RouteFn, request: Request, params: Record<string, string>): Promise<Response> {
  let out: unknown;
  try {
    out = await fn({ request, params, context: {} } as never);
  } catch (e) {
    if (!(e instanceof Response) && (e as { type?: string })?.type !== "DataWithResponseInit") throw e;
    out = e;
  }
  if (out instanceof Response) return out;
  const d = out as { type?: string; data?: unknown; init?: ResponseInit | null };
  if (d?.type === "DataWithResponseInit")
    return Response.json(d.data, { status: d.init?.status ?? 200, headers: d.init?.headers });
  return Response.json(out);
}

export function jsonRequest(
  method: string,
  path: string,
  body: unknown,
  cookie?: string,
  headers: Record<string, string> = {},
): Request {
  return new Request(BASE + path, {
    method,
    headers: { "Content-Type": "application/json", ...(cookie ? { cookie } : {}), ...headers },
    body: body === undefined ? undefined : typeof body === "string" ? body : JSON.stringify(body),
  });
}

export function getRequest(path: string, cookie?: string): Request {
  return new Request(BASE + path, { headers: cookie ? { cookie } : {} });
}

export const SMALL_SPEC: RoofSpec = {
  outline: [
    [0, 0],
    [10, 0],
    [10, 6],
    [0, 6],
  ],
  outlets: [{ at: [5, 0] }],
  baseFall: "1:60",
  joists: { spacing: 0.4 },
};
