/**
 * A random idempotency key made in the browser. getRandomValues works on plain-http hosts too
 * (a classroom server on the local network), where crypto.randomUUID does not exist.
 */
export function newRequestKey(): string {
  return Array.from(crypto.getRandomValues(new Uint8Array(16)), (b) => b.toString(16).padStart(2, "0")).join("");
}
