/** Signing in as a demo account, the one way every e2e spec does it. */
import { expect, type Browser, type BrowserContextOptions, type Page } from "@playwright/test";

/** Every demo account's password (db/seeds). */
export const PASSWORD = "fallwright-demo";

export interface SignInOptions {
  /** Where the sign-in form sends the browser afterwards (`redirectTo`); checked on arrival. */
  to?: string;
  /** How long to wait for the page after signing in (bcrypt and a cold page on a busy machine). */
  timeout?: number;
}

/** Signs `page` in through the form, as a person would, and waits until it has left the sign-in page. */
export async function signIn(page: Page, email: string, { to, timeout }: SignInOptions = {}) {
  await page.goto(to ? `/login?redirectTo=${encodeURIComponent(to)}` : "/login");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(PASSWORD);
  await page.getByRole("button", { name: "Sign in" }).click();
  if (to) await expect(page).toHaveURL(new RegExp(`${to.replace(/[.*+?^${}()|[\]\\]/g, "\\$&")}$`), { timeout });
  else await expect(page).not.toHaveURL(/\/login/, { timeout });
}

/** A browser context of its own (one person's browser) with a page signed in as `email`. */
export async function signedIn(
  browser: Browser,
  email: string,
  { timeout, ...context }: BrowserContextOptions & { timeout?: number } = {},
) {
  const ctx = await browser.newContext(context);
  const page = await ctx.newPage();
  await signIn(page, email, { timeout });
  return { context: ctx, page };
}
