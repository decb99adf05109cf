import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { useTestDatabase } from "../support/db";
import {
  callRoute,
  formPost,
  get,
  linkIn,
  ORIGIN,
  sessionCookie,
  uniqueAddress,
  userIdOf,
  waitForMail,
} from "../support/accounts";
import { demoClassId, ensureSpool, ensureLesson, insertAttempt, SPEC } from "../support/classes";
import * as classesIndex from "~/routes/classes._index";
import * as classPage from "~/routes/classes.$id";
import * as classGradebook from "~/routes/classes.$id.gradebook";
import * as gradebookCsv from "~/routes/classes.$id.gradebook-csv";
import * as gradebook from "~/routes/gradebook";
import * as live from "~/routes/classes.$id.live";
import * as present from "~/routes/classes.$id.present";
import * as follow from "~/routes/classes.$id.follow";
import * as review from "~/routes/attempts.$id.review";
import { closeListeners } from "~/lib/live.server";

// docs/product.md capability 5; docs/security.md, Permissions by role (another user's record id answers 403/404).
const database = useTestDatabase();
const LESSON = "zz-classes-test";

let cookies: Record<"admin" | "trainer" | "trainer2" | "trainee" | "trainee2" | "trainee4", string>;
let demoClass: string;

beforeAll(async () => {
  ensureSpool();
  demoClass = await demoClassId();
  cookies = {
    admin: await sessionCookie("admin@tidemark.example"),
    trainer: await sessionCookie("trainer@tidemark.example"),
    trainer2: await sessionCookie("trainer2@tidemark.example"),
    trainee: await sessionCookie("trainee@tidemark.example"),
    trainee2: await sessionCookie("trainee2@tidemark.example"),
    trainee4: await sessionCookie("trainee4@tidemark.example"),
  };
  await ensureLesson(LESSON, "Classes test lesson");
  await database
    .db()("assignments")
    .insert({ class_id: demoClass, lesson_slug: LESSON, due_on: "2027-03-04" })
    .onConflict(["class_id", "lesson_slug"])
    .ignore();
});

// The live route opens this process's listening connection.
afterAll(() => closeListeners());

async function createClass(cookie: string, name: string) {
  const r = await callRoute(
    classesIndex.action,
    formPost("/classes", { name, startsOn: "2027-05-03", endsOn: "2027-05-07", venue: "Bay 4" }, cookie),
  );
  expect(r.status).toBe(302);
  return /^\/classes\/([0-9a-f-]{36})\?created=1$/.exec(r.location!)![1];
}

describe("creating a class", () => {
  it("a trainer creates one and lands on its page; it is theirs", async () => {
    const id = await createClass(cookies.trainer, "Autumn cohort (create test)");
    const row = await database.db()("classes").where({ id }).first();
    expect(row).toMatchObject({
      name: "Autumn cohort (create test)",
      starts_on: "2027-05-03",
      ends_on: "2027-05-07",
      venue: "Bay 4",
      trainer_id: await userIdOf("trainer@tidemark.example"),
    });
  });

  it("bad input answers 400 with field errors and keeps what was typed", async () => {
    const r = await callRoute(
      classesIndex.action,
      formPost(
        "/classes",
        { name: "  ", startsOn: "2027-05-07", endsOn: "2027-05-01", venue: "Hall" },
        cookies.trainer,
      ),
    );
    expect(r.status).toBe(400);
    expect(r.data.errors).toMatchObject({ name: expect.any(String), endsOn: "The class cannot end before it starts." });
    expect(r.data.values).toMatchObject({ startsOn: "2027-05-07", endsOn: "2027-05-01", venue: "Hall" });
    const bad = await callRoute(
      classesIndex.action,
      formPost("/classes", { name: "x", startsOn: "2027-02-30x", endsOn: "", venue: "" }, cookies.trainer),
    );
    expect(bad.status).toBe(400);
    expect(bad.data.errors.startsOn).toMatch(/date/);
  });

  it("a trainee cannot create one", async () => {
    const r = await callRoute(classesIndex.action, formPost("/classes", { name: "Mine now" }, cookies.trainee));
    expect(r.status).toBe(403);
  });
});

describe("inviting by a pasted list", () => {
  it("reports invalid addresses, takes repeats once, skips members and open invitations, e-mails each new one", async () => {
    const id = await createClass(cookies.trainer, "Invite test cohort");
    const a = uniqueAddress("class-invite-a");
    const b = uniqueAddress("class-invite-b");
    const text = `${a}, ${a.toUpperCase()}; not-an-address\nCleo Daye <${b}>\ntrainee@tidemark.example; admin@tidemark.example; bob@`;
    const r = await callRoute(
      classPage.action,
      formPost(`/classes/${id}`, { intent: "invite", addresses: text }, cookies.trainer),
      { params: { id } },
    );
    expect(r.status).toBe(200);
    const report = r.data.report;
    expect(report.invited.sort()).toEqual([a, b].sort());
    expect(report.invalid).toEqual(["not-an-address", "bob@"]);
    expect(report.repeated).toEqual([a]);
    // An existing trainee account is asked to join (it joins when it accepts); a staff account is refused.
    expect(report.askedToJoin).toEqual(["trainee@tidemark.example"]);
    expect(report.refused.map((x: { email: string }) => x.email)).toEqual(["admin@tidemark.example"]);
    // The box keeps only what needs fixing.
    expect(r.data.text).toBe("not-an-address\nbob@");

    for (const addr of [a, b]) {
      const mail = await waitForMail(addr, { subject: /invited/i });
      expect(mail.text).toContain("Invite test cohort");
      expect(linkIn(mail, "/invite/").origin).toBe(ORIGIN);
    }
    const tokens = await database
      .db()("tokens")
      .where({ class_id: id, kind: "invitation" })
      .whereNull("used_at")
      .select("email");
    expect(tokens.map((t) => t.email).sort()).toEqual([a, b, "trainee@tidemark.example"].sort());

    // Pasting again: open invitations (the existing account's too) are skipped, nothing new is sent.
    const again = await callRoute(
      classPage.action,
      formPost(`/classes/${id}`, { intent: "invite", addresses: `${a}\ntrainee@tidemark.example` }, cookies.trainer),
      { params: { id } },
    );
    expect(again.data.report).toMatchObject({
      invited: [],
      askedToJoin: [],
      alreadyInvited: [a, "trainee@tidemark.example"],
      alreadyMember: [],
    });
    expect(
      await database.db()("tokens").where({ class_id: id, kind: "invitation" }).count("* as n").first(),
    ).toMatchObject({ n: "3" });

    const page = await callRoute(classPage.loader, get(`/classes/${id}`, cookies.trainer), { params: { id } });
    expect(page.data.pending.map((p: { email: string }) => p.email).sort()).toEqual(
      [a, b, "trainee@tidemark.example"].sort(),
    );
    expect(page.data.members).toEqual([]);

    // Withdraw one: its link stops working and it leaves the list.
    const w = await callRoute(
      classPage.action,
      formPost(`/classes/${id}`, { intent: "withdraw", email: b }, cookies.trainer),
      { params: { id } },
    );
    expect(w.status).toBe(200);
    const after = await callRoute(classPage.loader, get(`/classes/${id}`, cookies.trainer), { params: { id } });
    expect(after.data.pending.map((p: { email: string }) => p.email)).toEqual([a, "trainee@tidemark.example"].sort());
  });

  it("an empty or all-invalid paste is a 400 that keeps the text", async () => {
    const id = await createClass(cookies.trainer, "Empty paste cohort");
    const empty = await callRoute(
      classPage.action,
      formPost(`/classes/${id}`, { intent: "invite", addresses: "  \n " }, cookies.trainer),
      { params: { id } },
    );
    expect(empty.status).toBe(400);
    const bad = await callRoute(
      classPage.action,
      formPost(`/classes/${id}`, { intent: "invite", addresses: "nope, also nope" }, cookies.trainer),
      { params: { id } },
    );
    expect(bad.status).toBe(400);
    expect(bad.data.text).toBe("nope\nalso nope");
  });

  it("removing a member keeps their attempts", async () => {
    const id = await createClass(cookies.trainer, "Remove test cohort");
    const traineeId = await userIdOf("trainee3@tidemark.example");
    await database.db()("class_members").insert({ class_id: id, user_id: traineeId });
    const attempt = await insertAttempt(traineeId, LESSON);
    const r = await callRoute(
      classPage.action,
      formPost(`/classes/${id}`, { intent: "remove", userId: traineeId }, cookies.trainer),
      { params: { id } },
    );
    expect(r.status).toBe(200);
    expect(r.data.notice).toMatch(/Priya Santhorn was removed/);
    expect(await database.db()("class_members").where({ class_id: id, user_id: traineeId }).first()).toBeUndefined();
    expect(await database.db()("attempts").where({ id: attempt }).first("id")).toBeTruthy();
    const twice = await callRoute(
      classPage.action,
      formPost(`/classes/${id}`, { intent: "remove", userId: traineeId }, cookies.trainer),
      { params: { id } },
    );
    expect(twice.status).toBe(404);
  });
});

describe("assignments", () => {
  it("saves the ticked lessons with due dates, replaces the old set, and refuses bad dates", async () => {
    const id = await createClass(cookies.trainer, "Assignment cohort");
    await ensureLesson("zz-classes-test-2", "Second test lesson", 901);
    const form = new URLSearchParams([
      ["intent", "assignments"],
      ["assign", LESSON],
      ["assign", "zz-classes-test-2"],
      ["assign", "no-such-lesson"],
      [`due:${LESSON}`, "2027-06-01"],
    ]);
    const post = (body: URLSearchParams) =>
      callRoute(
        classPage.action,
        new Request(`${ORIGIN}/classes/${id}`, {
          method: "POST",
          headers: { cookie: cookies.trainer, "Content-Type": "application/x-www-form-urlencoded" },
          body,
        }),
        { params: { id } },
      );
    expect((await post(form)).status).toBe(200);
    expect(
      await database.db()("assignments").where({ class_id: id }).orderBy("lesson_slug").select("lesson_slug", "due_on"),
    ).toEqual([
      { lesson_slug: LESSON, due_on: "2027-06-01" },
      { lesson_slug: "zz-classes-test-2", due_on: null },
    ]);
    const bad = await post(
      new URLSearchParams([
        ["intent", "assignments"],
        ["assign", LESSON],
        [`due:${LESSON}`, "June"],
      ]),
    );
    expect(bad.status).toBe(400);
    expect(bad.data.assignmentErrors[LESSON]).toMatch(/date/);
    // A day that does not exist is a 400 too, not a database error.
    expect(
      (
        await post(
          new URLSearchParams([
            ["intent", "assignments"],
            ["assign", LESSON],
            [`due:${LESSON}`, "2027-02-30"],
          ]),
        )
      ).status,
    ).toBe(400);
    expect(
      (
        await post(
          new URLSearchParams([
            ["intent", "assignments"],
            ["assign", "zz-classes-test-2"],
          ]),
        )
      ).status,
    ).toBe(200);
    expect(await database.db()("assignments").where({ class_id: id }).pluck("lesson_slug")).toEqual([
      "zz-classes-test-2",
    ]);
  });

  it("a trainee sees their classes with what is assigned, when it is due, and their best grade", async () => {
    const traineeId = await userIdOf("trainee2@tidemark.example");
    await insertAttempt(traineeId, LESSON, { score: 40, passed: false });
    await insertAttempt(traineeId, LESSON, { score: 90, passed: true });
    const r = await callRoute(classesIndex.loader, get("/classes", cookies.trainee2));
    expect(r.data.manages).toBe(false);
    expect(r.data.classes.map((c: { id: string }) => c.id)).toEqual([demoClass]);
    const mine = r.data.assignments[demoClass].find((a: { slug: string }) => a.slug === LESSON);
    expect(mine).toMatchObject({ dueOn: "2027-03-04", cell: { score: 90, passed: true, attempts: 2 } });
  });
});

describe("permission boundaries", () => {
  const args = (id: string) => ({ params: { id } });

  it("another trainer's class answers 404 in every loader, action and resource route", async () => {
    const c = cookies.trainer2;
    expect((await callRoute(classPage.loader, get(`/classes/${demoClass}`, c), args(demoClass))).status).toBe(404);
    const inv = await callRoute(
      classPage.action,
      formPost(`/classes/${demoClass}`, { intent: "invite", addresses: uniqueAddress("x") }, c),
      args(demoClass),
    );
    expect(inv.status).toBe(404);
    const rm = await callRoute(
      classPage.action,
      formPost(`/classes/${demoClass}`, { intent: "remove", userId: await userIdOf("trainee@tidemark.example") }, c),
      args(demoClass),
    );
    expect(rm.status).toBe(404);
    expect(await database.db()("class_members").where({ class_id: demoClass }).count("* as n").first()).toMatchObject({
      n: "3",
    });
    expect(
      (await callRoute(classGradebook.loader, get(`/classes/${demoClass}/gradebook`, c), args(demoClass))).status,
    ).toBe(404);
    expect(
      (await callRoute(gradebookCsv.loader, get(`/classes/${demoClass}/gradebook.csv`, c), args(demoClass))).status,
    ).toBe(404);
    expect((await callRoute(present.loader, get(`/classes/${demoClass}/present`, c), args(demoClass))).status).toBe(
      404,
    );
    expect((await callRoute(follow.loader, get(`/classes/${demoClass}/follow`, c), args(demoClass))).status).toBe(404);
    expect((await callRoute(live.loader, get(`/classes/${demoClass}/live`, c), args(demoClass))).status).toBe(404);
    const post = new Request(`${ORIGIN}/classes/${demoClass}/live`, {
      method: "POST",
      headers: { cookie: c, "Content-Type": "application/json" },
      body: JSON.stringify({ spec: SPEC, title: "hijack" }),
    });
    expect((await callRoute(live.action, post, args(demoClass))).status).toBe(404);
    expect(
      (
        (await database.db()("classes").where({ id: demoClass }).first("live_state"))!.live_state as {
          title?: string;
        } | null
      )?.title,
    ).not.toBe("hijack");
    // Their own lists do not include it either.
    const list = await callRoute(classesIndex.loader, get("/classes", c));
    expect(list.data.classes.map((x: { id: string }) => x.id)).not.toContain(demoClass);
    const book = await callRoute(gradebook.loader, get(`/gradebook?class=${demoClass}`, c));
    expect(book.data.selected?.id).not.toBe(demoClass);
    expect(book.data.classes.map((x: { id: string }) => x.id)).not.toContain(demoClass);
  });

  it("a trainee of the class may follow it but not manage it", async () => {
    const c = cookies.trainee;
    expect((await callRoute(classPage.loader, get(`/classes/${demoClass}`, c), args(demoClass))).status).toBe(403);
    expect(
      (
        await callRoute(
          classPage.action,
          formPost(
            `/classes/${demoClass}`,
            { intent: "remove", userId: await userIdOf("trainee2@tidemark.example") },
            c,
          ),
          args(demoClass),
        )
      ).status,
    ).toBe(403);
    expect(
      (await callRoute(classGradebook.loader, get(`/classes/${demoClass}/gradebook`, c), args(demoClass))).status,
    ).toBe(403);
    expect((await callRoute(gradebook.loader, get("/gradebook", c))).status).toBe(403);
    expect(
      (await callRoute(gradebookCsv.loader, get(`/classes/${demoClass}/gradebook.csv`, c), args(demoClass))).status,
    ).toBe(403);
    expect((await callRoute(present.loader, get(`/classes/${demoClass}/present`, c), args(demoClass))).status).toBe(
      403,
    );
    const post = new Request(`${ORIGIN}/classes/${demoClass}/live`, {
      method: "POST",
      headers: { cookie: c, "Content-Type": "application/json" },
      body: JSON.stringify({ spec: SPEC }),
    });
    expect((await callRoute(live.action, post, args(demoClass))).status).toBe(404);
    const page = await callRoute(follow.loader, get(`/classes/${demoClass}/follow`, c), args(demoClass));
    expect(page.status).toBe(200);
    expect(page.data.cls.id).toBe(demoClass);
    const ctrl = new AbortController();
    const stream = await callRoute(
      live.loader,
      new Request(`${ORIGIN}/classes/${demoClass}/live`, { headers: { cookie: c }, signal: ctrl.signal }),
      args(demoClass),
    );
    expect(stream.status).toBe(200);
    expect(stream.headers.get("content-type")).toMatch(/^text\/event-stream/);
    ctrl.abort();
  });

  it("a trainee outside the class, a stranger and a malformed id get nothing", async () => {
    expect(
      (await callRoute(follow.loader, get(`/classes/${demoClass}/follow`, cookies.trainee4), args(demoClass))).status,
    ).toBe(404);
    expect(
      (await callRoute(live.loader, get(`/classes/${demoClass}/live`, cookies.trainee4), args(demoClass))).status,
    ).toBe(404);
    expect((await callRoute(live.loader, get(`/classes/${demoClass}/live`), args(demoClass))).status).toBe(401);
    expect(
      (await callRoute(gradebookCsv.loader, get(`/classes/${demoClass}/gradebook.csv`), args(demoClass))).status,
    ).toBe(401);
    const anon = await callRoute(classesIndex.loader, get("/classes"));
    expect(anon.status).toBe(302);
    expect(anon.location).toMatch(/^\/login\?redirectTo=/);
    for (const bad of ["not-a-uuid", "00000000-0000-4000-8000-000000000000"]) {
      expect((await callRoute(classPage.loader, get(`/classes/${bad}`, cookies.trainer), args(bad))).status).toBe(404);
      expect(
        (await callRoute(gradebookCsv.loader, get(`/classes/${bad}/gradebook.csv`, cookies.admin), args(bad))).status,
      ).toBe(404);
      expect((await callRoute(follow.loader, get(`/classes/${bad}/follow`, cookies.trainee), args(bad))).status).toBe(
        404,
      );
    }
  });

  it("admins see every class of their organisation", async () => {
    expect(
      (await callRoute(classPage.loader, get(`/classes/${demoClass}`, cookies.admin), args(demoClass))).status,
    ).toBe(200);
    const list = await callRoute(classesIndex.loader, get("/classes", cookies.admin));
    expect(list.data.classes.map((x: { id: string }) => x.id)).toContain(demoClass);
  });

  it("an attempt is seen by its trainee, their class's trainer and admins; nobody else", async () => {
    const attempt = await insertAttempt(await userIdOf("trainee@tidemark.example"), LESSON);
    const open = (cookie: string) =>
      callRoute(review.loader, get(`/attempts/${attempt}/review`, cookie), args(attempt));
    expect((await open(cookies.trainee2)).status).toBe(404);
    expect((await open(cookies.trainee4)).status).toBe(404);
    expect((await open(cookies.trainer2)).status).toBe(404);
    const own = await open(cookies.trainee);
    expect(own.status).toBe(200);
    expect(own.data.canReview).toBe(false);
    const trainer = await open(cookies.trainer);
    expect(trainer.status).toBe(200);
    expect(trainer.data.canReview).toBe(true);
    expect((await open(cookies.admin)).data.canReview).toBe(true);
    const comment = { comment: "Looks fine" };
    expect(
      (await callRoute(review.action, formPost(`/attempts/${attempt}/review`, comment, cookies.trainee), args(attempt)))
        .status,
    ).toBe(403);
    expect(
      (
        await callRoute(
          review.action,
          formPost(`/attempts/${attempt}/review`, comment, cookies.trainer2),
          args(attempt),
        )
      ).status,
    ).toBe(404);
    expect(await database.db()("attempt_reviews").where({ attempt_id: attempt }).count("* as n").first()).toMatchObject(
      { n: "0" },
    );
    expect((await callRoute(review.loader, get("/attempts/nope/review", cookies.admin), args("nope"))).status).toBe(
      404,
    );
  });
});
