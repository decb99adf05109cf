import { expect, test, type Page } from "@playwright/test";
import { signedIn } from "./support/session";

// Issue 7, classroom mode: the trainer moves an outlet in present mode and the follower's view
// changes within a second; the follower's connection is cut and it catches up on reconnect.
// Issue 16, items 5-7: present mode on a projector; followers told waiting / live / paused / ended;
// the caption follows the roof on screen; trainees hand up roofs, the trainer shows one to everyone.
// All of it in this one file, run on its own after the other suites: it drives the demo class's
// one live session, which two files running side by side would fight over.
const RESULTS = `${process.env.TEST_RESULTS_DIR ?? ".data/test-results"}/screens`;

// Each person has a browser context of their own, in a modest window: the 3D view is drawn on the
// CPU here (software WebGL), and up to three of them share this machine's two cores.
const DESK = { viewport: { width: 1280, height: 800 }, timeout: 30_000 };
// Followers ask for reduced motion, so their 3D views draw only when the roof changes. Their water
// animation would otherwise redraw without pause, and every context of this one browser shares its
// single GPU process: in a failed run the presenter's page painted nothing for 13 s after opening
// present mode, while both followers painted every 0.3 s. In a real class each follower draws on
// their own device, so only this test puts three views on one machine.
const FOLLOWER = { ...DESK, reducedMotion: "reduce" as const };

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

type GlWindow = { __gl: { contexts: number; programs: number } };

/**
 * Before the page's scripts: counts the 3D views' WebGL contexts and the shader programs linked, so a
 * test can tell that a live update reused the 3D view's renderer and programs (on the CPU-drawn
 * WebGL here, each program compiled again costs the follower a fraction of a second or more).
 */
const COUNT_GL = `(() => {
  const gl = (window.__gl = { contexts: 0, programs: 0 });
  const seen = new WeakSet();
  const getContext = HTMLCanvasElement.prototype.getContext;
  HTMLCanvasElement.prototype.getContext = function (kind, ...rest) {
    const made = getContext.call(this, kind, ...rest);
    // A view's canvas is on the page; a throwaway 1 x 1 probe's (cpu-drawing.ts) is not.
    if (/webgl/.test(kind) && made && this.isConnected && !seen.has(made)) { seen.add(made); gl.contexts++; }
    return made;
  };
  for (const proto of [window.WebGL2RenderingContext?.prototype, window.WebGLRenderingContext?.prototype]) {
    if (!proto) continue;
    const link = proto.linkProgram;
    proto.linkProgram = function (...args) { gl.programs++; return link.apply(this, args); };
  }
})();`;

test("a follower sees the presenter's outlet move within a second, and catches up after a dropped connection", async ({
  browser,
}) => {
  test.setTimeout(120_000);
  const trainer = await signedIn(browser, "trainer@tidemark.example", DESK);
  const classId = await demoClass(trainer.page);

  await trainer.page.goto(`/classes/${classId}/present`);
  await expect(trainer.page.getByRole("heading", { level: 1 })).not.toHaveText("No roofs to present");
  // Opening present mode puts its first roof live.
  await expect(trainer.page.getByRole("status").filter({ hasText: "the class sees this" })).toBeVisible();
  await expect(outletX(trainer.page)).toBeEditable();
  // In class the presenter's screen is another machine; here both pages share one browser and its
  // GPU process, where the follower's shader compiles would queue behind the presenter's first
  // drawing (README, Browser: causes found). The presenter's first frame comes first, as in class.
  await expect(trainer.page.getByTestId("view-3d")).toHaveAttribute("data-drawn", /\d/, { timeout: 60_000 });

  const trainee = await signedIn(browser, "trainee@tidemark.example", FOLLOWER);
  const follower = trainee.page;
  await trainee.context.addInitScript({ content: COUNT_GL });
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
  await expect(follower.getByTestId("view-3d")).toHaveAttribute("data-drawn", /\d/);
  const glBefore = await follower.evaluate(() => (window as unknown as GlWindow).__gl);
  expect(glBefore.contexts).toBe(1);
  expect(glBefore.programs).toBeGreaterThan(0);
  await follower.locator('[data-testid="view-3d"] canvas').evaluate((c) => c.setAttribute("data-first-canvas", ""));

  // Move the outlet: within a second the follower's scene shows the moved roof. The times are taken
  // in the follower's page as the change lands there (the same machine clock as t0).
  const scene = follower.getByTestId("scene-summary");
  await expect(scene).toContainText("longest fall line");
  const sceneBefore = (await scene.textContent())!;
  const newX = startX === "3" ? "4" : "3";
  const presenterView = trainer.page.getByTestId("view-3d");
  const viewBefore = await presenterView.boundingBox();
  const followerViewBefore = await follower.getByTestId("view-3d").boundingBox();
  await follower.evaluate(watchLanding, sceneBefore);
  const t0 = Date.now();
  await outletX(trainer.page).fill(newX);
  // Until it lands, wait on the page's own record only. Playwright's locators run in the follower's
  // page: a trace of this test showed each check of the outlet's field (found by its label, over the
  // whole read-only workspace) taking 40-150 ms of the follower's main thread, and two of them
  // delaying the frame that showed the move by 200 ms. A watcher in class does not run them.
  await expect
    .poll(() => follower.evaluate(() => (window as unknown as LandingWindow).__landed.drawn), {
      timeout: 5000,
      intervals: [100],
    })
    .toBeGreaterThan(0);
  const landed = await follower.evaluate(() => (window as unknown as LandingWindow).__landed);
  // What landed is the move: the follower's field and scene show it.
  await expect(outletX(follower)).toHaveValue(newX, { timeout: 5000 });
  await expect(scene).not.toHaveText(sceneBefore, { timeout: 5000 });
  // Both captions now describe the edited roof, and neither 3D view moved or changed size: a caption
  // shorter than the step's no longer grows the presenter's view (a resize costs a full reallocation
  // and redraw; at this first edit it froze the presenter's page for 1.5 s and delayed the follower's
  // frame) or moves the follower's page up under its reader.
  await expect(trainer.page.getByRole("heading", { level: 1 })).toHaveAttribute("data-changed", "true");
  await expect(follower.locator("#live-title")).toHaveText(/^Changed live: /);
  expect(await presenterView.boundingBox()).toEqual(viewBefore);
  expect(await follower.getByTestId("view-3d").boundingBox()).toEqual(followerViewBefore);
  const [inStore, inScene, inCanvas] = [landed.roof - t0, landed.scene - t0, landed.drawn - t0];
  test.info().annotations.push({
    type: "live latency ms (roof, scene summary, canvas)",
    description: `${inStore}, ${inScene}, ${inCanvas}`,
  });
  console.log(`live latency ms: roof ${inStore}, scene summary ${inScene}, canvas ${inCanvas}`);
  expect(inScene).toBeLessThan(1000);
  expect(inCanvas).toBeLessThan(1000);
  await expect(follower.getByTestId("roof-summary")).toContainText(`at (${newX}, 0)`);
  // The new snapshot of the same roof was drawn by the same canvas, WebGL context and programs: the
  // 3D view was not remounted and nothing was compiled again.
  await expect(follower.locator('[data-testid="view-3d"] canvas[data-first-canvas]')).toHaveCount(1);
  expect(await follower.evaluate(() => (window as unknown as GlWindow).__gl)).toEqual(glBefore);

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

/**
 * The demo class's id, with any live session an earlier test left behind ended first (a presenter's
 * page that closes without "Stop presenting" leaves its session paused, to be resumed), so each
 * test starts from "ended".
 */
async function demoClass(page: Page) {
  await page.goto("/classes");
  const href = await page.getByRole("link", { name: "Parapet roofs, spring cohort" }).getAttribute("href");
  const classId = href!.split("/").pop()!;
  const ended = await page.evaluate(async (id) => {
    const res = await fetch(`/classes/${id}/live`, {
      method: "POST",
      headers: { "Content-Type": "application/json", Accept: "application/json" },
      body: JSON.stringify({ phase: "ended" }),
    });
    return res.status;
  }, classId);
  expect(ended).toBeLessThan(500);
  return classId;
}

const status = (page: Page) => page.locator('[role="status"][data-state]').first();

test("present mode fills a projector's screen: large 3D view, whole caption, large figures, keys on screen", async ({
  browser,
}) => {
  test.setTimeout(180_000);
  for (const viewport of [
    { width: 1920, height: 1080 },
    { width: 1280, height: 720 },
  ]) {
    const { context, page } = await signedIn(browser, "trainer@tidemark.example", { ...DESK, viewport });
    const classId = await demoClass(page);
    await page.goto(`/classes/${classId}/present`);
    await expect(page.getByRole("status").filter({ hasText: "the class sees this" })).toBeVisible();
    await expect(page.getByTestId("key-figures")).toBeVisible({ timeout: 60_000 });

    // The page is the screen: nothing to scroll.
    const scroll = await page.evaluate(() => document.documentElement.scrollHeight - window.innerHeight);
    expect(scroll).toBeLessThanOrEqual(1);
    // The 3D view takes most of the screen (it was about 560 × 430 px inside a long page).
    const view = (await page.getByTestId("view-3d").boundingBox())!;
    expect(view.width).toBeGreaterThan(viewport.width * 0.55);
    expect(view.height).toBeGreaterThan(viewport.height * 0.45);
    // The caption is whole: not cut, however long.
    const h1 = page.getByRole("heading", { level: 1 });
    const cut = await h1.evaluate((el) => {
      const style = getComputedStyle(el);
      return (
        el.scrollHeight > el.clientHeight + 1 ||
        style.overflow !== "visible" ||
        style.getPropertyValue("-webkit-line-clamp") !== "none"
      );
    });
    expect(cut).toBe(false);
    await expect(h1).toBeInViewport({ ratio: 1 });
    const captionPx = await h1.evaluate((el) => parseFloat(getComputedStyle(el).fontSize));
    expect(captionPx).toBeGreaterThanOrEqual(30);
    // Figures large enough for the back of a room.
    const figurePx = await page
      .getByTestId("high-level-figure")
      .evaluate((el) => parseFloat(getComputedStyle(el).fontSize));
    expect(figurePx).toBeGreaterThanOrEqual(32);
    // Next and back, with their keys, on screen.
    await expect(page.getByRole("button", { name: /Next roof/ })).toContainText("→");
    await expect(page.getByRole("button", { name: /Previous roof/ })).toContainText("←");
    await expect(page.getByRole("button", { name: /Next roof/ })).toBeInViewport();
    await page.screenshot({ path: `${RESULTS}/present-${viewport.width}x${viewport.height}.png` });

    // The right arrow key steps on.
    await page.locator("body").press("ArrowRight");
    await expect(page.getByLabel(/^Step 2 of/)).toBeVisible();
    await context.close();
  }
});

test("followers: waiting, live, paused, ended; the caption follows the trainer's edit; hands up reach the wall and the screen", async ({
  browser,
}) => {
  test.setTimeout(300_000);
  const trainer = await signedIn(browser, "trainer@tidemark.example", DESK);
  const classId = await demoClass(trainer.page);
  // A session left over from another test ends first, so the followers start from "ended".
  const tess = await signedIn(browser, "trainee@tidemark.example", FOLLOWER);
  const marco = await signedIn(browser, "trainee2@tidemark.example", FOLLOWER);
  for (const f of [tess.page, marco.page]) await f.goto(`/classes/${classId}/follow`);
  await expect(status(tess.page)).toHaveAttribute("data-state", /waiting|ended|live/);

  await trainer.page.goto(`/classes/${classId}/present`);
  await expect(trainer.page.getByRole("status").filter({ hasText: "the class sees this" })).toBeVisible();
  const caption = (await trainer.page.getByRole("heading", { level: 1 }).textContent())!.trim();
  for (const f of [tess.page, marco.page]) {
    await expect(status(f)).toHaveText("Live · connected", { timeout: 15_000 });
    await expect(f.getByRole("heading", { level: 2, name: caption })).toBeVisible();
  }

  // Pause: followers are told, in words.
  await trainer.page.getByRole("button", { name: "Pause" }).click();
  await expect(status(tess.page)).toHaveText("Paused by the trainer", { timeout: 15_000 });
  await expect(tess.page.getByTestId("phase-note")).toContainText("paused");
  await trainer.page.getByRole("button", { name: "Resume" }).click();
  await expect(status(tess.page)).toHaveText("Live · connected", { timeout: 15_000 });

  // The trainer changes the base fall: the caption now describes the roof on screen.
  await trainer.page.getByText("Falls, joists and rules").click();
  const baseFall = trainer.page.getByLabel("Base fall", { exact: true });
  await baseFall.fill("1:40");
  await baseFall.press("Enter");
  await expect(trainer.page.getByRole("heading", { level: 1 })).toHaveText(/^Changed live: .*base fall 1:40$/);
  await expect(tess.page.locator("#live-title")).toHaveText(/^Changed live: .*base fall 1:40$/, {
    timeout: 15_000,
  });
  await expect(tess.page.getByTestId("roof-summary")).toContainText("Base fall 1:40");

  // Two trainees hand up their own roofs.
  for (const [f, x, note] of [
    [tess.page, "2", "Outlet to the left"],
    [marco.page, "5", "Outlet to the right"],
  ] as const) {
    await f.getByRole("tab", { name: "My roof · hand up" }).click();
    const outletX = f.getByTestId("hand-up-panel").getByLabel("Outlet O1 x");
    await expect(outletX).toBeEditable();
    await outletX.fill(x);
    await outletX.press("Tab");
    await f.getByLabel("A note for the trainer (optional)").fill(note);
    await f.getByRole("button", { name: "Hand up" }).click();
    await expect(f.getByTestId("hand-up-panel").locator('span[role="status"][data-state]')).toContainText(
      "Your hand is up",
    );
  }

  // The trainer's wall shows both, each with its plan and key figure.
  const toggle = trainer.page.getByTestId("wall-toggle");
  await expect(toggle).toHaveText(/Hands up \(2\)/, { timeout: 15_000 });
  await toggle.click();
  const wall = trainer.page.getByTestId("hand-up-wall");
  const tiles = wall.getByTestId("hand-up");
  await expect(tiles).toHaveCount(2);
  await expect(tiles.nth(0)).toContainText("Tess Quinlan");
  await expect(tiles.nth(0)).toContainText("Outlet to the left");
  await expect(tiles.nth(1)).toContainText("Marco Ellery");
  for (const t of [tiles.nth(0), tiles.nth(1)]) {
    await expect(t.getByRole("img", { name: /Plan of/ })).toBeVisible();
    await expect(t.getByTestId("hand-up-figures")).toContainText(/High level\s*\d+ mm/);
  }

  // Marco's roof goes on the shared screen; Tess, back on the trainer's screen, sees it.
  await tiles.nth(1).getByRole("button", { name: "Show to the class" }).click();
  await expect(trainer.page.getByRole("heading", { level: 1 })).toHaveText(
    "Handed up by Marco Ellery: “Outlet to the right”",
  );
  await tess.page.getByRole("tab", { name: "Trainer’s screen" }).click();
  await expect(tess.page.locator("#live-title")).toHaveText("Handed up by Marco Ellery: “Outlet to the right”", {
    timeout: 15_000,
  });
  await expect(tess.page.getByLabel("Outlet O1 x")).toHaveValue("5");
  await expect(tess.page.getByLabel("Outlet O1 x")).toBeDisabled();

  // The trainer stops presenting: both followers are told the session ended.
  await trainer.page.getByRole("button", { name: "Stop presenting" }).click();
  await expect(trainer.page).toHaveURL(new RegExp(`/classes/${classId}$`));
  for (const f of [tess.page, marco.page]) {
    await expect(status(f)).toHaveText("Ended · the trainer stopped presenting", { timeout: 15_000 });
    await expect(status(f)).toHaveAttribute("data-state", "ended");
  }
  await expect(marco.page.getByRole("button", { name: "Hand up" })).toBeDisabled();

  for (const c of [trainer, tess, marco]) await c.context.close();
});

test("a presenter's tab that goes elsewhere without Stop pauses the session; coming back finds it paused", async ({
  browser,
}) => {
  test.setTimeout(180_000);
  const trainer = await signedIn(browser, "trainer@tidemark.example", DESK);
  const classId = await demoClass(trainer.page);
  const tess = await signedIn(browser, "trainee@tidemark.example", FOLLOWER);
  await tess.page.goto(`/classes/${classId}/follow`);
  await trainer.page.goto(`/classes/${classId}/present`);
  await expect(trainer.page.getByRole("status").filter({ hasText: "the class sees this" })).toBeVisible();
  await expect(status(tess.page)).toHaveText("Live · connected", { timeout: 15_000 });

  // The trainer's tab leaves present mode by a full navigation, not by "Stop presenting".
  await trainer.page.goto("/lessons");
  await expect(status(tess.page)).toHaveText("Paused by the trainer", { timeout: 15_000 });

  // Back in present mode the session is there, paused, and resumes with one press.
  await trainer.page.goto(`/classes/${classId}/present`);
  await trainer.page.getByRole("button", { name: "Resume" }).click();
  await expect(status(tess.page)).toHaveText("Live · connected", { timeout: 15_000 });
  await trainer.page.getByRole("button", { name: "Stop presenting" }).click();
  await expect(status(tess.page)).toHaveAttribute("data-state", "ended", { timeout: 15_000 });
  for (const c of [trainer, tess]) await c.context.close();
});
