/**
 * Reading request bodies within a byte cap (docs/security.md, "Limits"), shared by the host's input
 * guard and the JSON API. No imports: the host loads this file directly.
 */

/**
 * The stream's bytes, or null once they pass `limit`. Past the limit the stream is read on and
 * dropped until `drainTo` bytes in all (so a client still sending can read the 413), then cancelled.
 */
export async function readStreamCapped(
  body: ReadableStream<Uint8Array>,
  limit: number,
  drainTo = 0,
): Promise<Uint8Array | null> {
  const reader = body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > limit) {
      while (total < drainTo) {
        const next = await reader.read().catch(() => ({ done: true as const, value: undefined }));
        if (next.done) return null;
        total += next.value.byteLength;
      }
      await reader.cancel().catch(() => {});
      return null;
    }
    chunks.push(value);
  }
  const out = new Uint8Array(total);
  let at = 0;
  for (const c of chunks) {
    out.set(c, at);
    at += c.byteLength;
  }
  return out;
}

/**
 * A body the input guard has already read and parsed, left on the Request it hands the route
 * (app/server/input-guard.ts), so the route's reader (readJsonBody, readBodyCapped) takes it from
 * there instead of reading and parsing the same bytes a second time. The key is a registered
 * symbol because the host and the server build each load their own copy of this file.
 */
const READ_BODY = Symbol.for("fallwright.read-body");

export interface ReadBody {
  bytes: Uint8Array;
  /** The bytes parsed as JSON the strict way (parseJsonBytes), when they were sent as JSON. */
  json?: { ok: true; value: unknown } | { ok: false };
}

export function rememberBody(request: Request, read: ReadBody): void {
  Object.defineProperty(request, READ_BODY, { value: read });
}

export function rememberedBody(request: Request): ReadBody | undefined {
  return (request as unknown as Record<symbol, ReadBody | undefined>)[READ_BODY];
}

// Decoding without the stream option keeps no state between calls, so one decoder of each kind serves all.
const STRICT = new TextDecoder("utf-8", { fatal: true });
const LENIENT = new TextDecoder("utf-8");

/**
 * The bytes as JSON, or `{ok: false}` when they are not. `strict` refuses bytes that are not UTF-8
 * (the API); lenient decoding reads them with U+FFFD so the input guard still checks what a lenient
 * reader would see.
 */
export function parseJsonBytes(
  bytes: Uint8Array,
  decoding: "strict" | "lenient" = "strict",
): { ok: true; value: unknown } | { ok: false } {
  try {
    return { ok: true, value: JSON.parse((decoding === "strict" ? STRICT : LENIENT).decode(bytes)) };
  } catch {
    return { ok: false };
  }
}
