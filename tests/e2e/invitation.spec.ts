import { expect, test } from "@playwright/test";
import { readOutbox } from "../../app/lib/outbox.server";

// Issue 3: an invitation link read from the SMTP fake's spool, followed in chromium.
async function linkFromSpool(to: string, prefix: string): Promise<string> {
  const end = Date.now() + 15_000;
  while (Date.now() < end) {
    const { configured, messages } = await readOutbox({ to, limit: 5 });
    expect(configured, "MAIL_SPOOL_DIR must be set (npm test does it)").toBe(true);
    const m = messages[0] && new RegExp(`https?://\\S+${prefix}[A-Za-z0-9_-]+`).exec(messages[0].text);
    if (m) return m[0];
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`no e-mail to ${to}`);
}

test("an admin invites a designer; the e-mailed link sets name and password and lands signed in", async ({
  page,
  browser,
  baseURL,
}) => {
  const email = `e2e-designer-${Date.now().toString(36)}@fallwright-test.example`;

  await page.goto("/login");
  await page.getByLabel("E-mail").fill("admin@tidemark.example");
  await page.getByLabel("Password").fill("fallwright-demo");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByRole("link", { name: "Admin" })).toBeVisible();

  await page.getByRole("link", { name: "Admin" }).click();
  await expect(page.getByRole("heading", { name: "Invite someone" })).toBeVisible();
  const invite = page.locator("form", { has: page.getByRole("button", { name: "Send invitation" }) });
  await invite.getByLabel("E-mail").fill(email);
  await invite.getByLabel("Role").selectOption("designer");
  await invite.getByRole("button", { name: "Send invitation" }).click();
  await expect(page.getByRole("status").filter({ hasText: `Invitation sent to ${email}` })).toBeVisible();
  await expect(page.getByRole("row", { name: new RegExp(email) })).toContainText("Invited");

  const link = await linkFromSpool(email, "/invite/");
  expect(new URL(link).origin).toBe(new URL(baseURL!).origin);

  // The invitee opens the link in their own browser.
  const invitee = await browser.newContext();
  const p = await invitee.newPage();
  await p.goto(link);
  await expect(p.getByRole("heading", { name: "Welcome to Fallwright" })).toBeVisible();
  await expect(p.getByText("as a designer")).toBeVisible();
  await p.getByLabel("Your name").fill("Wren Castellane");
  await p.getByLabel("Password", { exact: true }).fill("pumice ladder 58");
  await p.getByLabel("Type it again").fill("pumice ladder 58");
  await p.getByRole("button", { name: "Set up my account" }).click();
  await expect(p).toHaveURL(new URL("/", baseURL).href);
  await expect(p.getByRole("banner")).toContainText("Wren Castellane");
  await expect(p.getByRole("banner")).toContainText("Designer");

  // The link worked once.
  await p.goto(link);
  await expect(p.getByRole("heading", { name: "This invitation cannot be used" })).toBeVisible();

  // The admin deactivates the new account: it asks first, and "Keep" backs out.
  await page.reload();
  const row = page.getByRole("row", { name: new RegExp(email) });
  await row.getByRole("button", { name: "Deactivate" }).click();
  await expect(row.getByRole("group", { name: "Deactivate Wren Castellane?" })).toBeVisible();
  await row.getByRole("button", { name: "Keep" }).click();
  await expect(row).toContainText("Active");
  await row.getByRole("button", { name: "Deactivate" }).click();
  await row.getByRole("group").getByRole("button", { name: "Deactivate" }).click();
  await expect(page.getByRole("row", { name: new RegExp(email) })).toContainText("Deactivated");
  // Their session ended with it.
  await p.goto("/roofs");
  await expect(p).toHaveURL(/\/login/);
  await invitee.close();
});
