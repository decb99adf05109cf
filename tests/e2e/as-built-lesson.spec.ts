import { expect, test } from "@playwright/test";

// Issue 21, item 5: a trainee reads the survey of a built deck in lesson 13 and reports what the
// builder got wrong; the server marks the findings with the engine's own as-built check.
const SLUG = "checking-the-built-deck";

test("a trainee finds the low joist end, the pond and the verdict, and passes the as-built lesson", async ({
  page,
}) => {
  test.setTimeout(90_000);
  await page.goto(`/login?redirectTo=${encodeURIComponent(`/lessons/${SLUG}`)}`);
  await page.getByLabel("E-mail").fill("trainee@tidemark.example");
  await page.getByLabel("Password").fill("fallwright-demo");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page).toHaveURL(new RegExp(`/lessons/${SLUG}$`));
  await expect(page.getByRole("heading", { level: 1, name: "Checking the built deck" })).toBeVisible();

  // The survey is on the page: J4 start designed at 25 mm, measured at 9 mm.
  const row = page.getByTestId("survey-table").getByRole("row", { name: /^J4 start/ });
  await expect(row).toContainText("25");
  await expect(row).toContainText("9");

  await page.getByTestId("question-pack-amount").getByRole("textbox").fill("11 mm");
  await page.getByTestId("question-spill-depth").getByRole("textbox").fill("8");
  await page.getByLabel(/^Reject: the standing water is past its own limit/).check();

  // First the verdict wrong: the required finding fails and says why.
  await page.getByLabel(/Which point is furthest from the design/).selectOption("J4 start");
  await page.getByLabel(/What to do at that point/).fill("pack up 16 mm");
  await page.getByLabel(/Where water stands deepest/).selectOption("J4 start");
  await page.getByLabel(/How deep the deepest water stands/).fill("8 mm");
  await page.getByLabel(/Accept or reject the deck/).selectOption("accept");
  await page.getByRole("button", { name: "Submit answers and findings" }).click();
  const summary = page.getByTestId("score-summary");
  await expect(summary).toContainText("Not passed");
  await expect(summary).toContainText("Survey check: 4 of 5 findings right");
  await expect(page.getByTestId("feedback-task-verdict")).toContainText("This deck must be rejected: J4 start");

  await page.getByLabel(/Accept or reject the deck/).selectOption("reject");
  await page.getByRole("button", { name: "Submit again" }).click();
  await expect(summary).toContainText("Passed");
  await expect(summary.getByTestId("grade-score")).toHaveText("100 / 100");
  await expect(page.getByTestId("feedback-task-worst-fix")).toContainText("packed up 16 mm");
});

test("the survey's plan draws the roof and labels every point without one label running into another", async ({
  page,
}) => {
  test.setTimeout(90_000);
  await page.goto(`/login?redirectTo=${encodeURIComponent(`/lessons/${SLUG}`)}`);
  await page.getByLabel("E-mail").fill("trainee@tidemark.example");
  await page.getByLabel("Password").fill("fallwright-demo");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page).toHaveURL(new RegExp(`/lessons/${SLUG}$`));
  const plan = page.getByRole("img", { name: /^Plan of the \d+ surveyed points$/ });
  await plan.scrollIntoViewIfNeeded();
  const count = Number((await plan.getAttribute("aria-label"))!.match(/\d+/)![0]);
  // The roof's outline is drawn (it was given as path data it is not, and vanished).
  const outline = (await plan.locator("polygon").boundingBox())!;
  expect(outline.width).toBeGreaterThan(100);
  const frame = (await plan.boundingBox())!;
  const labels = plan.locator("text");
  await expect(labels).toHaveCount(count);
  const boxes = await labels.evaluateAll((els) =>
    els.map((el) => {
      const r = el.getBoundingClientRect();
      return { text: el.textContent ?? "", x: r.x, y: r.y, w: r.width, h: r.height };
    }),
  );
  for (const a of boxes) {
    // Inside the figure, and big enough to read (at least 8 px).
    expect(a.x, a.text).toBeGreaterThanOrEqual(frame.x - 0.5);
    expect(a.x + a.w, a.text).toBeLessThanOrEqual(frame.x + frame.width + 0.5);
    expect(a.y, a.text).toBeGreaterThanOrEqual(frame.y - 0.5);
    expect(a.y + a.h, a.text).toBeLessThanOrEqual(frame.y + frame.height + 0.5);
    expect(Math.min(a.w, a.h), a.text).toBeGreaterThanOrEqual(8);
    for (const b of boxes) {
      if (a === b) continue;
      const overlap = Math.min(a.x + a.w, b.x + b.w) - Math.max(a.x, b.x);
      const overlapY = Math.min(a.y + a.h, b.y + b.h) - Math.max(a.y, b.y);
      expect(overlap > 0.5 && overlapY > 0.5, `${a.text} runs into ${b.text}`).toBe(false);
    }
  }
});
