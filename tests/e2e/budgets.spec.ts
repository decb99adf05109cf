import { gzipSync } from "node:zlib";
import { expect, test, type Page } from "@playwright/test";

// Budgets from QUALITY.md (Performance → Pages): gzip kB of JavaScript a page loads.
const BUDGETS: { path: string; kb: number; three: boolean }[] = [
  { path: "/", kb: 150, three: false },
  { path: "/login", kb: 150, three: false },
  { path: "/sandbox", kb: 450, three: true },
];

async function scriptsOf(page: Page, path: string) {
  const scripts = new Map<string, Buffer>();
  page.on("response", async (r) => {
    if (r.request().resourceType() === "script" || r.url().endsWith(".js")) {
      try {
        scripts.set(r.url(), await r.body());
      } catch {
        /* navigation away */
      }
    }
  });
  await page.goto(path);
  await page.waitForLoadState("networkidle");
  if (path === "/sandbox") await page.locator("canvas").first().waitFor({ timeout: 30_000 });
  await page.waitForLoadState("networkidle");
  return scripts;
}

for (const b of BUDGETS) {
  test(`JavaScript for ${b.path} stays within ${b.kb} kB gzip${b.three ? "" : " and has no three.js"}`, async ({ page }) => {
    const scripts = await scriptsOf(page, b.path);
    expect(scripts.size).toBeGreaterThan(0);
    let total = 0;
    let hasThree = false;
    for (const body of scripts.values()) {
      total += gzipSync(body).length;
      if (body.includes("WebGLRenderer")) hasThree = true;
    }
    const kb = total / 1024;
    test.info().annotations.push({ type: "gzip kB", description: kb.toFixed(1) });
    expect(kb).toBeLessThanOrEqual(b.kb);
    expect(hasThree).toBe(b.three);
  });
}
