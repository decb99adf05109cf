/**
 * Shared habits of the JSON API (docs/security.md and docs/api.md, Conventions): one error shape
 * `{error: {message, issues: [{path, message}]}}`, writes only as application/json (415),
 * bodies capped before they are parsed (413), 401 rather than a redirect when signed out.
 */
import { requireApiUser, type SessionUser } from "~/lib/auth.server";
import { parseJsonBytes, readStreamCapped, rememberedBody } from "~/lib/body";
import { can, type Permission } from "~/lib/permissions";

export interface ApiIssue {
  path: string;
  message: string;
}

export function jsonError(status: number, message: string, issues: ApiIssue[] = [], headers?: HeadersInit): Response {
  return Response.json({ error: { message, issues } }, { status, headers });
}

/** Past the cap, a little more is read and dropped so the client can read our 413; past that, cut off. */
const DRAIN_LIMIT = 16 * 1024 * 1024;

/** Reads at most `limit` bytes of the body; null when there were more (or Content-Length says so). */
export async function readBodyCapped(request: Request, limit: number): Promise<Uint8Array | null> {
  const declared = Number(request.headers.get("content-length") ?? "0");
  if (declared > limit) return null;
  const read = rememberedBody(request);
  if (read) return read.bytes.byteLength > limit ? null : read.bytes;
  if (!request.body) return new Uint8Array(0);
  return readStreamCapped(request.body, limit, DRAIN_LIMIT);
}

/** The parsed body and its size in bytes, or the response that refuses it. */
export type JsonBody = { ok: true; value: unknown; bytes: number } | { ok: false; response: Response };

export async function readJsonBody(request: Request, limit: number): Promise<JsonBody> {
  const type = (request.headers.get("content-type") ?? "").split(";")[0].trim().toLowerCase();
  if (type !== "application/json") {
    return { ok: false, response: jsonError(415, "Send the body as JSON with Content-Type: application/json.") };
  }
  const bytes = await readBodyCapped(request, limit);
  if (!bytes) return { ok: false, response: jsonError(413, `The body is over ${Math.round(limit / 1024)} kB.`) };
  // The input guard has usually parsed it already (rememberBody).
  const json = rememberedBody(request)?.json ?? parseJsonBytes(bytes);
  if (json.ok) return { ok: true, value: json.value, bytes: bytes.byteLength };
  return {
    ok: false,
    response: jsonError(400, "The body is not valid JSON.", [
      { path: "(body)", message: "could not be parsed as JSON" },
    ]),
  };
}

/** The signed-in user (401 JSON thrown when signed out) who holds `permission` (403 otherwise). */
export async function requireApiPermission(request: Request, permission: Permission): Promise<SessionUser> {
  const user = await requireApiUser(request);
  if (!can(user.role, permission)) throw jsonError(403, "Your account may not do this.");
  return user;
}

/** zod issues in the API's shape. */
export function zodIssues(issues: readonly { path: readonly PropertyKey[]; message: string }[]): ApiIssue[] {
  return issues.map((i) => ({ path: i.path.length ? i.path.map(String).join(".") : "(body)", message: i.message }));
}

export type CappedForm = { ok: true; form: FormData } | { ok: false; status: 400 | 413 | 415 };

/** request.formData(), but never reading more than `limit` bytes of body first. */
export async function readFormCapped(request: Request, limit: number): Promise<CappedForm> {
  const type = request.headers.get("content-type") ?? "";
  if (!/^(multipart\/form-data|application\/x-www-form-urlencoded)/i.test(type)) return { ok: false, status: 415 };
  const raw = await readBodyCapped(request, limit);
  if (!raw) return { ok: false, status: 413 };
  try {
    const form = await new Request(request.url, {
      method: "POST",
      headers: { "Content-Type": type },
      body: raw as Uint8Array<ArrayBuffer>,
    }).formData();
    return { ok: true, form };
  } catch {
    return { ok: false, status: 400 };
  }
}
