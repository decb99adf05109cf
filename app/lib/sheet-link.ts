import type { RoofSpec } from "~/engine";

/** Where the check sheet finds a spec handed over by the sandbox when it is too long for a link. */
export const SHEET_SESSION_KEY = "fallwright:sheet-spec";
/** Longest spec (as base64url) the sandbox puts in the sheet's link; longer ones go through sessionStorage. */
export const SHEET_LINK_LIMIT = 6000;

export function encodeSpec(spec: RoofSpec): string {
  const bytes = new TextEncoder().encode(JSON.stringify(spec));
  let binary = "";
  for (const b of bytes) binary += String.fromCharCode(b);
  return btoa(binary).replace(/\+/g, "-").replace(/\//g, "_").replace(/=+$/, "");
}

/** The JSON a `spec` query parameter carries, or null when it is not base64url JSON. */
export function decodeSpec(text: string): unknown {
  try {
    if (!/^[A-Za-z0-9_-]*$/.test(text)) return null;
    const binary = atob(text.replace(/-/g, "+").replace(/_/g, "/"));
    const bytes = Uint8Array.from(binary, (c) => c.charCodeAt(0));
    return JSON.parse(new TextDecoder().decode(bytes));
  } catch {
    return null;
  }
}

/** The sheet's address for a spec: the spec in the link when it is short, else a note to read sessionStorage. */
export function sheetHref(spec: RoofSpec): { href: string; viaSession: boolean } {
  const encoded = encodeSpec(spec);
  if (encoded.length <= SHEET_LINK_LIMIT) return { href: `/sandbox/sheet?spec=${encoded}`, viaSession: false };
  return { href: "/sandbox/sheet?from=session", viaSession: true };
}
