import { describe, expect, it } from "vitest";
import { MAX_ADDRESSES, parseAddressList } from "~/lib/roster";

describe("parseAddressList (pasted invitation lists)", () => {
  it("splits on commas, semicolons, tabs and new lines, and lower-cases", () => {
    const r = parseAddressList(
      "Ana@Example.org, ben@example.org;cleo@example.org\n\tdev@example.org\r\neve@example.org",
    );
    expect(r.valid).toEqual([
      "ana@example.org",
      "ben@example.org",
      "cleo@example.org",
      "dev@example.org",
      "eve@example.org",
    ]);
    expect(r.invalid).toEqual([]);
  });

  it("reads the Name <address> form mail programs copy", () => {
    const r = parseAddressList('"Cleo Daye" <Cleo@Example.org>; Ben Ash <ben@example.org>');
    expect(r.valid).toEqual(["cleo@example.org", "ben@example.org"]);
  });

  it("reports invalid entries as typed and keeps going", () => {
    const r = parseAddressList(
      "ana@example.org, not-an-address, bob@, @example.org, two words@example.org, ok@example.org",
    );
    expect(r.valid).toEqual(["ana@example.org", "ok@example.org"]);
    expect(r.invalid).toEqual(["not-an-address", "bob@", "@example.org", "two words@example.org"]);
  });

  it("takes a repeated address once, whatever its case, and says so", () => {
    const r = parseAddressList("ana@example.org\nANA@example.org\nben@example.org\nana@EXAMPLE.org");
    expect(r.valid).toEqual(["ana@example.org", "ben@example.org"]);
    expect(r.repeated).toEqual(["ana@example.org"]);
  });

  it("ignores blank pieces and stops at the cap", () => {
    expect(parseAddressList(" ,, ;\n\n ").valid).toEqual([]);
    const many = Array.from({ length: MAX_ADDRESSES + 5 }, (_, i) => `p${i}@example.org`).join("\n");
    const r = parseAddressList(many);
    expect(r.valid).toHaveLength(MAX_ADDRESSES);
    expect(r.truncated).toBe(true);
  });
});
