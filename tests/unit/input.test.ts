import { describe, expect, it } from "vitest";
import { isUuid, jsonProblem, MAX_JSON_DEPTH, pgInt, PG_INT_MAX, textProblem } from "~/lib/input";
import { safeRedirect } from "~/lib/auth.server";
import { appUrlProblem } from "~/lib/app-url";
import { requestHash } from "~/lib/idempotency.server";

const nested = (levels: number): unknown => {
  let v: unknown = "leaf";
  for (let i = 0; i < levels; i++) v = { a: v };
  return v;
};

describe("text PostgreSQL can store", () => {
  it("refuses NUL and unpaired surrogates, keeps everything else", () => {
    expect(textProblem("a\u0000b")).toMatch(/NUL/);
    expect(textProblem("x\uD800")).toMatch(/surrogate/);
    expect(textProblem("\uDC00x")).toMatch(/surrogate/);
    expect(textProblem("Höhe 😀 \u0001\t\r\n")).toBeNull(); // a paired surrogate (the emoji) is fine
  });
});

describe("jsonProblem", () => {
  it("names the path of the first bad string or key", () => {
    expect(jsonProblem({ spec: { outlets: [{ name: "ok" }, { name: "x\u0000" }] } })).toEqual({
      path: "spec.outlets.1.name",
      message: expect.stringMatching(/NUL/),
    });
    expect(jsonProblem({ "k\u0000": 1 })?.message).toMatch(/key/);
    expect(jsonProblem("a\u0000", "email")?.path).toBe("email");
  });

  it("allows MAX_JSON_DEPTH levels and refuses one more", () => {
    expect(jsonProblem(nested(MAX_JSON_DEPTH))).toBeNull();
    expect(jsonProblem(nested(MAX_JSON_DEPTH + 1))?.message).toBe(`nests deeper than ${MAX_JSON_DEPTH} levels`);
    expect(jsonProblem(nested(100_000))?.message).toMatch(/deeper/); // no recursion, no stack overflow
  });
});

describe("ids and integers", () => {
  it("isUuid takes only the 8-4-4-4-12 hex form", () => {
    expect(isUuid("00000000-0000-4000-8000-000000000000")).toBe(true);
    expect(isUuid("-".repeat(36))).toBe(false);
    expect(isUuid("00000000-0000-4000-8000-000000000000\n")).toBe(false);
    expect(isUuid(42)).toBe(false);
  });

  it("pgInt stops at PostgreSQL's integer maximum (PostgreSQL manual §8.1.1)", () => {
    expect(pgInt().safeParse(PG_INT_MAX).success).toBe(true);
    expect(pgInt().safeParse(PG_INT_MAX + 1).error?.issues[0].message).toBe("must be at most 2147483647");
    expect(pgInt({ coerce: true }).safeParse("10000000000").success).toBe(false);
    expect(pgInt({ coerce: true }).safeParse("7").data).toBe(7);
  });
});

describe("safeRedirect", () => {
  it("keeps same-origin paths and drops everything a browser would read as another host", () => {
    expect(safeRedirect("/roofs?sort=name#top")).toBe("/roofs?sort=name#top");
    for (const bad of [
      "/\t/evil.example",
      "/\n/evil.example",
      "//evil.example",
      "/\\evil.example",
      "/.//evil.example",
      "https://evil.example",
      "javascript:alert(1)",
      "",
      null,
    ]) {
      expect(safeRedirect(bad), JSON.stringify(bad)).toBe("/");
    }
  });
});

describe("APP_URL", () => {
  it("is required and must be a plain http(s) address", () => {
    expect(appUrlProblem(undefined)).toMatch(/APP_URL is not set/);
    expect(appUrlProblem("fallwright.example.org")).toMatch(/not a URL/);
    expect(appUrlProblem("ftp://fallwright.example.org")).toMatch(/http/);
    expect(appUrlProblem("https://fallwright.example.org")).toBeNull();
  });
});

describe("requestHash", () => {
  it("ignores key order but not values", () => {
    expect(requestHash({ a: 1, b: [1, { c: 2, d: 3 }] })).toBe(requestHash({ b: [1, { d: 3, c: 2 }], a: 1 }));
    expect(requestHash({ a: 1 })).not.toBe(requestHash({ a: 2 }));
  });
});
