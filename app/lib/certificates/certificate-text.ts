/**
 * The words of a certificate, shared by its page and its PDF so the two always agree
 * (docs/product.md capability 10). Dates in the app's one date style, in its default locale,
 * so the server's PDF and the page read the same.
 */
import { formatDay } from "~/lib/when";

export interface CertificateFacts {
  traineeName: string;
  courseName: string;
  organisationName: string;
  issuedOn: string;
  code: string;
  revokedOn: string | null;
}

/** XXXX-XXXX-XXXX, for people (the stored code is 12 characters without hyphens). */
export function formatCode(code: string): string {
  return code.match(/.{1,4}/g)?.join("-") ?? code;
}

export function certificateLines(c: CertificateFacts, origin: string) {
  return {
    title: "Certificate of completion",
    intro: "This certifies that",
    name: c.traineeName,
    passed: "has passed every lesson of the course",
    course: c.courseName,
    organisation: `Organisation: ${c.organisationName}`,
    date: `Date: ${formatDay(c.issuedOn)}`,
    code: `Verification code: ${formatCode(c.code)}`,
    verify: `Check it at ${origin}/verify/${formatCode(c.code)}`,
    revoked: c.revokedOn ? `Revoked on ${formatDay(c.revokedOn)}: this certificate is no longer valid.` : null,
  };
}
