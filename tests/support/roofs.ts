/** Helpers for the saved-roofs tests: sign-in cookies, calling route modules, a real PNG made here. */
import { deflateSync, crc32 } from "node:zlib";
import { db } from "~/lib/db.server";
import { createSession } from "~/lib/session.server";

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

/** Runs a loader or action as React Router would; a thrown Response (redirect, 401, 404) is returned. */
export async function call(fn: RouteFn, request: Request, params: Record<string, string> = {}): Promise<Response> {
  try {
    const out = await fn({ request, params, context: {} } as never);
    if (out instanceof Response) return out;
    return Response.json(out);
  } catch (e) {
    if (e instanceof Response) return e;
    const d = e as { type?: string; data?: unknown; init?: { status?: number } };
    if (d?.type === "DataWithResponseInit") return Response.json(d.data, { status: d.init?.status ?? 200 });
    throw e;
  }
}

export function jsonRequest(method: string, path: string, body: unknown, cookie?: string, headers: Record<string, string> = {}): Request {
  return new Request(BASE + path, {
    method,
    headers: { "Content-Type": "application/json", ...(cookie ? { cookie } : {}), ...headers },
    body: body === undefined ? undefined : typeof body === "string" ? body : JSON.stringify(body),
  });
}

export function getRequest(path: string, cookie?: string): Request {
  return new Request(BASE + path, { headers: cookie ? { cookie } : {} });
}

export const SMALL_SPEC = {
  outline: [[0, 0], [10, 0], [10, 6], [0, 6]],
  outlets: [{ at: [5, 0] }],
  baseFall: "1:60",
  joists: { spacing: 0.4 },
};

/** A genuine PNG (8-bit greyscale), drawn by a callback: 0 black … 255 white. */
export function makePng(width: number, height: number, shade: (x: number, y: number) => number = () => 255): Buffer {
  const raw = Buffer.alloc((width + 1) * height);
  for (let y = 0; y < height; y++) {
    raw[y * (width + 1)] = 0; // filter: none
    for (let x = 0; x < width; x++) raw[y * (width + 1) + 1 + x] = shade(x, y);
  }
  const chunk = (type: string, data: Buffer) => {
    const len = Buffer.alloc(4);
    len.writeUInt32BE(data.length);
    const td = Buffer.concat([Buffer.from(type, "ascii"), data]);
    const crc = Buffer.alloc(4);
    crc.writeUInt32BE(crc32(td) >>> 0);
    return Buffer.concat([len, td, crc]);
  };
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 0; // greyscale
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk("IHDR", ihdr),
    chunk("IDAT", deflateSync(raw)),
    chunk("IEND", Buffer.alloc(0)),
  ]);
}
