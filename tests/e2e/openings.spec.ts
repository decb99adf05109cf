import { expect, test } from "@playwright/test";

// Demo roof (components/sandbox/state/demo-roof.ts): 12 m × 8 m, one outlet at (6, 0), base fall 2°,
// joists along y; H = 8 m × tan 2° = 279 mm (docs/roof-method.md §3).
// A 1 m rooflight added in the middle spans 5.5..6.5 × 3.5..4.5, across the fall line x = 6: along
// its high side y = 4.5 the deck is lowest at x = 6, so water is held there
// (docs/roof-method-plans.md P3). Moved 1 m right (6.5..7.5) it lies off the fall line and holds none.

test("sandbox: a rooflight added by mouse and moved by keyboard; held water comes and goes; the check sheet lists it", async ({
  page,
}) => {
  await page.goto("/sandbox");
  await page.evaluate(() => sessionStorage.clear());
  await page.reload();
  await expect(page.getByTestId("high-level-figure")).toHaveText("279 mm", { timeout: 30_000 });
  await expect(page.getByTestId("engine-status")).toHaveAttribute("data-computing", "false");

  await page.getByTestId("add-opening").click();
  await expect(page.getByTestId("plan-opening-0")).toBeAttached();
  await expect(page.getByTestId("opening-0")).toBeVisible();
  const held = page.locator('[data-code="water-held-behind-upstand"]');
  await expect(held).toHaveCount(1, { timeout: 30_000 });
  await expect(held).toContainText("cricket");
  // The deck keeps its levels: H is unchanged.
  await expect(page.getByTestId("high-level-figure")).toHaveText("279 mm");

  // Keyboard: the "move right" button, ten presses of 100 mm.
  const right = page.getByRole("button", { name: "Move opening 1 right" });
  await right.focus();
  for (let i = 0; i < 10; i++) await page.keyboard.press("Enter");
  await expect(held).toHaveCount(0, { timeout: 30_000 });

  // Undo steps back one nudge at a time; ten of them bring the held water back.
  await page.getByTestId("plan").click({ position: { x: 5, y: 5 } });
  for (let i = 0; i < 10; i++) await page.keyboard.press("Control+z");
  await expect(held).toHaveCount(1, { timeout: 30_000 });

  const [sheet] = await Promise.all([page.waitForEvent("popup"), page.getByTestId("check-sheet-link").click()]);
  await expect(sheet.getByTestId("check-sheet")).toBeVisible();

  // Deleting it leaves the roof as it was.
  await page.getByTestId("delete-opening-0").click();
  await expect(page.getByTestId("plan-opening-0")).toHaveCount(0);
  await expect(held).toHaveCount(0);
});
