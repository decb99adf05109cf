import { expect, test } from "@playwright/test";

test("home page names Fallwright and every request stays on the local server, fonts included", async ({
  page,
  baseURL,
}) => {
  const origin = new URL(baseURL!).origin;
  const requests: string[] = [];
  page.on("request", (r) => requests.push(r.url()));
  await page.goto("/");
  await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
  await expect(page.getByRole("link", { name: "Fallwright" }).first()).toBeVisible();
  await page.waitForLoadState("networkidle");
  // The bundled Space Grotesk face is really in use, not a fallback.
  const fontLoaded = await page.evaluate(async () => {
    await document.fonts.ready;
    return (
      document.fonts.check('16px "Space Grotesk"') &&
      [...document.fonts].some((f) => f.family.includes("Space Grotesk") && f.status === "loaded")
    );
  });
  expect(fontLoaded).toBe(true);
  expect(requests.some((u) => /\.woff2?(\?|$)/.test(u))).toBe(true);
  const foreign = requests.filter((u) => !u.startsWith(origin) && !u.startsWith("data:") && !u.startsWith("blob:"));
  expect(foreign).toEqual([]);
});

test("an unknown page shows the friendly 404", async ({ page }) => {
  const response = await page.goto("/no-such-page");
  expect(response?.status()).toBe(404);
  await expect(page.getByRole("heading", { name: "Nothing here" })).toBeVisible();
  await expect(page.getByText(/at .*\.js/)).toHaveCount(0);
});

test("the safety caution is on every page", async ({ page }) => {
  await page.goto("/");
  await expect(page.getByRole("note").filter({ hasText: "designer of record" })).toBeVisible();
});

test("signed in, the home page picks up where each person left off", async ({ browser }) => {
  const open = async (email: string) => {
    const context = await browser.newContext();
    const page = await context.newPage();
    await page.goto("/login");
    await page.getByLabel("E-mail").fill(email);
    await page.getByLabel("Password").fill("fallwright-demo");
    await page.getByRole("button", { name: "Sign in" }).click();
    await expect(page).not.toHaveURL(/\/login/);
    await page.goto("/");
    return { context, desk: page.getByTestId("desk") };
  };

  // The seeded trainee passed lesson 1 and has lesson 6 assigned, untried, due 5 March 2027.
  const trainee = await open("trainee@tidemark.example");
  await expect(trainee.desk.getByRole("heading", { name: "Welcome back, Tess Quinlan" })).toBeVisible();
  const todo = trainee.desk.getByRole("listitem").filter({ hasText: "The longest fall line" });
  await expect(todo).toContainText("Parapet roofs, spring cohort · due 5 Mar 2027");
  await expect(todo.getByRole("link")).toHaveAttribute("href", "/lessons/the-longest-fall-line");
  await expect(trainee.desk).not.toContainText("Reading and converting falls");
  await trainee.context.close();

  const trainer = await open("trainer@tidemark.example");
  await expect(trainer.desk.getByRole("link", { name: "Parapet roofs, spring cohort" })).toBeVisible();
  await expect(trainer.desk).not.toContainText("Still to pass");
  await trainer.context.close();
});

test("the home sketch's contour arcs stay inside the parapet they call level", async ({ page }) => {
  await page.goto("/");
  const contours = page.getByTestId("home-contours");
  // Without the clip the widest arc starts 86 units left of the sketch's parapet.
  const { clipped, parapet, clip } = await contours.evaluate((g) => {
    const svg = (g as SVGGElement).ownerSVGElement!;
    const id = /url\(#(.+)\)/.exec(g.getAttribute("clip-path") ?? "")?.[1];
    const clipRect = id ? svg.querySelector(`#${id} rect`) : null;
    const outline = svg.querySelector(":scope > rect")!;
    const box = (e: Element) => {
      const n = (a: string) => Number(e.getAttribute(a));
      return { x: n("x"), y: n("y"), width: n("width"), height: n("height") };
    };
    return { clipped: !!clipRect, parapet: box(outline), clip: clipRect ? box(clipRect) : null };
  });
  expect(clipped).toBe(true);
  expect(clip!.x).toBeGreaterThanOrEqual(parapet.x);
  expect(clip!.y).toBeGreaterThanOrEqual(parapet.y);
  expect(clip!.x + clip!.width).toBeLessThanOrEqual(parapet.x + parapet.width);
  expect(clip!.y + clip!.height).toBeLessThanOrEqual(parapet.y + parapet.height);
});
