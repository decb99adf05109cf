import { expect, test } from "@playwright/test";

test.describe.configure({ timeout: 150_000 });

// Demo roof: 12 m × 8 m, outlet at (6, 0), base fall 2°, so H = 8 m × tan 2° = 279 mm (docs/roof-method.md §3/§4).
// In inches (1 in = 25.4 mm exactly, NIST SP 811): 279.37 mm / 25.4 = 10.999 in → 11 in to 1/16.

test("units: an anonymous visitor picks US customary; figures and inputs follow, typing either system works, and the choice is remembered", async ({
  page,
}) => {
  await page.goto("/sandbox");
  await page.evaluate(() => {
    sessionStorage.clear();
    localStorage.clear();
  });
  await page.reload();
  await expect(page.getByTestId("high-level-figure")).toHaveText("279 mm", { timeout: 30_000 });
  await expect(page.getByTestId("engine-status")).toHaveAttribute("data-computing", "false");

  await page.getByTestId("units-switch").selectOption("us");
  await expect(page.getByTestId("high-level-figure")).toHaveText("11 in");
  // Vertex 3 is at x = 12 m = 39' 4 7/16" (472.44 in).
  await expect(page.getByTestId("vertex-2-x")).toHaveValue(`39' 4 7/16"`);

  // Feet and inches typed: the roof stays in metres underneath (40 ft = 12.192 m).
  await page.getByTestId("vertex-2-x").fill(`40'`);
  await page.getByTestId("vertex-1-x").fill("12192 mm");
  await expect(page.getByTestId("vertex-table")).toContainText(`40' 0"`);

  // A fall the way US roofers write it.
  await page.getByTestId("base-fall").fill("1/4:12");
  await expect(
    page.locator("#" + (await page.getByTestId("base-fall").getAttribute("aria-describedby"))),
  ).toContainText("1/4 in per ft (1:48)");
  await expect(page.getByTestId("worst-fall-figure")).toContainText("in per ft");

  // Remembered in this browser.
  await page.reload();
  await expect(page.getByTestId("units-switch")).toHaveValue("us");
  await expect(page.getByTestId("high-level-figure")).toContainText(" in", { timeout: 30_000 });

  // Back to metric: the same roof in metres.
  await page.getByTestId("units-switch").selectOption("metric");
  await expect(page.getByTestId("vertex-2-x")).toHaveValue("12.192");
});

test("units: a US rule set shows US customary to someone who has not chosen", async ({ page }) => {
  await page.goto("/sandbox");
  await page.evaluate(() => {
    sessionStorage.clear();
    localStorage.clear();
  });
  await page.reload();
  await expect(page.getByTestId("high-level-figure")).toHaveText("279 mm", { timeout: 30_000 });
  await page.getByTestId("settings").getByTestId("rule-set").selectOption("us-ibc-2018");
  await expect(page.getByTestId("high-level-figure")).toContainText(" in");
  await expect(page.getByTestId("units-switch")).toHaveValue("auto");
});
