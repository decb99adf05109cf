import { z } from "zod";

const Email = z.email();
export const MAX_ADDRESSES = 200;

export interface ParsedAddresses {
  /** Lower-cased, in the order first seen, each once. */
  valid: string[];
  /** What the user typed, as typed. */
  invalid: string[];
  /** Addresses pasted more than once (lower-cased, each once). */
  repeated: string[];
  /** More than MAX_ADDRESSES valid addresses: the rest were not taken. */
  truncated: boolean;
}

/**
 * Reads a pasted list of e-mail addresses: separated by commas, semicolons, tabs or new lines,
 * optionally in "Name <address>" form as mail programs copy them.
 */
export function parseAddressList(text: string): ParsedAddresses {
  const valid: string[] = [];
  const invalid: string[] = [];
  const repeated = new Set<string>();
  const seen = new Set<string>();
  let truncated = false;
  for (const raw of text.split(/[,;\t\r\n]+/)) {
    const piece = raw.trim();
    if (!piece) continue;
    const bracketed = /<([^<>]*)>\s*$/.exec(piece);
    const address = (bracketed ? bracketed[1] : piece)
      .trim()
      .replace(/^["']|["']$/g, "")
      .toLowerCase();
    if (!Email.safeParse(address).success) {
      invalid.push(piece);
      continue;
    }
    if (seen.has(address)) {
      repeated.add(address);
      continue;
    }
    seen.add(address);
    if (valid.length >= MAX_ADDRESSES) {
      truncated = true;
      continue;
    }
    valid.push(address);
  }
  return { valid, invalid, repeated: [...repeated], truncated };
}

/** What happened to each address of a pasted invitation list. */
export interface InviteReport {
  /** New invitation e-mails sent. */
  invited: string[];
  /** Existing trainee accounts asked by e-mail to join; they join when they accept. */
  askedToJoin: string[];
  alreadyMember: string[];
  alreadyInvited: string[];
  /** As typed. */
  invalid: string[];
  repeated: string[];
  refused: { email: string; message: string }[];
  /** Invited, but the e-mail could not be sent: resend later. */
  mailFailed: string[];
  truncated: boolean;
}
