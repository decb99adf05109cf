import { describe, expect, it } from "vitest";
import { BCRYPT_COST, hashCost, hashPassword, passwordProblem, verifyPassword } from "~/lib/password.server";

// docs/security.md, Passwords (OWASP ASVS 4.0.3 2.1.1, 2.1.7, 2.4.4; 5.0 6.2.x).
describe("password rules", () => {
  it("asks for 8 characters at least", () => {
    expect(passwordProblem("seven77")).toMatch(/at least 8/);
    expect(passwordProblem("eight888x")).toBeNull();
  });

  it("refuses more than 72 UTF-8 bytes, counting bytes, not characters", () => {
    expect(passwordProblem("a".repeat(72))).toBeNull();
    expect(passwordProblem("a".repeat(73))).toMatch(/72 bytes/);
    expect(passwordProblem("é".repeat(36))).toBeNull(); // 72 bytes
    expect(passwordProblem("é".repeat(37))).toMatch(/72 bytes/); // 37 characters, 74 bytes
    expect(passwordProblem("🏠".repeat(19))).toMatch(/72 bytes/); // 19 characters, 76 bytes
  });

  it("refuses the most common passwords whatever the case, and the e-mail address itself", () => {
    expect(passwordProblem("Password123")).toMatch(/most common/);
    expect(passwordProblem("QWERTYUIOP")).toMatch(/most common/);
    expect(passwordProblem("ada@tidemark.example", { email: "Ada@Tidemark.example" })).toMatch(/e-mail/);
  });

  it("hashes with bcrypt at cost 12 and checks it", async () => {
    expect(BCRYPT_COST).toBeGreaterThanOrEqual(10);
    const hash = await hashPassword("curlew ledger 19");
    expect(hash).toMatch(/^\$2[ab]\$12\$/);
    expect(hashCost(hash)).toBe(12);
    expect(await verifyPassword("curlew ledger 19", hash)).toBe(true);
    expect(await verifyPassword("curlew ledger 18", hash)).toBe(false);
    expect(await verifyPassword("anything", null)).toBe(false);
  });
});
