import { gzipSync } from "node:zlib";
import { expect, test, type Page } from "@playwright/test";

// Budgets from docs/quality.md (Performance → Pages): gzip kB of all the JavaScript a page loads to
// open, its Web Workers' scripts included (the sandbox's engine runs in one). Code a page loads
// later on demand (the drop schedule's table when it scrolls into view) is not counted.
const BUDGETS: { path: string; kb: number; three: boolean }[] = [
  { path: "/", kb: 150, three: false },
  { path: "/login", kb: 150, three: false },
  // 393.9 kB measured on 2026-12-04 (356.3 main, 37.6 worker). mathjs (units and fractions) is not
  // part of it: it loads when a length field is focused or the worker meets a fall with units
  // (docs/decisions/0015-lazy-unit-reader.md).
  { path: "/sandbox", kb: 450, three: true },
];

async function scriptsOf(page: Page, path: string) {
  const scripts = new Map<string, Buffer>();
  const workers = new Set<string>();
  page.on("worker", (w) => workers.add(w.url()));
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
  if (path === "/sandbox") {
    await page.locator("canvas").first().waitFor({ timeout: 30_000 });
    await expect.poll(() => workers.size, { timeout: 30_000 }).toBeGreaterThan(0);
  }
  await page.waitForLoadState("networkidle");
  // Scripts a worker imports count as the worker's.
  for (const w of page.workers()) {
    for (const url of await w.evaluate(() => performance.getEntriesByType("resource").map((e) => e.name)))
      workers.add(url);
  }
  return { scripts, workers };
}

for (const b of BUDGETS) {
  test(`JavaScript for ${b.path} stays within ${b.kb} kB gzip (workers included)${b.three ? "" : " and has no three.js"}`, async ({
    page,
  }) => {
    const { scripts, workers } = await scriptsOf(page, b.path);
    expect(scripts.size).toBeGreaterThan(0);
    let main = 0;
    let worker = 0;
    let hasThree = false;
    const rows: string[] = [];
    for (const [url, body] of scripts) {
      const size = gzipSync(body).length;
      rows.push(
        `${(size / 1024).toFixed(1).padStart(7)} kB ${workers.has(url) ? "worker" : "main  "} ${new URL(url).pathname}`,
      );
      if (workers.has(url)) worker += size;
      else main += size;
      if (body.includes("WebGLRenderer")) hasThree = true;
    }
    test.info().annotations.push({
      type: "gzip kB",
      description: `main ${(main / 1024).toFixed(1)}, worker ${(worker / 1024).toFixed(1)}`,
    });
    console.log(rows.sort().reverse().slice(0, 12).join("\n"));
    console.log(
      `${b.path}: main thread ${(main / 1024).toFixed(1)} kB gzip, worker ${(worker / 1024).toFixed(1)} kB gzip`,
    );
    if (b.path === "/sandbox") expect(worker).toBeGreaterThan(0);
    expect((main + worker) / 1024).toBeLessThanOrEqual(b.kb);
    expect(hasThree).toBe(b.three);
    if (b.path === "/sandbox") {
      // The deferred part arrives when the reader gets there.
      await expect(page.getByTestId("schedule-table")).toHaveCount(0);
      await page.getByTestId("drop-schedule").scrollIntoViewIfNeeded();
      await expect(page.getByTestId("schedule-table").locator("tbody tr").first()).toBeVisible();
    }
  });
}
