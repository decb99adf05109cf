import { expect, test, type CDPSession, type Locator, type Page } from "@playwright/test";
import fs from "node:fs";
import { signIn } from "./support/session";

// A phone in portrait: touch only, 390 × 844 CSS px.
test.use({ viewport: { width: 390, height: 844 }, hasTouch: true, isMobile: true });
// Software WebGL redraws the 3D view after every touch move on a shared two-core machine.
test.describe.configure({ timeout: 300_000 });

// Demo roof (components/sandbox/state/demo-roof.ts): 12 m × 8 m, one outlet at (6, 0), base fall 2°:
// H = 8 m × tan 2° = 279 mm (docs/roof-method.md §3/§4).
const H_DEMO = "279 mm";

async function openSandbox(page: Page) {
  await page.goto("/sandbox");
  await page.evaluate(() => sessionStorage.clear());
  await page.reload();
  await expect(page.getByTestId("high-level-figure")).toHaveText(H_DEMO, { timeout: 60_000 });
  await expect(page.getByTestId("engine-status")).toHaveAttribute("data-computing", "false");
}

async function centre(locator: Locator) {
  const box = (await locator.boundingBox())!;
  return { x: box.x + box.width / 2, y: box.y + box.height / 2 };
}

/** Real touch input (Chromium turns it into pointer events with pointerType "touch"). */
async function touchDrag(cdp: CDPSession, from: { x: number; y: number }, to: { x: number; y: number }) {
  await cdp.send("Input.dispatchTouchEvent", { type: "touchStart", touchPoints: [{ ...from, id: 1 }] });
  for (let i = 1; i <= 10; i++) {
    const p = { x: from.x + ((to.x - from.x) * i) / 10, y: from.y + ((to.y - from.y) * i) / 10 };
    await cdp.send("Input.dispatchTouchEvent", { type: "touchMove", touchPoints: [{ ...p, id: 1 }] });
  }
  await cdp.send("Input.dispatchTouchEvent", { type: "touchEnd", touchPoints: [] });
}

test("phone: the plan's handles and buttons are 44 px targets, the tables are cards, the fields are wide", async ({
  page,
}) => {
  await openSandbox(page);
  const outline = page.getByTestId("outline-card");
  // Every button in the outline and outlet cards (+ outlet, + vertex, delete) is visible and at least 44 × 44.
  const buttons = outline.getByRole("button");
  expect(await buttons.count()).toBeGreaterThan(8);
  for (const b of await buttons.all()) {
    await b.scrollIntoViewIfNeeded();
    await expect(b).toBeInViewport();
    const box = (await b.boundingBox())!;
    expect(box.width, (await b.getAttribute("aria-label")) ?? "").toBeGreaterThanOrEqual(44);
    expect(box.height).toBeGreaterThanOrEqual(44);
    expect(box.x + box.width).toBeLessThanOrEqual(390);
  }
  // Inputs are wide enough to read "12.00" (they were one character wide in the squeezed table).
  for (const id of ["vertex-0-x", "vertex-0-y", "vertex-3-x"]) {
    const box = (await page.getByTestId(id).boundingBox())!;
    expect(box.width).toBeGreaterThan(120);
    expect(box.height).toBeGreaterThanOrEqual(44);
  }
  // Plan handles: the touch area around each small corner square and outlet disc is 44 × 44.
  for (const id of ["vertex-0", "vertex-2", "outlet-0"]) {
    const box = (await page.getByTestId(id).boundingBox())!;
    expect(box.width).toBeGreaterThanOrEqual(43.5);
    expect(box.height).toBeGreaterThanOrEqual(43.5);
  }
  for (const id of ["plan-zoom-in", "plan-zoom-out", "plan-fit"]) {
    const box = (await page.getByTestId(id).boundingBox())!;
    expect(box.width).toBeGreaterThanOrEqual(44);
    expect(box.height).toBeGreaterThanOrEqual(44);
  }
  // Edge labels stay inside the plan (the side edges' labels were clipped to "00 m").
  const plan = (await page.getByTestId("plan").boundingBox())!;
  for (const label of await page.getByTestId("plan").locator("text").all()) {
    const box = await label.boundingBox();
    if (!box || !(await label.textContent())?.includes("m")) continue;
    expect(box.x).toBeGreaterThanOrEqual(plan.x - 0.5);
    expect(box.x + box.width).toBeLessThanOrEqual(plan.x + plan.width + 0.5);
  }
  // Nothing on the page scrolls sideways.
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
});

test("phone: drag a corner and an outlet by touch, pinch the plan, edit a value; the figures follow", async ({
  page,
}) => {
  await openSandbox(page);
  const cdp = await page.context().newCDPSession(page);
  const plan = page.getByTestId("plan");
  await plan.scrollIntoViewIfNeeded();
  // Screen px per metre from the centres of corners 1 (0, 0) and 2 (12, 0), 12 m apart (an edge's
  // box also holds its touch margin).
  const metre = async () =>
    ((await centre(page.getByTestId("vertex-1"))).x - (await centre(page.getByTestId("vertex-0"))).x) / 12;
  const perMetre = await metre();

  // Corner 3 (12, 8) dragged 2 m up by a finger: the roof is 12 m × 10 m, H = 10 m × tan 2° = 349 mm.
  const corner = await centre(page.getByTestId("vertex-2"));
  await touchDrag(cdp, corner, { x: corner.x, y: corner.y - 2.02 * perMetre });
  // Where a finger lands is not exact: within one grid step (250 mm) of 10 m.
  await expect.poll(async () => Number(await page.getByTestId("vertex-2-y").inputValue())).toBeGreaterThan(9.7);
  expect(Number(await page.getByTestId("vertex-2-y").inputValue())).toBeLessThan(10.3);
  await expect(page.getByTestId("longest-fall-figure")).not.toContainText("10.0 m at 1:35.8");

  // The outlet slides along its edge from x = 6 m to x = 3 m.
  // (The plan refitted to the taller roof: measure its scale again.)
  const scale = await metre();
  const outlet = await centre(page.getByTestId("outlet-0"));
  await touchDrag(cdp, outlet, { x: outlet.x - 3 * scale, y: outlet.y });
  const outletX = page.getByTestId("outlet-table").locator("tbody tr").first().locator("input").first();
  await expect.poll(async () => Number(await outletX.inputValue())).toBeLessThan(3.3);
  expect(Number(await outletX.inputValue())).toBeGreaterThan(2.7);
  await expect(page.getByTestId("catchments")).toBeVisible();

  // Two fingers spread apart on the plan's background: it zooms in (and the zoom control zooms back out).
  const viewBox = async () => Number((await plan.getAttribute("viewBox"))!.split(" ")[2]);
  await page.getByTestId("plan-fit").tap();
  const before = await viewBox();
  const p = (await plan.boundingBox())!;
  const mid = { x: p.x + p.width / 2, y: p.y + p.height * 0.35 };
  await cdp.send("Input.dispatchTouchEvent", {
    type: "touchStart",
    touchPoints: [
      { x: mid.x - 20, y: mid.y, id: 1 },
      { x: mid.x + 20, y: mid.y, id: 2 },
    ],
  });
  for (let i = 1; i <= 8; i++) {
    await cdp.send("Input.dispatchTouchEvent", {
      type: "touchMove",
      touchPoints: [
        { x: mid.x - 20 - 5 * i, y: mid.y, id: 1 },
        { x: mid.x + 20 + 5 * i, y: mid.y, id: 2 },
      ],
    });
  }
  await cdp.send("Input.dispatchTouchEvent", { type: "touchEnd", touchPoints: [] });
  // The fingers went from 40 px to 120 px apart: three times closer.
  await expect.poll(async () => before / (await viewBox())).toBeGreaterThan(2.5);
  expect(before / (await viewBox())).toBeLessThan(3.5);
  await page.getByTestId("plan-fit").tap();
  await expect.poll(viewBox).toBeCloseTo(before, 3);
  await page.getByTestId("plan-zoom-in").tap();
  await expect.poll(async () => before / (await viewBox())).toBeCloseTo(1.5, 3);
  await page.getByTestId("plan-fit").tap();

  // Values typed on the phone: corners 3 and 4 at y = 10 make a 12 m × 10 m rectangle, H = 349 mm.
  for (const id of ["vertex-2-y", "vertex-3-y"]) {
    await page.getByTestId(id).tap();
    await page.getByTestId(id).fill("10");
  }
  await expect(page.getByTestId("high-level-figure")).toHaveText("349 mm");
});

test.describe("tablet", () => {
  // A tablet in portrait, touch only: wider than the phone layout (40rem), so the 44 px rule applies
  // through the coarse pointer alone. Chromium reports (pointer: coarse) once touch emulation is on.
  test.use({ viewport: { width: 820, height: 1180 }, hasTouch: true, isMobile: true });

  test("tablet: the pointer is coarse and the sandbox's buttons and handles are 44 px targets", async ({ page }) => {
    await openSandbox(page);
    expect(await page.evaluate(() => matchMedia("(pointer: coarse)").matches)).toBe(true);
    const buttons = page.getByTestId("outline-card").getByRole("button");
    expect(await buttons.count()).toBeGreaterThan(8);
    for (const b of [
      ...(await buttons.all()),
      ...["plan-zoom-in", "plan-zoom-out", "plan-fit"].map((id) => page.getByTestId(id)),
    ]) {
      const box = (await b.boundingBox())!;
      expect(box.width, (await b.getAttribute("aria-label")) ?? "").toBeGreaterThanOrEqual(44);
      expect(box.height).toBeGreaterThanOrEqual(44);
    }
    for (const id of ["vertex-0", "vertex-2", "outlet-0"]) {
      const box = (await page.getByTestId(id).boundingBox())!;
      expect(box.width).toBeGreaterThanOrEqual(43.5);
      expect(box.height).toBeGreaterThanOrEqual(43.5);
    }
    // The toolbar's check boxes ("Snap to grid", "Right angles") are worked through their labels,
    // which are 44 px tall (they were a 13 px box and one line of text).
    for (const name of ["Snap to grid", "Right angles"]) {
      const label = page.locator("label").filter({ has: page.getByRole("checkbox", { name }) });
      const box = (await label.boundingBox())!;
      expect(box.height, name).toBeGreaterThanOrEqual(44);
    }
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(820);
  });
});

test("phone: the drop schedule is one card per joist, nothing scrolls sideways, and it agrees with the CSV", async ({
  page,
}) => {
  await openSandbox(page);
  const schedule = page.getByTestId("drop-schedule");
  await schedule.scrollIntoViewIfNeeded();
  // The sortable table once it has loaded (it replaces the plain one when the schedule comes near).
  const table = page.getByTestId("schedule-table");
  await expect(table.locator("tbody tr")).toHaveCount(31);
  const region = schedule.getByRole("region", { name: "Drop schedule rows" });
  // Neither the schedule's own box nor the page is wider than the phone.
  const overflow = await region.evaluate((el) => el.scrollWidth - el.clientWidth);
  expect(overflow).toBeLessThanOrEqual(0);
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
  // The header row is hidden; each joist is a card inside the screen, its figures labelled.
  await expect(table.locator("thead")).not.toBeInViewport();
  const card = table.locator("tbody tr").first();
  const box = (await card.boundingBox())!;
  expect(box.x).toBeGreaterThanOrEqual(0);
  expect(box.x + box.width).toBeLessThanOrEqual(390);
  const figure = async (label: string) => {
    const cell = card.locator(`td[data-label="${label}"]`);
    await expect(cell).toBeInViewport();
    return (await cell.textContent())!.trim();
  };
  // A start and its end sit side by side on one line of the card.
  const [start, end] = [
    (await card.locator('td[data-label="Start level (mm)"]').boundingBox())!,
    (await card.locator('td[data-label="End level (mm)"]').boundingBox())!,
  ];
  expect(Math.abs(start.y - end.y)).toBeLessThan(1);
  expect(end.x).toBeGreaterThan(start.x);

  // The first joist's figures equal the first row of the CSV the page downloads.
  const [download] = await Promise.all([page.waitForEvent("download"), page.getByTestId("download-csv").tap()]);
  const text = fs.readFileSync((await download.path())!, "utf8").replace(/^\uFEFF/, "");
  const [header, first] = text
    .trim()
    .split(/\r?\n,*\r?\n/)
    .pop()!
    .split(/\r?\n/)
    .map((l) => l.split(","));
  const csv = (name: string) => first[header.indexOf(name)];
  expect(await figure("Joist")).toBe(csv("joist"));
  expect(Number(await figure("Offset (m)"))).toBe(Number(csv("offset_m")));
  expect(Number(await figure("Length (m)"))).toBe(Number(csv("length_m")));
  expect(await figure("Start level (mm)")).toBe(csv("start_level_mm"));
  expect(await figure("End level (mm)")).toBe(csv("end_level_mm"));
  expect(await figure("Start drop below H (mm)")).toBe(csv("start_drop_below_H_mm"));
  expect(await figure("End drop below H (mm)")).toBe(csv("end_drop_below_H_mm"));
  expect(await figure("Fall")).toBe(csv("fall"));
  // Not a roof where every figure is zero: the first joist falls towards its outlet.
  expect(Number(csv("end_level_mm")) + Number(csv("start_level_mm"))).toBeGreaterThan(0);

  // Sorting is still there: the phone's "Sort by" puts the flattest span (level, or the largest N of 1:N) first.
  const rows = text
    .trim()
    .split(/\r?\n,*\r?\n/)
    .pop()!
    .split(/\r?\n/)
    .slice(1);
  const falls = rows.map((l) => l.split(",")[header.indexOf("fall")]);
  const n = (fall: string) => (fall === "level" ? Infinity : Number(fall.replace(/^1:/, "")));
  const flattest = falls.reduce((a, b) => (n(b) > n(a) ? b : a));
  const steepest = falls.reduce((a, b) => (n(b) < n(a) ? b : a));
  expect(flattest).not.toBe(steepest);
  await page.getByLabel("Sort by").selectOption({ label: "Fall, flattest first" });
  const top = table.locator("tbody tr").first().locator('td[data-label="Fall"]');
  await expect(top).toHaveText(flattest);
  await page.getByLabel("Sort by").selectOption({ label: "Fall, steepest first" });
  await expect(top).toHaveText(steepest);
});

test("phone: the plan's hints say tap, not click, and the page hydrates without a mismatch", async ({ page }) => {
  const errors: string[] = [];
  page.on("console", (m) => {
    if (m.type() === "error") errors.push(m.text());
  });
  page.on("pageerror", (e) => errors.push(e.message));
  await openSandbox(page);
  // The server cannot know the pointer; once mounted the page asks the browser (pointer: coarse).
  expect(await page.evaluate(() => matchMedia("(pointer: coarse)").matches)).toBe(true);
  const aside = page.getByTestId("plan-card").getByText(/an edge for an outlet/);
  await expect(aside).toHaveText("drag corners · tap an edge for an outlet · double-tap to add a corner");
  await expect(page.getByTestId("fall-map-card")).toContainText("drag to turn · pinch to zoom");
  const hint = page.getByTestId("plan-tool-hint");
  await page.getByTestId("draw-ridge").tap();
  await expect(hint).toContainText("Drawing a ridge: tap a wall where it starts.");
  await page.getByTestId("draw-opening").tap();
  await expect(hint).toContainText("Drawing an opening: drag from one corner to the opposite one, or tap both.");
  await expect(page.getByTestId("draw-opening")).toHaveAttribute("title", /drag or tap two corners/);
  await expect(page.getByTestId("plan-card")).not.toContainText(/click/i);
  expect(errors.filter((e) => /hydrat/i.test(e))).toEqual([]);
});

test("phone: the header is one row; Menu opens the links and the account, and closes on the next page", async ({
  page,
}) => {
  await signIn(page, "trainee@tidemark.example");
  await page.goto("/lessons");
  // The button works once React has hydrated the page (the root marks <html data-hydrated>).
  await expect(page.locator("html[data-hydrated]")).toHaveCount(1);
  const header = page.getByRole("banner");
  const menu = page.getByRole("button", { name: "Menu" });
  const nav = page.getByRole("navigation", { name: "Main" });
  // Closed, the header is the name and the button: one row, not the four the links and account took.
  await expect(menu).toHaveAttribute("aria-expanded", "false");
  await expect(nav).toBeHidden();
  await expect(page.getByRole("button", { name: "Sign out" })).toBeHidden();
  expect((await header.boundingBox())!.height).toBeLessThan(90);
  await menu.click();
  await expect(page.getByRole("button", { name: "Close menu" })).toHaveAttribute("aria-expanded", "true");
  await expect(nav).toBeVisible();
  await expect(page.getByRole("button", { name: "Sign out" })).toBeVisible();
  // Every link in it is a finger's size (44 px tall or more, WCAG 2.5.5).
  for (const link of await nav.getByRole("link").all())
    expect((await link.boundingBox())!.height).toBeGreaterThanOrEqual(44);
  await nav.getByRole("link", { name: "Sandbox" }).click();
  await expect(page).toHaveURL(/\/sandbox$/);
  await expect(page.getByRole("button", { name: "Menu" })).toHaveAttribute("aria-expanded", "false");
  await expect(nav).toBeHidden();
});

test("phone: signed out, Sign in stays beside the menu, once", async ({ page }) => {
  await page.goto("/");
  await expect(page.getByRole("button", { name: "Menu" })).toHaveAttribute("aria-expanded", "false");
  const signIn = page.getByRole("banner").getByRole("link", { name: "Sign in" });
  await expect(signIn).toHaveCount(1);
  await expect(signIn).toBeVisible();
  await signIn.click();
  await expect(page).toHaveURL(/\/login$/);
});
