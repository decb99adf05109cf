import { expect, test, type Browser, type Page } from "@playwright/test";

// Issue 7, classroom mode: the trainer moves an outlet in present mode and the follower's view
// changes within a second; the follower's connection is cut and it catches up on reconnect.
const PASSWORD = "fallwright-demo";

async function signedIn(browser: Browser, email: string) {
  // A modest window: the 3D view is drawn on the CPU here, and two of them share the machine.
  const context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
  const page = await context.newPage();
  await page.goto("/login");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(PASSWORD);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page).not.toHaveURL(/\/login/);
  return { context, page };
}

const outletX = (page: Page) => page.getByLabel("Outlet O1 x");

/** Resolves once the page has gone a second without a long task (its scripts and drawing have caught up). */
function quiet(page: Page) {
  return page.evaluate(
    () =>
      new Promise<void>((resolve, reject) => {
        const started = performance.now();
        let busyUntil = started;
        const note = (entries: PerformanceEntryList) => {
          for (const e of entries) busyUntil = Math.max(busyUntil, e.startTime + e.duration);
        };
        const observer = new PerformanceObserver((list) => note(list.getEntries()));
        observer.observe({ type: "longtask", buffered: true });
        const check = setInterval(() => {
          note(observer.takeRecords());
          const now = performance.now();
          if (now - busyUntil < 1000 && now - started < 30_000) return;
          clearInterval(check);
          observer.disconnect();
          if (now - busyUntil >= 1000) resolve();
          else reject(new Error("the page kept running long tasks for 30 s"));
        }, 100);
      }),
  );
}

type LandingWindow = { __landed: { roof: number; scene: number; drawn: number } };

/**
 * In the follower's page: notes when the live roof (the section's data-seq), the scene summary
 * and the 3D canvas (the view's data-drawn frame count, set as a frame shows a new analysis) change.
 */
function watchLanding(sceneBefore: string) {
  const w = window as unknown as LandingWindow;
  const seqBefore = document.querySelector("[data-seq]")?.getAttribute("data-seq");
  const view = () => document.querySelector('[data-testid="view-3d"]')?.getAttribute("data-drawn");
  const drawnBefore = view();
  w.__landed = { roof: 0, scene: 0, drawn: 0 };
  const observer = new MutationObserver(() => {
    const now = Date.now();
    if (!w.__landed.roof && document.querySelector("[data-seq]")?.getAttribute("data-seq") !== seqBefore)
      w.__landed.roof = now;
    const scene = document.querySelector('[data-testid="scene-summary"]')?.textContent;
    if (!w.__landed.scene && scene != null && scene !== sceneBefore) w.__landed.scene = now;
    if (!w.__landed.drawn && w.__landed.scene && view() !== drawnBefore) w.__landed.drawn = now;
    if (w.__landed.roof && w.__landed.scene && w.__landed.drawn) observer.disconnect();
  });
  observer.observe(document.body, {
    subtree: true,
    childList: true,
    characterData: true,
    attributes: true,
    attributeFilter: ["data-seq", "data-drawn"],
  });
}

test("a follower sees the presenter's outlet move within a second, and catches up after a dropped connection", async ({
  browser,
}) => {
  test.setTimeout(120_000);
  const trainer = await signedIn(browser, "trainer@tidemark.example");
  await trainer.page.goto("/classes");
  const href = await trainer.page.getByRole("link", { name: "Parapet roofs, spring cohort" }).getAttribute("href");
  const classId = href!.split("/").pop()!;

  await trainer.page.goto(`/classes/${classId}/present`);
  await expect(trainer.page.getByRole("heading", { level: 1 })).not.toHaveText("No roofs to present");
  // Opening present mode puts its first roof live.
  await expect(trainer.page.getByRole("status").filter({ hasText: "the class sees this" })).toBeVisible();
  await expect(outletX(trainer.page)).toBeEditable();

  const trainee = await signedIn(browser, "trainee@tidemark.example");
  const follower = trainee.page;
  await follower.goto(`/classes/${classId}/follow`);
  await expect(follower.getByRole("status").filter({ hasText: "Live · connected" })).toBeVisible();
  const title = await trainer.page.getByRole("heading", { level: 1 }).textContent();
  await expect(follower.getByRole("heading", { level: 2, name: title!.trim() })).toBeVisible();
  await expect(outletX(follower)).toBeDisabled();
  const startX = await outletX(trainer.page).inputValue();
  await expect(outletX(follower)).toHaveValue(startX);

  // A class's pages are open well before the trainer moves anything: let the follower's 3D view
  // finish its first drawing (compiling its shaders takes seconds on the CPU-drawn WebGL here).
  await quiet(follower);
  await quiet(trainer.page);

  // Move the outlet: within a second the follower's scene shows the moved roof. The times are taken
  // in the follower's page as the change lands there (the same machine clock as t0).
  const scene = follower.getByTestId("scene-summary");
  await expect(scene).toContainText("longest fall line");
  const sceneBefore = (await scene.textContent())!;
  const newX = startX === "3" ? "4" : "3";
  await follower.evaluate(watchLanding, sceneBefore);
  const t0 = Date.now();
  await outletX(trainer.page).fill(newX);
  await expect(outletX(follower)).toHaveValue(newX, { timeout: 5000 });
  await expect(scene).not.toHaveText(sceneBefore, { timeout: 5000 });
  await expect
    .poll(() => follower.evaluate(() => (window as unknown as LandingWindow).__landed.drawn), { timeout: 5000 })
    .toBeGreaterThan(0);
  const landed = await follower.evaluate(() => (window as unknown as LandingWindow).__landed);
  const [inStore, inScene, inCanvas] = [landed.roof - t0, landed.scene - t0, landed.drawn - t0];
  test.info().annotations.push({
    type: "live latency ms (roof, scene summary, canvas)",
    description: `${inStore}, ${inScene}, ${inCanvas}`,
  });
  console.log(`live latency ms: roof ${inStore}, scene summary ${inScene}, canvas ${inCanvas}`);
  expect(inScene).toBeLessThan(1000);
  expect(inCanvas).toBeLessThan(1000);
  await expect(follower.getByTestId("roof-summary")).toContainText(`at (${newX}, 0)`);

  // Next roof: the step changes for the follower too.
  await trainer.page.getByRole("button", { name: /Next roof/ }).click();
  const second = (await trainer.page.getByRole("heading", { level: 1 }).textContent())!.trim();
  await expect(follower.getByRole("heading", { level: 2, name: second })).toBeVisible();
  await expect(follower.getByText(/step 2 of \d+/)).toBeVisible();

  // Cut the follower off, change the roof meanwhile, reconnect: it catches up.
  await trainee.context.setOffline(true);
  await expect(follower.getByRole("status").filter({ hasText: "Reconnecting…" })).toBeVisible({ timeout: 10_000 });
  const seqBefore = await follower.locator("[data-seq]").getAttribute("data-seq");
  const missedX = (await outletX(trainer.page).inputValue()) === "2" ? "5" : "2";
  const sent = trainer.page.locator("span[data-state]");
  const sentBefore = await sent.textContent();
  await outletX(trainer.page).fill(missedX);
  await expect(sent).toHaveAttribute("data-state", "sent");
  await expect(sent).not.toHaveText(sentBefore!);
  await follower.waitForTimeout(1500);
  await expect(outletX(follower)).not.toHaveValue(missedX);
  expect(await follower.locator("[data-seq]").getAttribute("data-seq")).toBe(seqBefore);

  await trainee.context.setOffline(false);
  await expect(follower.getByRole("status").filter({ hasText: "Live · connected" })).toBeVisible({ timeout: 10_000 });
  await expect(outletX(follower)).toHaveValue(missedX, { timeout: 10_000 });
  expect(Number(await follower.locator("[data-seq]").getAttribute("data-seq"))).toBeGreaterThan(Number(seqBefore));

  // Copy to my sandbox opens the live roof there.
  await follower.getByRole("button", { name: "Copy to my sandbox" }).click();
  await expect(follower).toHaveURL(/\/sandbox\?spec=/);
  await expect(outletX(follower)).toHaveValue(missedX);
  await expect(outletX(follower)).toBeEditable();

  await trainer.context.close();
  await trainee.context.close();
});
