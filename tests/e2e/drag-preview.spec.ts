import { expect, test } from "@playwright/test";

// While a corner is dragged the sandbox shows a preview analysed on a coarser mesh
// (docs/decisions/0002-engine-in-a-worker-and-on-the-server.md); when the drag ends the exact
// analysis replaces it. This checks the figures left on screen against the server's own full
// analysis of the same roof (POST /api/v1/analyses), so a preview that lingered would show.
// The roof is made large (60 m × 40 m, well over the preview's 8,000 mesh vertices) so the
// preview and the full analysis differ in their mesh.

test("sandbox: after a drag ends on a large roof, the figures shown are the full analysis's", async ({ page }) => {
  test.setTimeout(180_000);
  await page.goto("/sandbox");
  await page.evaluate(() => sessionStorage.clear());
  await page.reload();
  await expect(page.getByTestId("high-level-figure")).toHaveText(/^279\smm$/, { timeout: 60_000 });
  await expect(page.getByTestId("engine-status")).toHaveAttribute("data-computing", "false");

  // Demo roof 12 m × 8 m, outlet at (6, 0): corners 2 and 3 to x = 60, corners 3 and 4 to y = 40.
  for (const [id, value] of [
    ["vertex-1-x", "60"],
    ["vertex-2-x", "60"],
    ["vertex-2-y", "40"],
    ["vertex-3-y", "40"],
  ]) {
    const field = page.getByTestId(id);
    await field.fill(value);
    await field.press("Enter");
  }
  // 40 m × tan 2° = 1.397 m (docs/roof-method.md §3/§4).
  await expect(page.getByTestId("high-level-figure")).toHaveText(/^1397\smm$/, { timeout: 60_000 });
  await expect(page.getByTestId("engine-status")).toHaveAttribute("data-computing", "false");

  // Drag corner 3 (60, 40) up and to the right by a few metres, in small steps.
  await page.getByTestId("plan").scrollIntoViewIfNeeded();
  const centre = async (id: string) => {
    const b = (await page.getByTestId(id).boundingBox())!;
    return { x: b.x + b.width / 2, y: b.y + b.height / 2 };
  };
  const a = await centre("vertex-0");
  const c = await centre("vertex-2");
  const perMetre = (c.x - a.x) / 60;
  await page.mouse.move(c.x, c.y);
  await page.mouse.down();
  for (let i = 1; i <= 12; i++) await page.mouse.move(c.x + (3 * perMetre * i) / 12, c.y - (4 * perMetre * i) / 12);
  await page.mouse.up();
  await expect(page.getByTestId("engine-status")).toHaveAttribute("data-computing", "false", { timeout: 60_000 });

  // The roof now on screen, as the sandbox keeps it for this tab, analysed by the server.
  const x = Number(await page.getByTestId("vertex-2-x").inputValue());
  const y = Number(await page.getByTestId("vertex-2-y").inputValue());
  expect(y).toBeGreaterThan(40);
  const stored = () => page.evaluate(() => JSON.parse(sessionStorage.getItem("fallwright:sandbox") ?? "null"));
  await expect.poll(async () => (await stored())?.outline?.[2]).toEqual([x, y]);
  const spec = await stored();
  const answer = await page.request.post("/api/v1/analyses", { data: spec });
  expect(answer.status()).toBe(200);
  const full = await answer.json();

  // Levels to the millimetre, the fall line to 0.1 m; a number and its unit share a no-break space.
  await expect(page.getByTestId("high-level-figure")).toHaveText(
    new RegExp(`^${Math.round(full.shaped.highLevel * 1000)}\\smm$`),
  );
  const longest = full.shaped.longestFallLine;
  // The ratio as the page writes it: whole when within 0.05 of a whole number, else one decimal.
  const whole = Math.round(longest.ratio);
  const ratio = Math.abs(longest.ratio - whole) < 0.05 ? `1:${whole}` : `1:${longest.ratio.toFixed(1)}`;
  await expect(page.getByTestId("longest-fall-figure")).toContainText(
    new RegExp(`^${longest.length.toFixed(1).replace(".", "\\.")}\\sm at ${ratio.replace(".", "\\.")}\\b`),
  );
});
