import { runInPool } from "~/lib/pool.server";

/** bcrypt work factor for new hashes (docs/security.md, Passwords: at least 10; ASVS 4.0.3 2.4.4). */
export const BCRYPT_COST = 12;
export const PASSWORD_MIN_LENGTH = 8;
/** bcrypt reads only the first 72 bytes: longer passwords would be silently truncated. */
export const PASSWORD_MAX_BYTES = 72;

// The most common choices from public breach lists, plus this product's own obvious words.
const COMMON = new Set([
  "password",
  "password1",
  "password12",
  "password123",
  "passw0rd",
  "p@ssw0rd",
  "p@ssword",
  "12345678",
  "123456789",
  "1234567890",
  "123123123",
  "11111111",
  "00000000",
  "12341234",
  "87654321",
  "qwertyui",
  "qwerty123",
  "qwertyuiop",
  "1q2w3e4r",
  "1qaz2wsx",
  "zaq12wsx",
  "asdfghjk",
  "asdf1234",
  "abcd1234",
  "abc12345",
  "iloveyou",
  "sunshine",
  "princess",
  "football",
  "baseball",
  "superman",
  "trustno1",
  "welcome1",
  "welcome123",
  "letmein1",
  "starwars",
  "whatever",
  "monkey123",
  "dragon123",
  "changeme",
  "default1",
  "admin123",
  "administrator",
  "qwerty12",
  "computer",
  "internet",
  "michelle",
  "jennifer",
  "11223344",
  "fallwright",
  "fallwright1",
  "fallwright123",
  "membrane",
  "tidemark",
  "roofing1",
]);

/** A reason the password cannot be used, or null when it is acceptable. */
export function passwordProblem(password: string, context: { email?: string } = {}): string | null {
  if (password.length < PASSWORD_MIN_LENGTH) return `Use at least ${PASSWORD_MIN_LENGTH} characters.`;
  if (Buffer.byteLength(password, "utf8") > PASSWORD_MAX_BYTES) {
    return `Use at most ${PASSWORD_MAX_BYTES} bytes: about 72 plain letters, fewer with accents or emoji.`;
  }
  const lower = password.toLowerCase();
  if (COMMON.has(lower)) return "That password is on the list of the most common ones. Choose another.";
  if (context.email && lower === context.email.toLowerCase()) return "Do not use your e-mail address as your password.";
  return null;
}

// bcrypt at cost 12 is about 300 ms of CPU by design: it runs in the password worker pool
// (app/lib/pool.server.ts) so a sign-in never stalls the other requests.
async function bcryptHash(password: string, cost: number): Promise<string> {
  const r = await runInPool("password", { kind: "hash", password, cost });
  if (r.kind !== "text") throw new Error("password worker gave no hash");
  return r.text;
}

async function bcryptCompare(password: string, hash: string): Promise<boolean> {
  const r = await runInPool("password", { kind: "compare", password, hash });
  if (r.kind !== "boolean") throw new Error("password worker gave no answer");
  return r.value;
}

export function hashPassword(password: string): Promise<string> {
  return bcryptHash(password, BCRYPT_COST);
}

/** The cost recorded in a bcrypt hash ("$2b$12$..." → 12), or 0 when it is not a bcrypt hash. */
export function hashCost(hash: string): number {
  const m = /^\$2[aby]\$(\d{2})\$/.exec(hash);
  return m ? Number(m[1]) : 0;
}

let dummyHash: Promise<string> | undefined;

/**
 * Compares a password with a stored hash. With no hash (unknown e-mail, invitation pending) it
 * still runs a compare against a dummy hash of the same cost, so both answers take as long.
 */
export async function verifyPassword(password: string, hash: string | null | undefined): Promise<boolean> {
  const tooLong = Buffer.byteLength(password, "utf8") > PASSWORD_MAX_BYTES;
  if (!hash || tooLong) {
    dummyHash ??= bcryptHash("not-a-real-password-for-timing", BCRYPT_COST);
    await bcryptCompare(password, await dummyHash);
    return false;
  }
  return bcryptCompare(password, hash);
}

export function needsRehash(hash: string): boolean {
  return hashCost(hash) < BCRYPT_COST;
}
