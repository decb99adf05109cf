import { describe, expect, it } from "vitest";
import { CODE_LENGTH, newVerificationCode, normaliseCode } from "~/lib/certificates/code.server";
import { certificateLines, formatCode } from "~/lib/certificates/certificate-text";

// docs/security.md, "Certificates": 12 characters of Crockford base32, random, easy to type.
describe("certificate verification codes", () => {
  it("are 12 characters of Crockford base32 (no I, L, O, U)", () => {
    for (let i = 0; i < 200; i++) expect(newVerificationCode()).toMatch(/^[0-9A-HJKMNP-TV-Z]{12}$/);
    expect(CODE_LENGTH).toBe(12);
  });

  it("do not repeat across many draws (60 random bits)", () => {
    const seen = new Set(Array.from({ length: 5000 }, () => newVerificationCode()));
    expect(seen.size).toBe(5000);
  });

  it("read back as typed by people: lower case, hyphens, spaces, O for 0, I and L for 1", () => {
    const code = "7K2M9QX4B0T1";
    expect(normaliseCode(code)).toBe(code);
    expect(normaliseCode("7k2m-9qx4-bot1")).toBe(code);
    expect(normaliseCode(" 7K2M 9QX4 B0TL ")).toBe(code);
    expect(normaliseCode(formatCode(code))).toBe(code);
  });

  it("refuse what cannot be a code", () => {
    expect(normaliseCode("")).toBeNull();
    expect(normaliseCode("7K2M9QX4B0T")).toBeNull();
    expect(normaliseCode("7K2M9QX4B0T12")).toBeNull();
    expect(normaliseCode("7K2M9QX4B0TU")).toBeNull();
    expect(normaliseCode("<script>1234")).toBeNull();
  });

  it("the certificate's lines carry the formatted code and the verification address", () => {
    const l = certificateLines(
      {
        traineeName: "Maren Ostby",
        courseName: "Falls to outlets",
        organisationName: "Tidemark Training",
        issuedOn: "2027-03-09",
        code: "7K2M9QX4B0T1",
        revokedOn: null,
      },
      "https://fallwright.example",
    );
    expect(l.code).toBe("Verification code: 7K2M-9QX4-B0T1");
    expect(l.verify).toBe("Check it at https://fallwright.example/verify/7K2M-9QX4-B0T1");
    expect(l.revoked).toBeNull();
  });
});
