import { expect, test } from "@playwright/test";

// Demo roof (components/sandbox/state/demo-roof.ts): 12 m × 8 m, outlet O1 at (6, 0), base fall 2°.
// (A ridge across the middle would also cross a rooflight added in the middle, so the rooflight
// comes last.)
// An outlet added half-way along edge 4 (the west wall) sits at (0, 4). A ridge from (3, 0) to
// (3, 8) then divides the roof into a west area (O2) and an east one (O1)
// (docs/roof-method-plans.md P4); the ridge first drawn across the middle, (6, 0) to (6, 8), ends
// on O1 and is refused until it is moved.

// Each edit is analysed again (a divided roof also weighs each area's joist directions); a loaded machine is slow.
test.describe.configure({ timeout: 240_000 });

test("sandbox: an opening and a ridge added, the ridge set by keyboard; the 3D view and the check sheet show both", async ({
  page,
}) => {
  await page.goto("/sandbox");
  await page.evaluate(() => sessionStorage.clear());
  await page.reload();
  await expect(page.getByTestId("high-level-figure")).toHaveText("279 mm", { timeout: 60_000 });

  await page.getByRole("button", { name: "Add an outlet half-way along edge 4" }).click();
  await page.getByTestId("add-ridge").click();
  await expect(page.getByTestId("plan-ridge-0")).toBeAttached();
  // (6, 0) is O1: an outlet at a ridge's end is refused, naming the outlet.
  await expect(page.getByTestId("engine-error")).toContainText("outlets.0.at", { timeout: 60_000 });

  // Keyboard: both ends to x = 3.
  for (const point of [0, 1]) {
    const x = page.getByTestId(`ridge-0-point-${point}-x`);
    await x.fill("3");
    await x.press("Enter");
  }
  await expect(page.getByTestId("engine-error")).toHaveCount(0, { timeout: 60_000 });
  await expect(page.getByTestId("scene-ridges")).toContainText("2 drainage areas", { timeout: 60_000 });

  // A rooflight in the middle of the roof (6, 4), clear of the ridge at x = 3: its upstand is named.
  await page.getByTestId("add-opening").click();
  await expect(page.getByTestId("plan-opening-0")).toBeAttached();
  await expect(page.getByTestId("scene-upstands")).toContainText("rooflight, 150 mm", { timeout: 60_000 });
  await expect(page.getByTestId("engine-error")).toHaveCount(0);

  const [sheet] = await Promise.all([page.waitForEvent("popup"), page.getByTestId("check-sheet-link").click()]);
  const body = sheet.getByTestId("check-sheet");
  await expect(body).toBeVisible({ timeout: 60_000 });
  await expect(body).toContainText("Openings");
  await expect(body).toContainText("rooflight");
  await expect(body).toContainText("Ridges");
  await expect(body).toContainText("(3.00, 0.00) → (3.00, 8.00)");
  await expect(body).toContainText("Drainage areas");

  // Undo takes the last edit back; deleting the ridge leaves one area.
  await page.getByTestId("delete-ridge-0").click();
  await expect(page.getByTestId("plan-ridge-0")).toHaveCount(0);
});
