import fs from "node:fs";
import path from "node:path";
import { expect, test, type Browser } from "@playwright/test";
import { signIn } from "./support/session";

// Issue 7, "What it must show": create a class, invite two trainees by e-mail, they join, one
// submits, the gradebook shows it, the trainer overrides it with a comment, the CSV holds the new grade.
const NEW_PASSWORD = "copper outlet heron 17";
const LESSON = { slug: "reading-falls", title: "Reading and converting falls" };
const unique = () => `${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}`;

interface Spooled {
  to: string[];
  subject: string;
  text: string;
}

/** The newest message to `to` in the SMTP fake's spool, waited for. */
async function mailTo(to: string, subject: RegExp): Promise<Spooled> {
  const dir = process.env.MAIL_SPOOL_DIR;
  if (!dir) throw new Error("MAIL_SPOOL_DIR is not set: run through `npm test`");
  let found: Spooled | undefined;
  await expect
    .poll(
      () => {
        const names = fs.existsSync(dir)
          ? fs
              .readdirSync(dir)
              .filter((n) => n.endsWith(".json"))
              .sort()
              .reverse()
          : [];
        for (const n of names) {
          try {
            const m = JSON.parse(fs.readFileSync(path.join(dir, n), "utf8")) as Spooled;
            if (m.to.includes(to) && subject.test(m.subject)) return (found = m);
          } catch {
            /* being written */
          }
        }
        return undefined;
      },
      { timeout: 15_000, message: `an e-mail to ${to}` },
    )
    .toBeTruthy();
  return found!;
}

async function acceptInvitation(browser: Browser, email: string, name: string) {
  const mail = await mailTo(email, /invited/i);
  const link = /https?:\/\/\S+\/invite\/[A-Za-z0-9_-]+/.exec(mail.text)![0];
  const context = await browser.newContext();
  const page = await context.newPage();
  await page.goto(new URL(link).pathname);
  await expect(page.getByRole("heading", { name: "Welcome to Fallwright" })).toBeVisible();
  await page.getByLabel("Your name").fill(name);
  await page.getByLabel("Password", { exact: true }).fill(NEW_PASSWORD);
  await page.getByLabel(/Confirm|again/i).fill(NEW_PASSWORD);
  await page.getByRole("button", { name: "Set up my account" }).click();
  await expect(page).toHaveURL(/\/$/);
  return { context, page };
}

test("trainer runs a class end to end: invite, join, attempt, gradebook, override, CSV", async ({ page, browser }) => {
  test.setTimeout(120_000);
  // Another run starting on this machine empties the shared spool folder; the SMTP fake only makes it at start.
  if (process.env.MAIL_SPOOL_DIR) fs.mkdirSync(process.env.MAIL_SPOOL_DIR, { recursive: true });
  const tag = unique();
  const className = `E2E cohort ${tag}`;
  const ana = `ana-${tag}@fallwright-e2e.example`;
  const ben = `ben-${tag}@fallwright-e2e.example`;

  await signIn(page, "trainer@tidemark.example");
  await page.goto("/classes");
  await page.getByLabel("Name").fill(className);
  await page.getByLabel("Starts on").fill("2027-10-04");
  await page.getByLabel("Ends on").fill("2027-10-08");
  await page.getByLabel("Venue").fill("Training hall, bay 5");
  await page.getByRole("button", { name: "Create class" }).click();
  await expect(page.getByRole("heading", { level: 1, name: className })).toBeVisible();
  await expect(page.getByText("Class created.")).toBeVisible();
  const classId = /\/classes\/([0-9a-f-]{36})/.exec(page.url())![1];

  // Assign a lesson with a due date.
  await page.getByRole("checkbox", { name: new RegExp(LESSON.title) }).check();
  await page.getByLabel(`Due date for ${LESSON.title}`).fill("2027-10-05");
  await page.getByRole("button", { name: "Save assignments" }).click();
  await expect(page.getByText("1 lesson assigned.")).toBeVisible();

  // Paste two addresses with a typo and a repeat.
  await page.getByLabel("E-mail addresses").fill(`${ana}, ben@@nowhere\n${ben}; ${ana}`);
  await page.getByRole("button", { name: "Send invitations" }).click();
  const report = page.getByRole("status").filter({ hasText: "Invitation e-mailed" });
  await expect(report).toContainText("Invitation e-mailed (2)");
  await expect(report).toContainText("ben@@nowhere");
  await expect(page.getByLabel("E-mail addresses")).toHaveValue("ben@@nowhere");
  await expect(page.getByRole("region", { name: /Pending invitations/ })).toContainText(ana);

  const a = await acceptInvitation(browser, ana, `Ana Quell ${tag}`);
  const b = await acceptInvitation(browser, ben, `Ben Ostry ${tag}`);

  // Ana sees the class and the assignment, then submits an attempt through the JSON API.
  await a.page.goto("/classes");
  await expect(a.page.getByRole("heading", { name: className })).toBeVisible();
  await expect(a.page.getByRole("link", { name: LESSON.title })).toBeVisible();
  await expect(a.page.getByText("5 Oct 2027")).toBeVisible();
  const lesson = await (await a.page.request.get(`/api/v1/lessons/${LESSON.slug}`)).json();
  const submitted = await a.page.request.post("/api/v1/attempts", {
    data: {
      lesson: LESSON.slug,
      version: lesson.lesson.version,
      answers: {},
      spec: lesson.lesson.task.start,
      idempotencyKey: `e2e-${tag}`,
      timeSpentSeconds: 60,
    },
  });
  expect(submitted.status()).toBe(201);
  const attempt = (await submitted.json()).attempt;
  expect(attempt.passed).toBe(false);

  // The gradebook shows it; Ben has not attempted.
  await page.goto(`/classes/${classId}/gradebook`);
  const anaRow = page.getByRole("row", { name: new RegExp(`Ana Quell ${tag}`) });
  await expect(anaRow).toContainText(String(Math.round(attempt.score * 10) / 10));
  await expect(anaRow).toContainText("Not passed");
  await expect(page.getByRole("row", { name: new RegExp(`Ben Ostry ${tag}`) })).toContainText("Not attempted");
  // Filtering by "not attempted" leaves Ben only.
  await page.getByLabel("Show").selectOption("not-attempted");
  await expect(page.getByText("1 of 2 trainees")).toBeVisible();
  await page.getByLabel("Show").selectOption("all");

  // Open the attempt review from the cell; override with a comment.
  await anaRow.getByRole("link", { name: /Open the review/ }).click();
  await expect(page).toHaveURL(new RegExp(`/attempts/${attempt.id}/review`));
  await expect(page.getByRole("heading", { name: "Automatic grading" })).toBeVisible();
  await expect(page.getByTestId("sandbox-workspace")).toBeVisible();
  await page
    .getByLabel("Comment to the trainee")
    .fill("Your outlet placement is right; the figures slipped. Counted as a pass.");
  await page.getByLabel(/Change the grade/).check();
  await page.getByLabel("Score (0-100)").fill("86");
  await page.getByLabel("Passed", { exact: true }).check();
  await page.getByLabel("Reason for the change").fill("Checked the roof by hand in class");
  await page.getByRole("button", { name: "Save comment and grade" }).click();
  await expect(page.getByText(/Saved\. Ana Quell .* has been told by e-mail\./)).toBeVisible();
  await expect(page.getByText("grade in force")).toBeVisible();

  // Ana is told by e-mail and sees the comment on her attempt.
  const notice = await mailTo(ana, /reviewed/);
  expect(notice.text).toContain("Counted as a pass.");
  await a.page.goto(`/attempts/${attempt.id}`);
  await expect(a.page.getByText("Your outlet placement is right")).toBeVisible();

  // The gradebook and the CSV hold the new grade.
  await page.goto(`/classes/${classId}/gradebook`);
  await expect(anaRow).toContainText("86");
  await expect(anaRow).toContainText("override");
  const downloading = page.waitForEvent("download");
  await page.getByRole("link", { name: "Download CSV" }).click();
  const download = await downloading;
  expect(download.suggestedFilename()).toBe(`e2e-cohort-${tag}-gradebook.csv`);
  const csv = fs.readFileSync((await download.path())!, "utf8");
  const anaLine = csv.split(/\r?\n/).find((l) => l.includes(ana))!;
  expect(anaLine).toContain(`Ana Quell ${tag},${ana},86,passed (override)`);
  expect(csv.split(/\r?\n/).find((l) => l.includes(ben))).toContain(",,not attempted");

  await a.context.close();
  await b.context.close();
});
