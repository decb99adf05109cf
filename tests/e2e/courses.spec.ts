import { expect, test } from "@playwright/test";
import { signIn } from "./support/session";

// docs/product.md capability 10: a trainer builds a course, orders its lessons with the keyboard
// reachable up/down buttons, a class follows it, and its lessons appear as assignments with due
// dates spread over the class's dates.
const unique = () => `${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}`;
const FIRST = "Reading and converting falls";
const SECOND = "Why water stands";

test("a trainer creates a course, a class follows it, and its lessons are assigned with spread due dates", async ({
  page,
}) => {
  const courseName = `Falls first ${unique()}`;
  const className = `Course cohort ${unique()}`;
  // The second trainer: a class dated after the demo cohort would become the first trainer's
  // default gradebook, which other tests read.
  await signIn(page, "trainer2@tidemark.example");

  await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Courses" }).click();
  await expect(page).toHaveURL(/\/courses$/);
  // A course's name and description head its row in the row's own type, not as a column heading.
  const rowHead = page.getByRole("rowheader").first();
  await expect(rowHead).toHaveCSS("text-transform", "none");
  await expect(page.getByRole("columnheader").first()).toHaveCSS("text-transform", "uppercase");
  // A nameless course is refused beside the field, keeping the description.
  await page.getByLabel("Description").fill("Two lessons to start with.");
  await page.getByRole("button", { name: "Create course" }).click();
  await expect(page.getByText("Give the course a name.")).toBeVisible();
  await expect(page.getByLabel("Description")).toHaveValue("Two lessons to start with.");
  await page.getByLabel("Name").fill(courseName);
  await page.getByRole("button", { name: "Create course" }).click();
  await expect(page.getByRole("heading", { level: 1, name: courseName })).toBeVisible();

  for (const title of [SECOND, FIRST]) {
    await page.getByLabel("Add a lesson").selectOption({ label: title });
    await page.getByRole("button", { name: "Add to the course" }).click();
    await expect(page.getByTestId("course-lessons").getByRole("link", { name: title })).toBeVisible();
  }
  // Reorder with the keyboard: focus the "up" button of the second lesson and press Enter.
  await page.getByRole("button", { name: `Move “${FIRST}” up` }).focus();
  await page.keyboard.press("Enter");
  await expect(page.getByTestId("course-lessons").getByRole("listitem").first()).toContainText(FIRST);
  await expect(page.getByTestId("course-lessons").getByRole("listitem").nth(1)).toContainText(SECOND);

  await page.goto("/classes");
  await page.getByLabel("Name").fill(className);
  await page.getByLabel("Starts on").fill("2027-10-04");
  await page.getByLabel("Ends on").fill("2027-10-08");
  await page.getByRole("button", { name: "Create class" }).click();
  await expect(page.getByRole("heading", { level: 1, name: className })).toBeVisible();

  await page.getByLabel("Course this class follows").selectOption({ label: courseName });
  await page.getByRole("button", { name: "Follow and assign" }).click();
  await expect(page.getByText(/The class follows the course: 2 lessons assigned/)).toBeVisible();
  // 4 to 8 October is 4 days; two lessons: the first due 2 days in, the second on the last day.
  await expect(page.getByLabel(`Due date for ${FIRST}`)).toHaveValue("2027-10-06");
  await expect(page.getByLabel(`Due date for ${SECOND}`)).toHaveValue("2027-10-08");
  await expect(page.getByRole("checkbox", { name: new RegExp(FIRST) })).toBeChecked();
  await expect(page.getByLabel("Course this class follows")).toHaveValue(/[0-9a-f-]{36}/);
});
