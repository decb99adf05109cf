import { readFileSync } from "node:fs";
import { createRequire } from "node:module";
import { expect, test, type Page } from "@playwright/test";
import { signIn } from "./support/session";

const require = createRequire(import.meta.url);
const PDFJS = require.resolve("pdfjs-dist/build/pdf.min.mjs");
const WORKER = require.resolve("pdfjs-dist/build/pdf.worker.min.mjs");
const unique = () => Math.random().toString(36).slice(2, 8);

/** Draws page 1 of a PDF with pdf.js in the browser (served here, not from the app) and returns it as PNG. */
async function renderPdf(page: Page, pdf: Buffer): Promise<Buffer> {
  await page.route("**/__render/**", async (route) => {
    const url = route.request().url();
    if (url.endsWith("/pdf.mjs")) return route.fulfill({ body: readFileSync(PDFJS), contentType: "text/javascript" });
    if (url.endsWith("/worker.mjs"))
      return route.fulfill({ body: readFileSync(WORKER), contentType: "text/javascript" });
    if (url.endsWith("/sheet.pdf")) return route.fulfill({ body: pdf, contentType: "application/pdf" });
    return route.fulfill({
      contentType: "text/html",
      body: `<!doctype html><body style="margin:0;background:#888"><canvas id="c"></canvas><script type="module">
        import * as pdfjs from "/__render/pdf.mjs";
        pdfjs.GlobalWorkerOptions.workerSrc = "/__render/worker.mjs";
        const doc = await pdfjs.getDocument("/__render/sheet.pdf").promise;
        const p = await doc.getPage(1);
        const viewport = p.getViewport({ scale: 1.5 });
        const c = document.getElementById("c");
        c.width = viewport.width; c.height = viewport.height;
        await p.render({ canvas: c, canvasContext: c.getContext("2d"), viewport }).promise;
        document.body.dataset.pages = String(doc.numPages);
      </script></body>`,
    });
  });
  await page.goto("/__render/index.html");
  await expect(page.locator("body[data-pages]")).toBeAttached({ timeout: 30_000 });
  return page.locator("#c").screenshot();
}

test("a shared link opens without signing in, shows the roof and its PDF, and stops working when revoked", async ({
  page,
  browser,
}, testInfo) => {
  test.setTimeout(300_000);
  await signIn(page, "designer@tidemark.example");
  const name = `Depot north bay ${unique()}`;
  const spec = {
    outline: [
      [0, 0],
      [14, 0],
      [14, 9],
      [6, 9],
      [6, 5],
      [0, 5],
    ],
    outlets: [{ at: [4, 0] }, { at: [14, 7] }],
    baseFall: "1:60",
    joists: { spacing: 0.4, fromOutlets: true },
  };
  const res = await page.request.post("/api/v1/roofs", { data: { name, spec } });
  expect(res.status()).toBe(201);
  const id = (await res.json()).id;
  await page.goto(`/roofs/${id}`);
  await expect(page.getByTestId("pack-downloads")).toBeVisible();
  // Hydrated (the sandbox workspace's engine has answered) before pressing the button.
  await expect(page.getByTestId("drop-schedule")).toBeVisible({ timeout: 60_000 });
  await page.waitForLoadState("networkidle");
  await page.getByTestId("share-link-create").click();
  const link = await page.getByTestId("share-link-url").inputValue({ timeout: 30_000 });
  expect(link).toMatch(/\/s\/[A-Za-z0-9_-]{43}$/);

  // A fresh browser context: no cookies, no session.
  const guest = await browser.newContext();
  const visitor = await guest.newPage();
  const opened = await visitor.goto(link);
  expect(opened?.status()).toBe(200);
  await expect(visitor.getByRole("heading", { name })).toBeVisible();
  await expect(visitor.getByRole("note").filter({ hasText: "designer of record" }).first()).toBeVisible();
  await expect(visitor.getByTestId("key-figures").or(visitor.getByTestId("drop-schedule")).first()).toBeVisible({
    timeout: 30_000,
  });
  await expect(visitor.getByRole("link", { name: "Sign in" })).toBeVisible();

  // Its PDF, drawn with pdf.js and looked at (saved beside the test results).
  const pdf = await visitor.request.get(`${link}/sheet.pdf`);
  expect(pdf.status()).toBe(200);
  expect(pdf.headers()["content-disposition"]).toContain("depot-north-bay");
  const png = await renderPdf(visitor, await pdf.body());
  await testInfo.attach("check-sheet-page-1.png", { body: png, contentType: "image/png" });
  const { writeFileSync, mkdirSync } = await import("node:fs");
  mkdirSync(testInfo.outputDir, { recursive: true });
  writeFileSync(`${testInfo.outputDir}/check-sheet-page-1.png`, png);
  expect(png.length).toBeGreaterThan(20_000);

  // Revoked: the same link is a 404 for the visitor.
  await page.goto(`/roofs/${id}`);
  await page.waitForLoadState("networkidle");
  await page.getByTestId("share-link-revoke").first().click();
  await expect(page.getByTestId("share-link-list")).toHaveCount(0, { timeout: 60_000 });
  await expect
    .poll(async () => (await visitor.goto(link, { waitUntil: "commit" }))?.status(), { timeout: 60_000 })
    .toBe(404);
  // A guessed token is a 404 as well.
  const guessed = await visitor.goto(`/s/${"Q".repeat(43)}`, { waitUntil: "commit" });
  expect(guessed?.status()).toBe(404);
  await guest.close();
});

test("the check sheet is titled with the roof's name, has one caution and the whole schedule on the page", async ({
  page,
}) => {
  test.setTimeout(150_000);
  await signIn(page, "designer@tidemark.example");
  const name = `Annex east ${unique()}`;
  const spec = {
    outline: [
      [0, 0],
      [12, 0],
      [12, 8],
      [0, 8],
    ],
    outlets: [{ at: [6, 0] }],
    baseFall: "2°",
    joists: { spacing: 0.4 },
  };
  const id = (await (await page.request.post("/api/v1/roofs", { data: { name, spec } })).json()).id;
  await page.goto(`/roofs/${id}/sheet`);
  await expect(page.getByRole("heading", { level: 1, name })).toBeVisible();
  await expect(page.getByRole("note").filter({ hasText: "designer of record" })).toHaveCount(1);
  // 12 m across at 0.4 m: 31 joists, every one on the page at once (nothing loads on scroll).
  await expect(page.getByTestId("sheet-schedule").locator("tbody tr")).toHaveCount(31);
  await expect(page.getByText("Loading the schedule")).toHaveCount(0);
  await expect(page.getByText(/90\.0° from x/)).toBeVisible();
  await page.getByTestId("sheet-paper").selectOption("letter");
  await expect
    .poll(() =>
      page.evaluate(() =>
        [...document.querySelectorAll("style")].some((st) => st.textContent?.includes("size: letter")),
      ),
    )
    .toBe(true);
  await page.screenshot({ path: test.info().outputPath("roof-sheet.png"), fullPage: true });
});
