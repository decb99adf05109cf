import { expect, test, type Browser, type Page } from "@playwright/test";
import { makePdf } from "../support/pdf";
import { makePng } from "../support/png";
import { signIn } from "./support/session";

// Saved roofs in the browser: save and reload, underlay scale by two clicks, two tabs and a 409.

async function newRoof(page: Page, name: string, spec: unknown): Promise<string> {
  const res = await page.request.post("/api/v1/roofs", { data: { name, spec } });
  expect(res.status()).toBe(201);
  return (await res.json()).id;
}

async function roofJson(page: Page, id: string) {
  const res = await page.request.get(`/api/v1/roofs/${id}`);
  expect(res.status()).toBe(200);
  return res.json();
}

const RECT = (w: number, h: number) => ({
  outline: [
    [0, 0],
    [w, 0],
    [w, h],
    [0, h],
  ],
  outlets: [{ at: [w / 2, 0] }],
  baseFall: "1:60",
  joists: { spacing: 0.4 },
});
const unique = () => Math.random().toString(36).slice(2, 8);

test("save a roof from the sandbox, reload, and it is back", async ({ page }) => {
  await signIn(page, "designer@tidemark.example");
  await page.goto("/sandbox");
  await expect(page.getByTestId("sandbox-workspace")).toBeVisible();
  const name = `Saved from sandbox ${unique()}`;
  const spec = {
    outline: [
      [0, 0],
      [14, 0],
      [14, 8],
      [0, 8],
    ],
    outlets: [{ at: [7, 0] }],
    baseFall: "1:50",
    joists: { spacing: 0.45 },
  };
  // What the sandbox's "Save to my roofs" button posts: a form to /roofs/new.
  await page.evaluate(
    ({ name, spec }) => {
      const form = document.createElement("form");
      form.method = "post";
      form.action = "/roofs/new";
      for (const [k, v] of Object.entries({ name, spec: JSON.stringify(spec) })) {
        const input = document.createElement("input");
        input.type = "hidden";
        input.name = k;
        input.value = v;
        form.append(input);
      }
      document.body.append(form);
      form.submit();
    },
    { name, spec },
  );
  await expect(page).toHaveURL(/\/roofs\/[0-9a-f-]{36}\?saved=1$/);
  await expect(page.getByLabel("Roof name")).toHaveValue(name);
  await expect(page.getByTestId("save-status")).toHaveText("Saved · v1");

  await page.reload();
  await expect(page.getByLabel("Roof name")).toHaveValue(name);
  await expect(page.getByTestId("sandbox-workspace")).toBeVisible();
  // The plan shows the saved 14 m edge, and the library lists the roof.
  await expect(page.getByTestId("plan-card").getByText("14.00 m").first()).toBeVisible();
  await page.goto("/roofs");
  await expect(page.getByRole("link", { name })).toBeVisible();
});

test("upload a plan image, set its scale by two clicks and a typed distance, trace the outline", async ({ page }) => {
  await signIn(page, "designer@tidemark.example");
  const id = await newRoof(page, `Underlay ${unique()}`, RECT(24, 7.5));
  await page.goto(`/roofs/${id}`);
  await page.getByText("Plan underlay").click();

  // A white sheet with a black rectangle 600 × 300 px: it will be 12 m × 6 m.
  const png = makePng(800, 500, (x, y) =>
    (x >= 98 && x <= 102) || (x >= 698 && x <= 702)
      ? y >= 98 && y <= 402
        ? 0
        : 255
      : (y >= 98 && y <= 102) || (y >= 398 && y <= 402)
        ? x >= 98 && x <= 702
          ? 0
          : 255
        : 255,
  );
  await page.getByLabel(/Upload a plan image/).setInputFiles({ name: "plan.png", mimeType: "image/png", buffer: png });
  await expect(page.getByText("Image uploaded. Now set its scale")).toBeVisible();

  const canvas = page.getByTestId("underlay-canvas");
  const clickImage = async (x: number, y: number) => {
    // Image pixel → position inside the drawn <svg> (it is scaled to the panel's width).
    const position = await canvas.evaluate(
      (svg, [x, y]) => {
        const p = new DOMPoint(x, y).matrixTransform((svg as SVGSVGElement).getScreenCTM()!);
        const box = svg.getBoundingClientRect();
        return { x: p.x - box.left, y: p.y - box.top };
      },
      [x, y] as const,
    );
    await canvas.click({ position });
  };
  await clickImage(100, 400);
  await clickImage(700, 400);
  await page.getByLabel("Real distance").fill("12000 mm");
  await page.getByRole("button", { name: "Set scale" }).last().click();
  await expect(page.getByText(/Scale set: 6\d\d\.\d px = 12\.00 m/)).toBeVisible();

  await page.getByRole("button", { name: "Trace outline" }).click();
  for (const [x, y] of [
    [100, 400],
    [700, 400],
    [700, 100],
    [100, 100],
  ])
    await clickImage(x, y);
  await expect(page.getByText(/Traced edge 1: 1[12]\.\d\d m/)).toBeVisible();
  await page.getByRole("button", { name: "Use as outline" }).click();

  // The roof's outline edge, read back from the panel and from the saved roof, is the typed 12 m.
  const edgeText = await page
    .getByRole("list", { name: "Outline edge lengths" })
    .getByRole("listitem")
    .first()
    .textContent();
  expect(Math.abs(Number(/([\d.]+) m/.exec(edgeText!)![1]) - 12)).toBeLessThanOrEqual(0.03);
  await expect(page.getByTestId("save-status")).toHaveText("Saved · v2", { timeout: 15_000 });
  const saved = await roofJson(page, id);
  const [a, b] = saved.spec.outline;
  expect(saved.spec.outline).toHaveLength(4);
  expect(Math.abs(Math.hypot(b[0] - a[0], b[1] - a[1]) - 12)).toBeLessThanOrEqual(0.03);

  const image = await page.request.get(`/roofs/${id}/underlay`);
  expect(image.status()).toBe(200);
  expect(image.headers()["content-type"]).toBe("image/png");
  expect(image.headers()["x-content-type-options"]).toBe("nosniff");
  expect(Buffer.from(await image.body()).equals(png)).toBe(true);
});

test("a page of a PDF drawing becomes the underlay, drawn in the browser at 3000 px on its long side", async ({
  page,
}) => {
  await signIn(page, "designer@tidemark.example");
  const id = await newRoof(page, `PDF underlay ${unique()}`, RECT(12, 6));
  await page.goto(`/roofs/${id}`);
  await page.getByText("Plan underlay").click();

  // Page 1 is landscape 600 × 400 pt; page 2 portrait 300 × 600 pt with a rectangle stroked from
  // (50, 100) to (250, 500) pt, 4 pt wide (PDF origin at the bottom left).
  const pdf = makePdf([
    { width: 600, height: 400, content: "0 G 2 w 100 100 400 200 re S" },
    { width: 300, height: 600, content: "0 G 4 w 50 100 200 400 re S" },
  ]);
  await page
    .getByLabel(/Upload a plan image/)
    .setInputFiles({ name: "annex-drawings.pdf", mimeType: "application/pdf", buffer: pdf });
  const chooser = page.getByRole("group", { name: "Choose a page of the PDF" });
  await expect(chooser).toContainText("annex-drawings.pdf has 2 pages");
  await chooser.getByLabel("Page").fill("3");
  await chooser.getByRole("button", { name: "Use this page" }).click();
  await expect(page.getByRole("alert")).toHaveText("Pick a page from 1 to 2.");
  await chooser.getByLabel("Page").fill("2");
  await chooser.getByRole("button", { name: "Use this page" }).click();
  await expect(page.getByText("Image uploaded. Now set its scale")).toBeVisible({ timeout: 30_000 });
  // 3000 px / 600 pt = 5 px per point: 300 × 600 pt → 1500 × 3000 px.
  await expect(page.getByText("1500 × 3000 px")).toBeVisible();

  const image = await page.request.get(`/roofs/${id}/underlay`);
  expect(image.headers()["content-type"]).toBe("image/png");
  // The stroke lands where the page put it: x = 50 pt → 250 px; y = 600 − 300 pt → 1500 px.
  const shades = await page.evaluate(async (url) => {
    const bitmap = await createImageBitmap(await (await fetch(url)).blob());
    const canvas = new OffscreenCanvas(bitmap.width, bitmap.height);
    const ctx = canvas.getContext("2d")!;
    ctx.drawImage(bitmap, 0, 0);
    const at = (x: number, y: number) => ctx.getImageData(x, y, 1, 1).data[0];
    return { size: [bitmap.width, bitmap.height], edge: at(250, 1500), inside: at(750, 1500), top: at(750, 500) };
  }, `/roofs/${id}/underlay`);
  expect(shades.size).toEqual([1500, 3000]);
  expect(shades.edge).toBeLessThan(60);
  expect(shades.top).toBeLessThan(60);
  expect(shades.inside).toBeGreaterThan(200);

  // Bytes that are not a PDF, whatever the name says, get a clear message and nothing uploads.
  await page
    .getByLabel(/Upload a plan image/)
    .setInputFiles({ name: "not-really.pdf", mimeType: "application/pdf", buffer: Buffer.from("hello, plan") });
  await expect(page.getByRole("alert")).toContainText("not-really.pdf is not a PDF file");
  await expect(page.getByText("1500 × 3000 px")).toBeVisible();
});

async function openAs(browser: Browser, url?: string) {
  const context = await browser.newContext();
  const page = await context.newPage();
  await signIn(page, "designer@tidemark.example");
  if (url) {
    await page.goto(url);
    await expect(page.getByTestId("save-status")).toHaveText("Saved · v1");
  }
  return { context, page };
}

test("two tabs edit one roof: one saves, the other gets the 409 banner and keeps its work as a copy", async ({
  browser,
}) => {
  test.slow(); // three signed-in 3D pages at once, drawn by software WebGL
  const setup = await openAs(browser);
  const base = `Two tabs ${unique()}`;
  const id = await newRoof(setup.page, base, RECT(10, 6));
  await setup.context.close();

  const a = await openAs(browser, `/roofs/${id}`);
  const b = await openAs(browser, `/roofs/${id}`);

  await a.page.getByLabel("Roof name").fill(`${base} from A`);
  await expect(a.page.getByTestId("save-status")).toHaveText("Saved · v2");

  await b.page.getByLabel("Roof name").fill(`${base} from B`);
  const banner = b.page.getByTestId("conflict-banner");
  await expect(banner).toBeVisible();
  await expect(banner).toContainText("now version 2");
  await expect(b.page.getByTestId("save-status")).toHaveText("Not saved: changed elsewhere");
  await expect(b.page.getByLabel("Roof name")).toHaveValue(`${base} from B`);

  await banner.getByRole("button", { name: "Keep mine as a copy" }).click();
  await expect(b.page).toHaveURL(/\/roofs\/[0-9a-f-]{36}\?copied=1$/);
  const copyId = /\/roofs\/([0-9a-f-]{36})/.exec(b.page.url())![1];
  expect(copyId).not.toBe(id);
  await expect(b.page.getByLabel("Roof name")).toHaveValue(`${base} from B (my copy)`);

  // Nothing lost: A's save stands in the original, B's work is in the copy.
  expect((await roofJson(a.page, id)).name).toBe(`${base} from A`);
  expect((await roofJson(b.page, copyId)).spec.outline).toEqual(RECT(10, 6).outline);
  await a.context.close();
  await b.context.close();
});

test("a save that cannot reach the server says so, keeps the edit and retries on its own", async ({ page }) => {
  await signIn(page, "designer@tidemark.example");
  const base = `Offline ${unique()}`;
  const id = await newRoof(page, base, RECT(8, 5));
  await page.goto(`/roofs/${id}`);
  await expect(page.getByTestId("save-status")).toHaveText("Saved · v1");
  await page.route(`**/api/v1/roofs/${id}`, (route) =>
    route.request().method() === "PUT" ? route.abort("internetdisconnected") : route.continue(),
  );
  await page.getByLabel("Roof name").fill(`${base} renamed offline`);
  await expect(page.getByTestId("save-status")).toHaveText("Offline, will retry");
  expect((await roofJson(page, id)).name).toBe(base);
  await page.unroute(`**/api/v1/roofs/${id}`);
  await expect(page.getByTestId("save-status")).toHaveText("Saved · v2", { timeout: 20_000 });
  expect((await roofJson(page, id)).name).toBe(`${base} renamed offline`);
});

test("the library: search, rename inline, duplicate, delete and undo", async ({ page }) => {
  await signIn(page, "trainee3@tidemark.example");
  const tag = unique();
  await newRoof(page, `Porch ${tag}`, RECT(6, 4));
  await page.goto("/roofs");
  await page.getByPlaceholder("Search by name").fill(tag);
  const rows = page.locator("table").first().locator("tbody tr");
  await expect(rows).toHaveCount(1);

  await rows
    .first()
    .getByRole("button", { name: /Rename/ })
    .click();
  const field = page.getByLabel(`New name for Porch ${tag}`);
  await field.fill("");
  await field.press("Enter");
  await expect(page.getByText("The name must not be empty.")).toBeVisible();
  await field.fill(`Porch ${tag} renamed`);
  await field.press("Enter");
  await expect(page.getByRole("link", { name: `Porch ${tag} renamed` })).toBeVisible();

  await rows
    .first()
    .getByRole("button", { name: /Duplicate/ })
    .click();
  await expect(page.getByRole("link", { name: `Porch ${tag} renamed (copy)` })).toBeVisible();

  await page.getByRole("button", { name: `Delete Porch ${tag} renamed (copy)` }).click();
  const toast = page.getByRole("status").filter({ hasText: "Deleted" });
  await expect(toast).toContainText(`Deleted “Porch ${tag} renamed (copy)”.`);
  await expect(page.getByRole("link", { name: `Porch ${tag} renamed (copy)` })).toHaveCount(0);
  await toast.getByRole("button", { name: "Undo" }).click();
  await expect(page.getByRole("link", { name: `Porch ${tag} renamed (copy)` })).toBeVisible();
  await page.reload();
  await page.getByPlaceholder("Search by name").fill(tag);
  await expect(rows).toHaveCount(2);
});
