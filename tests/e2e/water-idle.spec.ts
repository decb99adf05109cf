import { expect, test, type Page } from "@playwright/test";

// Chromium here draws WebGL on the CPU (SwiftShader, tests/playwright.config.ts), as a laptop
// without a graphics driver does; there each frame of the water animation costs a core, so the
// sandbox rests the water after 30 s without input (app/components/sandbox/view-3d/cpu-drawing.ts).
// The page's clock is Playwright's, so the 30 s pass at once.

/** Counts draw calls in every WebGL context of the page, before its scripts run. */
const COUNT_DRAWS = `(() => {
  window.__draws = 0;
  for (const proto of [WebGL2RenderingContext.prototype, WebGLRenderingContext.prototype]) {
    for (const name of ["drawElements", "drawArrays", "drawElementsInstanced", "drawArraysInstanced"]) {
      const f = proto[name];
      if (typeof f === "function") proto[name] = function (...args) { window.__draws++; return f.apply(this, args); };
    }
  }
})();`;

const draws = (page: Page) => page.evaluate(() => (window as unknown as { __draws: number }).__draws);

test("sandbox drawn on the CPU: the water rests after 30 s without input, says so, and moves again at the next input", async ({
  page,
}) => {
  await page.addInitScript({ content: COUNT_DRAWS });
  await page.clock.install();
  await page.goto("/sandbox");
  const view = page.getByTestId("view-3d");
  await expect(view).toHaveAttribute("data-drawn", /^\d+$/, { timeout: 60_000 });
  await expect(view).toHaveAttribute("data-water", "moving");
  await expect(page.getByTestId("water-paused")).toHaveCount(0);
  // Moving water draws frame after frame.
  const before = await draws(page);
  await expect.poll(() => draws(page), { timeout: 10_000 }).toBeGreaterThan(before + 2);

  await page.clock.fastForward("00:31");
  await expect(view).toHaveAttribute("data-water", "paused");
  await expect(page.getByTestId("water-paused")).toContainText("press a key to restart it");
  // Resting water draws nothing more (a frame already asked for may still come).
  await page.waitForTimeout(500);
  const rested = await draws(page);
  await page.waitForTimeout(1500);
  expect(await draws(page)).toBe(rested);

  await page.mouse.move(300, 300);
  await expect(view).toHaveAttribute("data-water", "moving");
  await expect(page.getByTestId("water-paused")).toHaveCount(0);
  await expect.poll(() => draws(page), { timeout: 10_000 }).toBeGreaterThan(rested + 2);
});

test("side-by-side drawn on the CPU: the shaped roof's water rests too, its note over the shaped view so the panels keep their size", async ({
  page,
}) => {
  // Three views drawn on the CPU at once.
  test.setTimeout(150_000);
  await page.clock.install();
  await page.goto("/sandbox");
  await expect(page.getByTestId("view-3d")).toHaveAttribute("data-drawn", /^\d+$/, { timeout: 60_000 });
  await page.getByRole("button", { name: "Side-by-side" }).click();
  const views = page.getByTestId("side-by-side");
  await expect(views).toHaveAttribute("data-water", "moving", { timeout: 60_000 });
  await views.scrollIntoViewIfNeeded();
  const shaped = page.getByTestId("panel-shaped");
  const before = await shaped.boundingBox();

  await page.clock.fastForward("00:31");
  await expect(views).toHaveAttribute("data-water", "paused");
  await expect(shaped.getByTestId("water-paused")).toBeVisible();
  expect(await shaped.boundingBox()).toEqual(before);

  await page.keyboard.press("Shift");
  await expect(views).toHaveAttribute("data-water", "moving");
  await expect(page.getByTestId("water-paused")).toHaveCount(0);
});

/** Calls to clear() in every WebGL context of the page: three.js clears once per frame it draws. */
const COUNT_FRAMES = `(() => {
  window.__frames = 0;
  for (const proto of [WebGL2RenderingContext.prototype, WebGLRenderingContext.prototype]) {
    const f = proto.clear;
    proto.clear = function (...args) { window.__frames++; return f.apply(this, args); };
  }
})();`;

const frames = (page: Page) => page.evaluate(() => (window as unknown as { __frames: number }).__frames);
const antialiased = (page: Page) =>
  page
    .getByTestId("view-3d")
    .locator("canvas")
    .evaluate((c: HTMLCanvasElement) => c.getContext("webgl2")?.getContextAttributes()?.antialias ?? null);

test("drawn on the CPU: every 3D view, the browser's first included, is made without multisampling, and the moving water asks for at most 8 frames a second", async ({
  page,
}) => {
  await page.addInitScript({ content: COUNT_FRAMES });
  await page.goto("/sandbox");
  const view = page.getByTestId("view-3d");
  await expect(view).toHaveAttribute("data-drawn", /^\d+$/, { timeout: 60_000 });
  // The first 3D view in this browser asked a throwaway context before making its own.
  expect(await antialiased(page)).toBe(false);
  expect(await page.evaluate(() => localStorage.getItem("fallwright:3d-drawn-on-cpu"))).toBe("1");

  await page.reload();
  await expect(view).toHaveAttribute("data-drawn", /^\d+$/, { timeout: 60_000 });
  expect(await antialiased(page)).toBe(false);
  await expect(view).toHaveAttribute("data-water", "moving");
  // Input away from the view keeps the water awake without moving the camera; real time, 3 s.
  await page.mouse.move(5, 5);
  const before = await frames(page);
  const started = Date.now();
  await page.waitForTimeout(3000);
  const drawn = (await frames(page)) - before;
  const seconds = (Date.now() - started) / 1000;
  expect(drawn).toBeGreaterThanOrEqual(2); // it still moves
  expect(drawn / seconds).toBeLessThanOrEqual(8 + 1); // one frame of slack for the window's edges
});
