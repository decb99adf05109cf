/**
 * An idempotency key promises "this is the same request again". The request's meaning is kept
 * as a SHA-256 of its canonical JSON (keys sorted), so a repeat with a different body is told
 * apart from a genuine retry and refused (422, naming the key), as payment APIs do.
 */
import { createHash } from "node:crypto";

function canonical(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(canonical);
  if (value && typeof value === "object") {
    return Object.fromEntries(
      Object.keys(value)
        .sort()
        .filter((k) => (value as Record<string, unknown>)[k] !== undefined)
        .map((k) => [k, canonical((value as Record<string, unknown>)[k])]),
    );
  }
  return value;
}

export function requestHash(meaning: unknown): string {
  return createHash("sha256")
    .update(JSON.stringify(canonical(meaning)) ?? "null")
    .digest("hex");
}

/** True when a stored request (null: made before hashes were kept) is the same as this one. */
export const sameRequest = (stored: string | null | undefined, hash: string) => !stored || stored === hash;

export const keyReusedMessage = (key: string) =>
  `The idempotency key "${key}" was already used for a different request. Send a new key for a new request; repeat the same body to get the first answer again.`;
