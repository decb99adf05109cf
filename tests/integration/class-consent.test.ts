import { beforeAll, describe, expect, it } from "vitest";
import { useTestDatabase } from "../support/db";
import {
  callRoute,
  formPost,
  get,
  linkIn,
  sessionCookie,
  uniqueAddress,
  userIdOf,
  waitForMail,
} from "../support/accounts";
import { demoClassId, ensureLesson, ensureSpool, insertAttempt, makeTrainee } from "../support/classes";
import * as classesIndex from "~/routes/classes._index";
import * as classPage from "~/routes/classes.$id";
import * as invite from "~/routes/invite.$token";
import * as review from "~/routes/attempts.$id.review";
import * as attemptsApi from "~/routes/api.v1.attempts";
import * as classGradebook from "~/routes/classes.$id.gradebook";
import * as gradebookCsv from "~/routes/classes.$id.gradebook-csv";

// Issue 13, defect 3: a trainer could enrol any existing account into their own class without its
// consent, then read that trainee's attempts and override grades counted in another trainer's
// gradebook. Joining needs the trainee's acceptance; reviews and overrides are for attempts at one's
// own class's assignments; a class's gradebook shows only overrides made by those who run it.
const database = useTestDatabase();
const SPRING_LESSON = "zz-consent-spring";
const OTHER_LESSON = "zz-consent-other";

let trainer: string;
let trainer2: string;
let spring: string;
let traineeEmail: string;
let traineeId: string;

beforeAll(async () => {
  ensureSpool();
  trainer = await sessionCookie("trainer@tidemark.example");
  trainer2 = await sessionCookie("trainer2@tidemark.example");
  spring = await demoClassId();
  await ensureLesson(SPRING_LESSON, "Consent test lesson", 950);
  await ensureLesson(OTHER_LESSON, "Consent other lesson", 951);
  await database
    .db()("assignments")
    .insert({ class_id: spring, lesson_slug: SPRING_LESSON })
    .onConflict(["class_id", "lesson_slug"])
    .ignore();
  traineeEmail = uniqueAddress("consent-trainee");
  traineeId = await makeTrainee(traineeEmail, "Odile Parsk", spring);
});

async function classOfTrainer2(name: string, lessons: string[] = []) {
  const r = await callRoute(
    classesIndex.action,
    formPost("/classes", { name, startsOn: "", endsOn: "", venue: "" }, trainer2),
  );
  expect(r.status).toBe(302);
  const id = /^\/classes\/([0-9a-f-]{36})/.exec(r.location!)![1];
  for (const slug of lessons) await database.db()("assignments").insert({ class_id: id, lesson_slug: slug });
  return id;
}

const member = async (classId: string, userId: string) =>
  !!(await database.db()("class_members").where({ class_id: classId, user_id: userId }).first("user_id"));

describe("adding an existing account to a class", () => {
  it("sends an invitation; the account is not a member, and its attempts stay closed, until it accepts", async () => {
    const other = await classOfTrainer2("Consent cohort A");
    const attemptId = await insertAttempt(traineeId, SPRING_LESSON, { score: 10, passed: false });

    const r = await callRoute(
      classPage.action,
      formPost(`/classes/${other}`, { intent: "invite", addresses: traineeEmail }, trainer2),
      { params: { id: other } },
    );
    expect(r.status).toBe(200);
    expect(r.data.report.askedToJoin).toEqual([traineeEmail]);
    expect(await member(other, traineeId)).toBe(false);

    // Not a member yet: trainer2 reads nothing of the trainee's.
    const list = await callRoute(attemptsApi.loader, get(`/api/v1/attempts?trainee=${traineeId}`, trainer2));
    expect(list.status).toBe(403);
    const page = await callRoute(review.loader, get(`/attempts/${attemptId}/review`, trainer2), {
      params: { id: attemptId },
    });
    expect(page.status).toBe(404);

    // The e-mail carries a link the trainee accepts while signed in as themselves.
    const mail = await waitForMail(traineeEmail, { subject: /join|invited/i });
    expect(mail.text).toContain("Consent cohort A");
    const token = linkIn(mail, "/invite/").pathname.split("/").pop()!;
    const view = await callRoute(invite.loader, get(`/invite/${token}`, await sessionCookie(traineeEmail)), {
      params: { token },
    });
    expect(view.status).toBe(200);
    expect(view.data.invitation).toMatchObject({
      existingAccount: true,
      className: "Consent cohort A",
      signedInAsInvitee: true,
    });

    // Someone else signed in cannot use it for them.
    const wrong = await callRoute(
      invite.action,
      formPost(`/invite/${token}`, { intent: "join" }, await sessionCookie("trainee2@tidemark.example")),
      { params: { token } },
    );
    expect(wrong.status).toBe(403);
    expect(await member(other, traineeId)).toBe(false);

    const join = await callRoute(
      invite.action,
      formPost(`/invite/${token}`, { intent: "join" }, await sessionCookie(traineeEmail)),
      { params: { token } },
    );
    expect(join.status).toBe(302);
    expect(join.location).toBe(`/classes/${other}`);
    expect(await member(other, traineeId)).toBe(true);
    // Used once.
    const again = await callRoute(
      invite.action,
      formPost(`/invite/${token}`, { intent: "join" }, await sessionCookie(traineeEmail)),
      { params: { token } },
    );
    expect(again.status).toBe(410);
  });
});

describe("reviews and overrides across classes", () => {
  it("a trainer may override only attempts at their own class's assignments, and another class's gradebook never shows it", async () => {
    // Trainee in both classes (as if accepted); trainer2's class assigns a different lesson.
    const other = await classOfTrainer2("Consent cohort B", [OTHER_LESSON]);
    await database.db()("class_members").insert({ class_id: other, user_id: traineeId });
    const springAttempt = await insertAttempt(traineeId, SPRING_LESSON, { score: 30, passed: false });
    const otherAttempt = await insertAttempt(traineeId, OTHER_LESSON, { score: 30, passed: false });

    const override = { comment: "", override: "on", score: "100", passed: "yes", reason: "Looks fine to me" };
    const refused = await callRoute(review.action, formPost(`/attempts/${springAttempt}/review`, override, trainer2), {
      params: { id: springAttempt },
    });
    expect(refused.status).toBe(403);
    expect(await database.db()("attempt_reviews").where({ attempt_id: springAttempt }).first()).toBeUndefined();
    const shown = await callRoute(review.loader, get(`/attempts/${springAttempt}/review`, trainer2), {
      params: { id: springAttempt },
    });
    expect(shown.data?.canReview ?? false).toBe(false);

    const allowed = await callRoute(review.action, formPost(`/attempts/${otherAttempt}/review`, override, trainer2), {
      params: { id: otherAttempt },
    });
    expect(allowed.status).toBe(200);

    // An override recorded by an outsider (e.g. before this rule) does not reach the spring gradebook or its CSV.
    await database
      .db()("attempt_reviews")
      .insert({
        attempt_id: springAttempt,
        reviewer_id: await userIdOf("trainer2@tidemark.example"),
        comment: "",
        override_score: 100,
        override_passed: true,
        reason: "outsider",
      });
    const book = await callRoute(classGradebook.loader, get(`/classes/${spring}/gradebook`, trainer), {
      params: { id: spring },
    });
    const row = book.data.book.rows.find((x: { traineeId: string }) => x.traineeId === traineeId);
    expect(row.cells[SPRING_LESSON]).toMatchObject({ score: 30, passed: false, overridden: false });
    const csv = await (
      await gradebookCsv.loader({
        request: get(`/classes/${spring}/gradebook.csv`, trainer),
        params: { id: spring },
        context: {},
      } as never)
    ).text();
    const line = csv.split("\r\n").find((l) => l.includes(traineeEmail))!;
    expect(line).not.toMatch(/override/);

    // The spring trainer's own override does count there.
    const mine = await callRoute(
      review.action,
      formPost(`/attempts/${springAttempt}/review`, { ...override, score: "75", reason: "Second look" }, trainer),
      { params: { id: springAttempt } },
    );
    expect(mine.status).toBe(200);
    const after = await callRoute(classGradebook.loader, get(`/classes/${spring}/gradebook`, trainer), {
      params: { id: spring },
    });
    const row2 = after.data.book.rows.find((x: { traineeId: string }) => x.traineeId === traineeId);
    expect(row2.cells[SPRING_LESSON]).toMatchObject({ score: 75, passed: true, overridden: true });
  });
});
