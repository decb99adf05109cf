import { fileURLToPath } from "node:url";
import { expect, test } from "@playwright/test";
import { getDocument } from "pdfjs-dist/legacy/build/pdf.mjs";
import { signIn } from "./support/session";

const FONTS = fileURLToPath(new URL("../../node_modules/pdfjs-dist/standard_fonts/", import.meta.url));
const unique = () => Math.random().toString(36).slice(2, 8);

// A phone held upright.
test.use({ viewport: { width: 390, height: 844 }, hasTouch: true, isMobile: true });

/** The PDF's text, read back with pdf.js. */
async function pdfText(bytes: Buffer): Promise<string> {
  const doc = await getDocument({ data: new Uint8Array(bytes), isEvalSupported: false, standardFontDataUrl: FONTS })
    .promise;
  let text = "";
  for (let i = 1; i <= doc.numPages; i++) {
    const content = await (await doc.getPage(i)).getTextContent();
    text += `${content.items.map((it) => ("str" in it ? it.str : "")).join(" ")} `;
  }
  await doc.destroy();
  return text.replace(/\s+/g, " ");
}

test("on a phone: levels entered joist by joist survive a reload, then the check shows its fall map and verdict, and the PDF says the same", async ({
  page,
}) => {
  test.setTimeout(240_000);
  await signIn(page, "designer@tidemark.example");
  const name = `Store roof ${unique()}`;
  const spec = {
    outline: [
      [0, 0],
      [4, 0],
      [4, 2],
      [0, 2],
    ],
    outlets: [{ at: [2, 0] }],
    baseFall: "1:40",
    joists: { spacing: 0.4 },
  };
  const res = await page.request.post("/api/v1/roofs", { data: { name, spec } });
  expect(res.status()).toBe(201);
  const id = (await res.json()).id;

  // The roof's page lists its history and leads to the checks.
  await page.goto(`/roofs/${id}`);
  await expect(page.getByRole("heading", { name: "History: design, then as-built checks" })).toBeVisible();
  await page.getByRole("link", { name: "All checks and a new one" }).click();
  await expect(page.getByRole("heading", { name: "As-built checks" })).toBeVisible();
  await page.waitForLoadState("networkidle");

  await page.getByLabel("Measured by").fill("Ines Varga");
  await page.getByLabel("Checked by").fill("Tomas Reyes");
  // Walk the joists: each shows its ends with their design levels; fill the design level, but
  // build joist 4's start 15 mm low.
  const count = Number(/of (\d+)\)/.exec((await page.getByText(/^Joist \d+/).textContent()) ?? "")![1]);
  expect(count).toBe(11);
  for (let k = 0; k < count; k++) {
    await expect(page.getByText(new RegExp(`^Joist ${k + 1} \\(`))).toBeVisible();
    const inputs = page.locator(`input[name^="level:J${k + 1} "]`);
    for (let i = 0; i < (await inputs.count()); i++) {
      const input = inputs.nth(i);
      const label = (await input.getAttribute("name"))!.slice(6);
      const design = Number(
        /design (-?\d+) mm/.exec(
          (await page.locator(`label[for="${await input.getAttribute("id")}"]`).textContent()) ?? "",
        )![1],
      );
      await input.fill(String(label === "J4 start" ? design - 15 : design));
    }
    // Large enough to hit with a thumb.
    expect((await inputs.first().boundingBox())!.height).toBeGreaterThanOrEqual(44);
    if (k < count - 1) await page.getByRole("button", { name: "Next →" }).click();
  }
  await expect(page.getByText(`22 of 22 entered`)).toBeVisible();

  // The connection drops and the page is reloaded: what was typed is still there.
  await page.reload();
  await page.waitForLoadState("networkidle");
  await expect(page.getByText("Levels typed earlier on this device were kept")).toBeVisible();
  await expect(page.getByLabel("Measured by")).toHaveValue("Ines Varga");
  await expect(page.getByText(`22 of 22 entered`)).toBeVisible();
  // Nothing is wider than the phone.
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);

  await page.getByRole("button", { name: "Check these levels" }).click();
  await expect(page).toHaveURL(new RegExp(`/roofs/${id}/checks/[0-9a-f-]{36}\\?saved=1$`), { timeout: 60_000 });
  const verdict = (await page.getByTestId("verdict").textContent())!;
  const worst = (await page.getByTestId("worst").textContent())!;
  expect(verdict).toBe("Verdict: FAIL (1 problem)");
  expect(worst).toBe("Worst deviation: -15 mm at J4 start");
  await expect(page.getByRole("img", { name: "As built: fall map, deviations and ponds" })).toBeVisible();
  await expect(page.getByRole("img", { name: "Design: fall map at the measured points" })).toBeVisible();
  await expect(page.getByTestId("fixes")).toHaveText("Pack up J4 start by 15 mm");
  await expect(page.getByRole("note").filter({ hasText: "designer of record" })).toHaveCount(1);
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
  // Saved: the draft is gone from the device.
  expect(await page.evaluate((k) => localStorage.getItem(k), `fallwright:as-built:${id}:v1`)).toBeNull();

  // The PDF, parsed back: the same verdict and worst deviation as the page.
  const href = await page.getByRole("link", { name: "Download the report (PDF)" }).getAttribute("href");
  const pdf = await page.request.get(href!);
  expect(pdf.status()).toBe(200);
  expect(pdf.headers()["content-type"]).toBe("application/pdf");
  const text = await pdfText(await pdf.body());
  expect(text).toContain(verdict);
  expect(text).toContain(worst);
  expect(text).toContain("Measured by: Ines Varga");
  expect(text).toContain("Checked by: Tomas Reyes");

  // The roof's history now lists the check.
  await page.goto(`/roofs/${id}`);
  await expect(page.getByRole("list", { name: "As-built checks" }).getByText("FAIL (1)")).toBeVisible();
});
