/**
 * Certificate verification codes (docs/security.md, "Certificates"): 12 characters of Crockford's
 * base32 (digits and capitals without I, L, O, U), 60 random bits from the operating system's
 * generator, shown in groups of four. Reading forgives what people do when typing one: lower
 * case, spaces and hyphens, and O for 0, I or L for 1.
 */
import { randomBytes } from "node:crypto";

const ALPHABET = "0123456789ABCDEFGHJKMNPQRSTVWXYZ";
export const CODE_LENGTH = 12;

export function newVerificationCode(): string {
  const bytes = randomBytes(CODE_LENGTH);
  // 256 is a multiple of 32, so taking each byte modulo 32 keeps every character equally likely.
  return [...bytes].map((b) => ALPHABET[b % 32]).join("");
}

/** The code as stored, or null when what was typed cannot be one. */
export function normaliseCode(typed: string): string | null {
  const s = typed.toUpperCase().replace(/[\s-]/g, "").replace(/O/g, "0").replace(/[IL]/g, "1");
  if (s.length !== CODE_LENGTH) return null;
  return [...s].every((ch) => ALPHABET.includes(ch)) ? s : null;
}
