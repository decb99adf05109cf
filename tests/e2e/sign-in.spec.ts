import { expect, test } from "@playwright/test";

test("sign-in keeps the typed e-mail on a wrong password, then signs in, and sign-out ends the session", async ({
  page,
  context,
}) => {
  await page.goto("/login");
  await page.getByLabel("E-mail").fill("trainer@tidemark.example");
  await page.getByLabel("Password").fill("not-the-password");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByRole("alert")).toContainText("do not match an active account");
  await expect(page.getByLabel("E-mail")).toHaveValue("trainer@tidemark.example");
  await expect(page.getByLabel("Password")).toHaveValue("");

  await page.getByLabel("Password").fill("fallwright-demo");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByRole("banner")).toContainText("Tomas Verrall");
  const [session] = (await context.cookies()).filter((c) => c.name === "fw_session");
  expect(session).toMatchObject({ httpOnly: true, sameSite: "Lax", path: "/" });

  await page.getByRole("button", { name: "Sign out" }).click();
  await expect(page.getByRole("status")).toContainText("You are signed out.");
  expect((await context.cookies()).filter((c) => c.name === "fw_session")).toEqual([]);

  // The old cookie is dead on the server too: put it back and it opens nothing.
  await context.addCookies([{ ...session }]);
  const res = await page.goto("/account");
  expect(new URL(page.url()).pathname).toBe("/login");
  expect(res?.status()).toBe(200);
});

test("a page that needs an account sends you to sign in and back again", async ({ page }) => {
  await page.goto("/account");
  await expect(page).toHaveURL(/\/login\?redirectTo=%2Faccount$/);
  // An account no other test signs in with: "sign out everywhere" ends every session it has.
  await page.getByLabel("E-mail").fill("trainer2@tidemark.example");
  await page.getByLabel("Password").fill("fallwright-demo");
  await page.keyboard.press("Enter");
  await expect(page.getByRole("heading", { name: "Your account" })).toBeVisible();
  await expect(page.getByRole("row", { name: /this browser/ })).toBeVisible();
  await page.getByRole("button", { name: "Sign out everywhere" }).click();
  await expect(page.getByRole("status")).toContainText("signed out on every device");
});
