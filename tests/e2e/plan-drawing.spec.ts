import { expect, test, type Page } from "@playwright/test";

// Demo roof (components/sandbox/state/demo-roof.ts): 12 m × 8 m, outlet O1 at (6, 0), base fall 2°,
// high level 279 mm. "Add an outlet half-way along edge 4" puts O2 at (0, 4) on the west wall.
// Catchments below are the engine's answers for these shapes (docs/roof-method-plans.md P2, P4),
// each an area of plan rectangles:
// - ridge (3, 0) → (3, 8): west area 3 × 8 = 24 m² to O2, east area 9 × 8 = 72 m² to O1;
// - its north end moved to (4, 8): the west area is a trapezium (3 + 4)/2 × 8 = 28 m², east 68 m²;
// - a 1 m rooflight in the east area: O1 drains 72 − 1 = 71 m²; resized to 2 m × 2 m: 72 − 4 = 68 m²,
//   and it then stands in the way of the longest fall line, which grows from 10.0 m to 10.1 m.

// Each test makes several edits, each analysed by the engine; on a loaded machine that takes a while.
test.describe.configure({ timeout: 240_000 });

async function openSandbox(page: Page) {
  await page.goto("/sandbox");
  await page.evaluate(() => sessionStorage.clear());
  await page.reload();
  await expect(page.getByTestId("high-level-figure")).toHaveText("279 mm", { timeout: 90_000 });
  await expect(page.getByTestId("engine-status")).toHaveAttribute("data-computing", "false", { timeout: 60_000 });
}

/** Screen position of plan point (x, y), from the centres of corners 1 (0, 0) and 2 (12, 0). */
async function planScale(page: Page) {
  // The whole plan in view first: a button clicked below or above it may have scrolled the page.
  await page.getByTestId("plan").evaluate((el) => el.scrollIntoView({ block: "center" }));
  const a = (await page.getByTestId("vertex-0").boundingBox())!;
  const b = (await page.getByTestId("vertex-1").boundingBox())!;
  const x0 = a.x + a.width / 2;
  const y0 = a.y + a.height / 2;
  const perMetre = (b.x + b.width / 2 - x0) / 12;
  return (x: number, y: number) => [x0 + x * perMetre, y0 - y * perMetre] as const;
}

async function centre(page: Page, testId: string) {
  const box = (await page.getByTestId(testId).boundingBox())!;
  return [box.x + box.width / 2, box.y + box.height / 2] as const;
}

/** A mouse drag in small steps from screen point `from` to screen point `to`. */
async function drag(page: Page, from: readonly [number, number], to: readonly [number, number]) {
  await page.mouse.move(from[0], from[1]);
  await page.mouse.down();
  for (let i = 1; i <= 8; i++)
    await page.mouse.move(from[0] + ((to[0] - from[0]) * i) / 8, from[1] + ((to[1] - from[1]) * i) / 8);
  await page.mouse.up();
}

const catchments = (page: Page) => page.getByTestId("catchments");

test("plan by mouse: a ridge drawn by two clicks and its end dragged along a wall; an opening dragged out, moved and resized; each one undo step", async ({
  page,
}) => {
  await openSandbox(page);
  await page.getByRole("button", { name: "Add an outlet half-way along edge 4" }).click();
  await expect(catchments(page)).toContainText("Outlet O2", { timeout: 60_000 });

  // Ridge tool: a click just inside the south wall starts the ridge on it, one just inside the
  // north wall ends it there (both snap onto the wall).
  // The drawing tools are targets a mouse hits easily too (WCAG 2.2 2.5.8: at least 24 × 24 px).
  for (const id of ["draw-ridge", "draw-opening", "plan-zoom-in", "plan-fit"]) {
    const box = (await page.getByTestId(id).boundingBox())!;
    expect(Math.min(box.width, box.height), id).toBeGreaterThanOrEqual(24);
  }
  await page.getByTestId("draw-ridge").click();
  // A mouse (fine pointer): the hints say click; on a touch screen they say tap (phone.spec.ts).
  await expect(page.getByTestId("plan-card")).toContainText(
    "click an edge for an outlet · double-click to add a corner",
  );
  await expect(page.getByTestId("plan-tool-hint")).toContainText("Drawing a ridge: click a wall where it starts.");
  let at = await planScale(page);
  await page.mouse.click(...at(3.02, 0.1));
  await expect(page.getByTestId("plan-tool-hint")).toContainText("Ridge: 1 point");
  await page.mouse.click(...at(2.98, 7.9));
  await expect(page.getByTestId("plan-tool-hint")).toHaveCount(0);
  await expect(page.getByTestId("plan-ridge-0")).toBeAttached();
  await expect(page.getByTestId("ridge-0-point-0-x")).toHaveValue("3");
  await expect(page.getByTestId("ridge-0-point-0-y")).toHaveValue("0");
  await expect(page.getByTestId("ridge-0-point-1-x")).toHaveValue("3");
  await expect(page.getByTestId("ridge-0-point-1-y")).toHaveValue("8");
  await expect(page.getByTestId("scene-ridges")).toContainText("2 drainage areas", { timeout: 60_000 });
  await expect(catchments(page)).toContainText(/72\.0\sm²/);
  await expect(catchments(page)).toContainText(/24\.0\sm²/);
  // The advice now speaks per drainage area.
  await expect(page.getByTestId("joist-directions-area-1")).toBeAttached();

  // Drag the ridge's north end 1 m east and a little off the wall: it stays on the wall, at (4, 8).
  at = await planScale(page);
  await drag(page, await centre(page, "plan-ridge-0-point-1"), at(4.04, 8.3));
  await expect(page.getByTestId("ridge-0-point-1-x")).toHaveValue("4");
  await expect(page.getByTestId("ridge-0-point-1-y")).toHaveValue("8");
  await expect(catchments(page)).toContainText(/68\.0\sm²/, { timeout: 60_000 });
  await expect(catchments(page)).toContainText(/28\.0\sm²/);
  // The whole drag is one undo step.
  await page.getByTestId("undo").click();
  await expect(page.getByTestId("ridge-0-point-1-x")).toHaveValue("3");
  await expect(catchments(page)).toContainText(/72\.0\sm²/, { timeout: 60_000 });

  // Opening tool: drag out a 1 m square from (8, 5) to (9, 6).
  await page.getByTestId("draw-opening").click();
  at = await planScale(page);
  await drag(page, at(8.02, 5.03), at(8.98, 6.04));
  await expect(page.getByTestId("plan-opening-0")).toBeAttached();
  await expect(page.getByTestId("scene-upstands")).toContainText("rooflight, 150 mm", { timeout: 60_000 });
  await expect(catchments(page)).toContainText(/71\.0\sm²/, { timeout: 60_000 });
  await expect(page.getByTestId("engine-error")).toHaveCount(0);

  // Move it by its body 1 m east and 2 m south: (9, 3) to (10, 4).
  at = await planScale(page);
  await drag(page, at(8.5, 5.5), at(9.52, 3.46));
  await expect(page.getByTestId("plan-opening-0-body")).toHaveAttribute(
    "aria-label",
    /1\.00\sm by 1\.00\sm, from x 9\.00\sm, y 3\.00\sm/,
  );
  await expect(catchments(page)).toContainText(/71\.0\sm²/, { timeout: 60_000 });
  await expect(page.getByTestId("longest-fall-figure")).toContainText("10.0");

  // Chosen, it shows its corners: drag corner 3, (10, 4), to (11, 5). A 2 m square now.
  await drag(page, await centre(page, "plan-opening-0-corner-2"), at(11.03, 4.96));
  await expect(page.getByTestId("plan-opening-0-body")).toHaveAttribute(
    "aria-label",
    /2\.00\sm by 2\.00\sm, from x 9\.00\sm, y 3\.00\sm/,
  );
  await expect(catchments(page)).toContainText(/68\.0\sm²/, { timeout: 60_000 });
  await expect(page.getByTestId("longest-fall-figure")).toContainText("10.1", { timeout: 60_000 });
  await expect(page.getByTestId("scene-upstands")).toContainText("1 opening");

  // One undo takes the resize back, the next the move.
  await page.getByTestId("undo").click();
  await expect(page.getByTestId("plan-opening-0-body")).toHaveAttribute("aria-label", /1\.00\sm by 1\.00\sm, from x 9/);
  await page.getByTestId("undo").click();
  await expect(page.getByTestId("plan-opening-0-body")).toHaveAttribute("aria-label", /from x 8\.00\sm, y 5\.00\sm/);
});

test("plan by keyboard: a ridge point moved by the arrow keys, a bend added with +, the opening deleted", async ({
  page,
}) => {
  await openSandbox(page);
  await page.getByRole("button", { name: "Add an outlet half-way along edge 4" }).click();
  await page.getByTestId("add-ridge").click();
  for (const point of [0, 1]) {
    const x = page.getByTestId(`ridge-0-point-${point}-x`);
    await x.fill("3");
    await x.press("Enter");
  }
  await expect(page.getByTestId("scene-ridges")).toContainText("2 drainage areas", { timeout: 60_000 });
  // The start (3, 0) one grid step (250 mm) east along the south wall.
  await page.getByTestId("plan-ridge-0-point-0").focus();
  await page.keyboard.press("ArrowRight");
  await expect(page.getByTestId("ridge-0-point-0-x")).toHaveValue("3.25");
  // + adds a bend half-way to the next point: (3.125, 4).
  await page.keyboard.press("+");
  await expect(page.getByTestId("plan-ridge-0-point-2")).toBeAttached();
  await expect(page.getByTestId("ridge-0-point-1-x")).toHaveValue("3.125");
  await expect(page.getByTestId("ridge-0-point-1-y")).toHaveValue("4");
  await expect(page.getByTestId("plan-ridge-0-point-1")).toBeFocused();
  // Delete on the bend removes it, not the ridge.
  await page.keyboard.press("Delete");
  await expect(page.getByTestId("plan-ridge-0-point-2")).toHaveCount(0);
  await expect(page.getByTestId("plan-ridge-0")).toBeAttached();

  await page.getByTestId("add-opening").click();
  await page.getByTestId("plan-opening-0-body").focus();
  await page.keyboard.press("Shift+ArrowUp");
  await expect(page.getByTestId("plan-opening-0-body")).toHaveAttribute("aria-label", /from x 5\.50\sm, y 4\.50\sm/);
  await page.keyboard.press("Delete");
  await expect(page.getByTestId("plan-opening-0")).toHaveCount(0);
});

test.describe("plan by touch", () => {
  test.use({ hasTouch: true });

  test("a ridge drawn by taps on two walls with a bend between, and an opening by two taps", async ({ page }) => {
    await openSandbox(page);
    await page.getByRole("button", { name: "Add an outlet half-way along edge 4" }).click();
    await page.getByTestId("draw-ridge").click();
    const at = await planScale(page);
    await page.touchscreen.tap(...at(3, 0.15));
    await page.touchscreen.tap(...at(3.03, 4.02));
    await page.touchscreen.tap(...at(4, 7.85));
    await expect(page.getByTestId("plan-ridge-0")).toBeAttached();
    await expect(page.getByTestId("ridge-0-point-1-x")).toHaveValue("3");
    await expect(page.getByTestId("ridge-0-point-1-y")).toHaveValue("4");
    await expect(page.getByTestId("ridge-0-point-2-x")).toHaveValue("4");
    await expect(page.getByTestId("ridge-0-point-2-y")).toHaveValue("8");
    // West area: 3 × 4 plus (3 + 4)/2 × 4 = 26 m² to O2; east 70 m² to O1.
    await expect(catchments(page)).toContainText(/26\.0\sm²/, { timeout: 60_000 });
    await expect(catchments(page)).toContainText(/70\.0\sm²/);

    await page.getByTestId("draw-opening").click();
    await page.touchscreen.tap(...at(8, 5));
    await expect(page.getByTestId("plan-tool-hint")).toContainText("opposite corner");
    await page.touchscreen.tap(...at(9, 6));
    await expect(page.getByTestId("scene-upstands")).toContainText("rooflight, 150 mm", { timeout: 60_000 });
    await expect(catchments(page)).toContainText(/69\.0\sm²/, { timeout: 60_000 });
  });
});
