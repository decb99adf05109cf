import AxeBuilder from "@axe-core/playwright";
import { expect, test, type Page } from "@playwright/test";
import { signIn } from "./support/session";

// Every screen, as each role, through axe-core: no serious or critical violations. Then the same
// page at a phone's width (390 px) must not scroll sideways: a wide table scrolls in its own box or
// becomes one card per row.
// Exceptions (rule, where, why): none so far. Add one here only with the reason it cannot be fixed.
const EXCEPTIONS: { rule: string; path: RegExp; why: string }[] = [];

test.describe.configure({ timeout: 180_000 });

/** The first link on a page whose address matches, e.g. a roof's own page from the roof list. */
async function firstLink(page: Page, from: string, pattern: RegExp): Promise<string | null> {
  await page.goto(from);
  for (const href of await page.locator("a[href]").evaluateAll((as) => as.map((a) => a.getAttribute("href") ?? "")))
    if (pattern.test(href)) return href;
  return null;
}

async function audit(page: Page, path: string) {
  await page.goto(path);
  // Results are computed after hydration: audit them too, not the "working out" placeholder.
  if (await page.getByTestId("sandbox-workspace").count())
    await expect(page.getByTestId("key-figures")).toBeVisible({ timeout: 60_000 });
  const { violations } = await new AxeBuilder({ page }).analyze();
  return violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .filter((v) => !EXCEPTIONS.some((e) => e.rule === v.id && e.path.test(path)))
    .map((v) => `${path}: ${v.id} (${v.impact}) ${v.help}: ${v.nodes.map((n) => n.target.join(" ")).join(", ")}`);
}

const UUID = "[0-9a-f-]{36}";
const link = (from: string, pattern: string) => (page: Page) => firstLink(page, from, new RegExp(`^${pattern}$`));
type Where = string | ((page: Page) => Promise<string | null>);
const CLASS = `/classes/${UUID}`;
const ROLES: { role: string; email: string | null; screens: Record<string, Where> }[] = [
  {
    role: "anonymous",
    email: null,
    screens: Object.fromEntries(
      [
        "/",
        "/sandbox",
        "/sandbox/sheet",
        "/lessons",
        "/lessons/reading-falls",
        "/login",
        "/signup",
        "/forgot-password",
        "/reset-password/not-a-token",
        "/invite/not-a-token",
        "/s/not-a-token",
        "/no-such-page",
        "/verify",
        "/verify/0000-0000-0000",
      ].map((p) => [p, p]),
    ),
  },
  {
    role: "trainee",
    email: "trainee@tidemark.example",
    screens: {
      "/": "/",
      "/lessons/:slug (task)": "/lessons/shaping-to-an-outlet",
      "/attempts": "/attempts",
      "/attempts/:id": link("/attempts", `/attempts/${UUID}`),
      "/roofs": "/roofs",
      "/roofs/:id": link("/roofs", `/roofs/${UUID}`),
      "/classes": "/classes",
      "/classes/:id/follow": link("/classes", `${CLASS}/follow`),
      "/account": "/account",
      "/admin (403)": "/admin",
    },
  },
  {
    role: "trainer",
    email: "trainer@tidemark.example",
    screens: {
      "/classes/:id": link("/classes", CLASS),
      "/classes/:id/gradebook": async (page) => (await link("/classes", CLASS)(page)) + "/gradebook",
      "/classes/:id/present": async (page) => (await link("/classes", CLASS)(page)) + "/present",
      "/gradebook": "/gradebook",
      "/courses": "/courses",
      "/courses/:id": link("/courses", `/courses/${UUID}`),
      "/lessons/new": "/lessons/new",
      // Each graded cell of the gradebook links to that attempt's review, with the class to return to.
      "/attempts/:id/review": link("/gradebook", `/attempts/${UUID}/review\\?class=${UUID}`),
    },
  },
  {
    role: "designer",
    email: "designer@tidemark.example",
    screens: {
      "/roofs": "/roofs",
      "/roofs/:id": link("/roofs", `/roofs/${UUID}`),
      "/roofs/:id/sheet": async (page) => (await link("/roofs", `/roofs/${UUID}`)(page)) + "/sheet",
      "/sandbox": "/sandbox",
    },
  },
  {
    role: "admin",
    email: "admin@tidemark.example",
    screens: {
      "/admin": "/admin",
      "/admin/audit": "/admin/audit",
      "/admin/outbox": "/admin/outbox",
      "/account": "/account",
    },
  },
];

for (const { role, email, screens } of ROLES) {
  for (const [name, where] of Object.entries(screens)) {
    test(`accessibility: ${name} as ${role} has no serious or critical axe violations, and fits a phone`, async ({
      page,
    }) => {
      if (email) await signIn(page, email);
      const path = typeof where === "string" ? where : await where(page);
      // A missing link means the demo data changed: say so rather than audit less.
      expect(path, `a link to ${name}`).toMatch(/^\//);
      expect(await audit(page, path!)).toEqual([]);
      await page.setViewportSize({ width: 390, height: 844 });
      await expect
        .poll(() => page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth), {
          message: `${path} scrolls sideways at 390 px by`,
        })
        .toBeLessThanOrEqual(0);
    });
  }
}

test("accessibility: the 3D view keeps its text summary for screen readers", async ({ page }) => {
  await page.goto("/sandbox");
  await expect(page.getByTestId("key-figures")).toBeVisible({ timeout: 60_000 });
  const card = page.getByTestId("fall-map-card");
  await expect(card.getByText("What the view shows")).toBeVisible();
  // A number and its unit are kept together by a no-break space (\s matches it).
  await expect(card).toContainText(/A roof of [\d.]+\sm² inside 4 edges/);
});
