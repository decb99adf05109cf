import { expect, test } from "@playwright/test";

test("an unknown address shows the 404 page inside the shell, with the navigation and ways back", async ({ page }) => {
  const res = await page.goto("/no-such-page/at-all");
  expect(res?.status()).toBe(404);
  await expect(page.getByRole("navigation", { name: "Main" })).toBeVisible();
  await expect(page.getByTestId("error-page")).toContainText("Nothing here");
  await expect(page.getByTestId("error-page")).not.toContainText("No route matches");
  await expect(page.getByRole("navigation", { name: "Ways back" }).getByRole("link", { name: "Home" })).toBeVisible();
  expect(await page.locator("pre").count()).toBe(0);
});

test("the 3D page logs no THREE.Clock deprecation (console clean)", async ({ page }) => {
  const messages: string[] = [];
  page.on("console", (m) => {
    if (m.type() === "warning" || m.type() === "error") messages.push(m.text());
  });
  await page.goto("/sandbox");
  await expect(page.getByTestId("view-3d").locator("canvas").first()).toBeVisible({ timeout: 60_000 });
  await page.waitForTimeout(1500);
  expect(messages.filter((m) => /THREE\.Clock/.test(m))).toEqual([]);
});
