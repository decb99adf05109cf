import { expect, test } from "@playwright/test";

test("home page names Fallwright and every request stays on the local server, fonts included", async ({ page, baseURL }) => {
  const origin = new URL(baseURL!).origin;
  const requests: string[] = [];
  page.on("request", (r) => requests.push(r.url()));
  await page.goto("/");
  await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
  await expect(page.getByRole("link", { name: "Fallwright" }).first()).toBeVisible();
  await page.waitForLoadState("networkidle");
  // The bundled Space Grotesk face is really in use, not a fallback.
  const fontLoaded = await page.evaluate(async () => {
    await document.fonts.ready;
    return document.fonts.check('16px "Space Grotesk"') && [...document.fonts].some((f) => f.family.includes("Space Grotesk") && f.status === "loaded");
  });
  expect(fontLoaded).toBe(true);
  expect(requests.some((u) => /\.woff2?(\?|$)/.test(u))).toBe(true);
  const foreign = requests.filter((u) => !u.startsWith(origin) && !u.startsWith("data:") && !u.startsWith("blob:"));
  expect(foreign).toEqual([]);
});

test("an unknown page shows the friendly 404", async ({ page }) => {
  const response = await page.goto("/no-such-page");
  expect(response?.status()).toBe(404);
  await expect(page.getByRole("heading", { name: "Nothing here" })).toBeVisible();
  await expect(page.getByText(/at .*\.js/)).toHaveCount(0);
});

test("the safety caution is on every page", async ({ page }) => {
  await page.goto("/");
  await expect(page.getByRole("note").filter({ hasText: "designer of record" })).toBeVisible();
});
