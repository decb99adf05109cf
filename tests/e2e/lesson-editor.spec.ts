import { expect, test } from "@playwright/test";
import { signedIn } from "./support/session";

// Issue 17, items 1, 2 and 5 (docs/authoring.md): a trainer turns the sandbox roof into a task,
// publishes it, assigns it; a trainee passes it; the gradebook shows it with its version; the
// exported file imports back as the same lesson.
const TRAINEE = { email: "trainee2@tidemark.example", name: "Marco Ellery" };

test("sandbox roof → task → published → a trainee passes it → the gradebook shows it; export and import give the same lesson", async ({
  browser,
}) => {
  test.setTimeout(300_000);
  const title = `Outlets on the demo deck ${Date.now().toString(36)}`;
  const trainer = (await signedIn(browser, "trainer@tidemark.example")).page;

  // The sandbox's roof becomes the task's starting roof.
  await trainer.goto("/sandbox");
  await trainer.getByTestId("make-task").click();
  await expect(trainer).toHaveURL(/\/lessons\/new\?spec=/);
  await expect(trainer.getByText("The task starts from the sandbox.")).toBeVisible();

  const editor = trainer.getByTestId("lesson-editor");
  // A bad pass mark is refused beside its field, and what was typed stays.
  await editor.getByLabel("Title", { exact: true }).fill(title);
  await editor.getByLabel("Summary (one line for the course list)").fill("How many outlets the demo deck has.");
  await editor.getByLabel("Objectives, one a line").fill("Count the outlets on a plan");
  await editor.getByLabel("Pass mark (0-100)").fill("lots");
  const q = editor.getByTestId("question-0");
  await q.getByLabel("Question").fill("How far is the outlet from the left-hand corner?");
  await q.getByLabel("Answer with its unit").fill("6 m");
  await q.getByLabel("Hint (teaches the way, never the answer)").fill("Read the outlet's position on the plan.");
  const c = editor.getByTestId("criterion-0");
  await c.getByLabel("Check").selectOption("maxOutlets");
  await c.getByLabel("Limit").fill("1");
  await editor.getByLabel("Goal stated to the trainee (Markdown)").fill("Keep the deck to one outlet.");
  await editor.getByLabel("Hints, one a line").fill("One outlet is enough for this deck.");
  await editor.getByRole("button", { name: "Publish" }).click();
  await expect(editor.getByLabel("Pass mark (0-100)")).toHaveAccessibleDescription(/must be a number from 0 to 100/);
  await expect(editor.getByLabel("Title", { exact: true })).toHaveValue(title);

  await editor.getByLabel("Pass mark (0-100)").fill("70");
  // A second figure, from one of the trainer's saved roofs, added without typing the block.
  const body = editor.getByLabel("Body (Markdown)");
  const figures = async () => ((await body.inputValue()).match(/^```roof$/gm) ?? []).length;
  const before = await figures();
  const picked = await editor.getByLabel("Figure from a saved roof").locator("option").first().textContent();
  await editor.getByRole("button", { name: "Add the figure to the body" }).click();
  expect(await figures()).toBe(before + 1);
  expect(await body.inputValue()).toContain(`caption: ${JSON.stringify(picked)}`);
  await expect(editor.getByText(`A figure of “${picked}” is at the end of the body.`)).toBeVisible();
  await editor.getByRole("button", { name: "Preview" }).click();
  await expect(trainer.getByTestId("preview-reference").getByTestId("score-summary")).toContainText("Passed");

  await trainer.getByTestId("lesson-editor").getByRole("button", { name: "Publish" }).click();
  await expect(trainer).toHaveURL(/\/lessons\/[a-z0-9-]+\?published=1$/);
  const slug = /\/lessons\/([a-z0-9-]+)\?/.exec(trainer.url())![1];
  await expect(trainer.getByTestId("authoring-bar")).toContainText("Published, v1");

  // Assign it to the demo class (trainee2@ is a member).
  await trainer.goto("/classes");
  const href = await trainer.getByRole("link", { name: "Parapet roofs, spring cohort" }).first().getAttribute("href");
  const classId = /\/classes\/([0-9a-f-]{36})/.exec(href ?? "")![1];
  await trainer.goto(`/classes/${classId}`);
  const assign = trainer.getByRole("checkbox", { name: new RegExp(title) });
  await assign.check();
  await trainer.getByRole("button", { name: /Save assignments/i }).click();
  await expect(assign).toBeChecked();

  // The trainee passes it with the roof as it starts and the right answer.
  const trainee = (await signedIn(browser, TRAINEE.email)).page;
  await trainee.goto("/lessons");
  await expect(trainee.getByTestId(`lesson-${slug}`)).toBeVisible();
  await trainee.goto(`/lessons/${slug}`);
  await trainee.getByTestId("question-q1").getByRole("textbox").fill("6 m");
  await trainee.getByRole("button", { name: "Submit answers and roof" }).click();
  const summary = trainee.getByTestId("score-summary").first();
  await expect(summary).toContainText("Passed", { timeout: 60_000 });

  // The gradebook shows the pass, and which version it was graded on.
  await trainer.goto(`/classes/${classId}/gradebook`);
  const cell = trainer.getByRole("link", { name: new RegExp(`^${TRAINEE.name}, ${title}: 100 Passed`) });
  await expect(cell).toBeVisible();
  await expect(cell).toContainText("v1");

  // Export, then import: the same lesson (same version hash) as a new draft.
  const exported = await trainer.request.get(`/lessons/${slug}/export`);
  expect(exported.status()).toBe(200);
  const text = await exported.text();
  expect(text).toContain(`title: ${title}`);
  await trainer.goto("/lessons/new");
  await trainer.getByLabel("Lesson file (.md)").setInputFiles({
    name: `01-${slug}-copy.md`,
    mimeType: "text/markdown",
    buffer: Buffer.from(text),
  });
  await trainer.getByRole("button", { name: "Import" }).click();
  await expect(trainer).toHaveURL(/\/lessons\/[a-z0-9-]+\/edit\?saved=1$/);
  const copySlug = /\/lessons\/([a-z0-9-]+)\/edit/.exec(trainer.url())![1];
  expect(copySlug).not.toBe(slug);
  await expect(trainer.getByTestId("edit-status")).toContainText("Draft");
  const again = await (await trainer.request.get(`/lessons/${copySlug}/export`)).text();
  expect(again).toBe(text);
  const [a, b] = await Promise.all(
    [slug, copySlug].map(async (s) => (await (await trainer.request.get(`/api/v1/lessons/${s}`)).json()).lesson),
  );
  expect({ ...b, slug: a.slug, position: a.position }).toEqual(a);

  // The trainee does not see the imported draft.
  expect((await trainee.request.get(`/api/v1/lessons/${copySlug}`)).status()).toBe(404);
});
