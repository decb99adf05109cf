import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createDatabaseFromTemplate, dropDatabase } from "../support/db";
import { startServer, type RunningServer } from "../support/server";
import { allRoutePaths } from "../support/routes";

// docs/security.md, Headers on every response (OWASP ASVS 4.0.3 14.4.x).
let server: RunningServer;
let dbUrl: string;

beforeAll(async () => {
  dbUrl = await createDatabaseFromTemplate();
  server = await startServer(dbUrl);
}, 120_000);
afterAll(async () => {
  await server?.stop();
  if (dbUrl) await dropDatabase(dbUrl);
});

function concrete(path: string) {
  return path.replace(/:[^/]+/g, "00000000-0000-4000-8000-000000000000").replace(/\*$/, "x");
}

function expectSecurityHeaders(h: Headers, what: string) {
  const csp = h.get("content-security-policy") ?? "";
  expect(csp, what).toMatch(/script-src 'self' 'nonce-[A-Za-z0-9+/=]{16,}'/);
  expect(csp, what).toContain("frame-ancestors 'none'");
  expect(csp, what).toContain("worker-src 'self' blob:");
  expect(csp, what).not.toContain("unsafe-eval");
  expect(h.get("x-content-type-options"), what).toBe("nosniff");
  expect(h.get("referrer-policy"), what).toBeTruthy();
  expect(h.get("x-powered-by"), what).toBeNull();
}

describe("security headers", () => {
  it("are on every route in routes.ts, whatever the status", async () => {
    const paths = allRoutePaths();
    expect(paths.length).toBeGreaterThan(1);
    for (const r of paths) {
      const res = await fetch(server.url + concrete(r.path), { redirect: "manual" });
      expectSecurityHeaders(res.headers, `${r.path} (${res.status})`);
      expect(res.status, r.path).toBeLessThan(500);
    }
  });

  it("are on static assets, 404s and API errors too", async () => {
    for (const p of ["/favicon.ico", "/no-such-page", "/assets/nope.js"]) {
      const res = await fetch(server.url + p, { redirect: "manual" });
      expectSecurityHeaders(res.headers, p);
    }
  });

  it("uses a fresh nonce per response, and the page's scripts carry it", async () => {
    const a = await fetch(server.url + "/");
    const b = await fetch(server.url + "/");
    const nonceA = /'nonce-([^']+)'/.exec(a.headers.get("content-security-policy")!)![1];
    const nonceB = /'nonce-([^']+)'/.exec(b.headers.get("content-security-policy")!)![1];
    expect(nonceA).not.toBe(nonceB);
    const html = await a.text();
    const scripts = [...html.matchAll(/<script[^>]*>/g)].map((m) => m[0]);
    expect(scripts.length).toBeGreaterThan(0);
    for (const s of scripts) expect(s).toContain(`nonce="${nonceA}"`);
  });

  it("refuses cross-site writes with 403 before they reach a route", async () => {
    const foreignOrigin = await fetch(server.url + "/", {
      method: "POST",
      headers: { Origin: "https://elsewhere.example" },
    });
    expect(foreignOrigin.status).toBe(403);
    const crossSite = await fetch(server.url + "/", { method: "POST", headers: { "Sec-Fetch-Site": "cross-site" } });
    expect(crossSite.status).toBe(403);
    const sameOrigin = await fetch(server.url + "/healthz", { method: "GET", headers: { Origin: server.url } });
    expect(sameOrigin.status).toBe(200);
  });
});
