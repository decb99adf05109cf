import { describe, expect, it } from "vitest";
import { useTestDatabase } from "../support/db";
import { callRoute, get, sessionCookie, userIdOf } from "../support/accounts";
import { demoClassId } from "../support/classes";
import { DECK_GROUP_LABELS } from "~/lib/present-groups";
import { presenterDecks } from "~/lib/present.server";
import { db } from "~/lib/db.server";
import * as lessonsIndex from "~/routes/lessons._index";

// Issue 16, item 8: the lessons list shows when the trainee's classes want each lesson done, and the
// presenter's list keeps course order with the assigned lessons set apart.
useTestDatabase();

type Row = { slug: string; due: { dueOn: string | null; className: string; classes: number } | null };
const rowsFor = async (cookie?: string) => {
  const r = await callRoute(lessonsIndex.loader, get("/lessons", cookie));
  expect(r.status).toBe(200);
  return (r.data as { lessons: Row[] }).lessons;
};

describe("the lessons list's due dates", () => {
  it("shows a trainee the due dates of their class's assignments (demo seed: spring cohort) and nothing on the others", async () => {
    const rows = await rowsFor(await sessionCookie("trainee@tidemark.example"));
    const by = new Map(rows.map((r) => [r.slug, r.due]));
    expect(by.get("reading-falls")).toEqual({
      dueOn: "2027-03-01",
      className: "Parapet roofs, spring cohort",
      classes: 1,
    });
    expect(by.get("the-longest-fall-line")?.dueOn).toBe("2027-03-05");
    expect(by.get("upstands-and-crickets")).toBeNull();
  });

  it("shows no due dates to a visitor, nor to a trainer who is not a member of the class", async () => {
    expect((await rowsFor()).every((r) => r.due === null)).toBe(true);
    expect((await rowsFor(await sessionCookie("trainer@tidemark.example"))).every((r) => r.due === null)).toBe(true);
  });
});

describe("the presenter's list of roofs", () => {
  it("puts the class's assigned lessons first and the other lessons after, each part in course order, in labelled groups", async () => {
    const classId = await demoClassId();
    const org = (await db()("classes").where({ id: classId }).first("organisation_id"))!.organisation_id;
    const decks = await presenterDecks(await userIdOf("trainer@tidemark.example"), classId, org);
    const groups = decks.map((d) => d.group);
    // Contiguous parts in the order assigned → course → roofs (a divider sits between each).
    expect(groups.join(",")).toMatch(/^(assigned,)*assigned(,course)+(,roofs)?$/);
    const lessonNo = (title: string) => Number(/^(\d+)\./.exec(title)![1]);
    for (const g of ["assigned", "course"] as const) {
      const numbers = decks.filter((d) => d.group === g).map((d) => lessonNo(d.title));
      expect(numbers).toEqual([...numbers].sort((a, b) => a - b));
    }
    // The demo spring cohort has lessons 1, 2, 3, 5 and 6 assigned (db/seeds/04_classes.ts); 4 sits in the other part.
    expect(decks.filter((d) => d.group === "assigned").map((d) => lessonNo(d.title))).toEqual([1, 2, 3, 5, 6]);
    expect(decks.find((d) => d.title.startsWith("4."))?.group).toBe("course");
    expect(decks.every((d) => !d.title.includes("(assigned)"))).toBe(true);
    expect(Object.keys(DECK_GROUP_LABELS)).toEqual(["assigned", "course", "roofs"]);
  });
});
