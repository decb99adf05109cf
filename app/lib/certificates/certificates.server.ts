/**
 * Certificates (docs/product.md capability 10): a trainee who has passed every lesson of a course
 * that one of their classes follows gets one certificate for that course, issued when the last
 * lesson not yet passed becomes passed (a graded attempt or a trainer's override). "Passed" is
 * the grading rule's (docs/grading.md), read as the class's gradebook reads it: the best grade,
 * with the class's trainer's and its organisation's admins' overrides. Its page is for its owner,
 * their trainers and the organisation's admins; the public verification page shows only the
 * certificate (docs/security.md, "Certificates").
 */
import type { SessionUser } from "~/lib/auth.server";
import { audit } from "~/lib/audit.server";
import { db } from "~/lib/db.server";
import { bestGrades, cellKey } from "~/lib/grades.server";
import { maySeeTraineeAttempts } from "~/lib/lessons/attempts.server";
import { isUuid } from "~/lib/input";
import { log } from "~/lib/log.server";
import { can } from "~/lib/permissions";
import { newVerificationCode, normaliseCode } from "~/lib/certificates/code.server";

export interface CertificateView {
  id: string;
  traineeId: string;
  traineeName: string;
  courseId: string;
  courseName: string;
  organisationName: string;
  /** yyyy-mm-dd, UTC. */
  issuedOn: string;
  code: string;
  revokedOn: string | null;
  revokeReason: string | null;
}

/** What the public verification page may show: nothing about the person but the name on it. */
export type PublicCertificate = Pick<
  CertificateView,
  "traineeName" | "courseName" | "organisationName" | "issuedOn" | "revokedOn"
>;

/** The name a certificate carries when its holder has not given one. */
export const NO_NAME = "(name not given)";

/**
 * Issues the certificates this grade completes: for each class of the trainee that follows a
 * course including `lessonSlug`, when every lesson of that course is now passed. Idempotent (one
 * certificate per trainee and course, unique in the table). Returns the new certificates' ids.
 */
export async function issueCertificatesFor(traineeId: string, lessonSlug: string): Promise<string[]> {
  const classes: { class_id: string; course_id: string; trainer_id: string; organisation_id: string }[] = await db()(
    "class_members as m",
  )
    .join("classes as k", "k.id", "m.class_id")
    .join("courses as c", "c.id", "k.course_id")
    .where("m.user_id", traineeId)
    .whereExists(db()("course_lessons as cl").whereRaw("cl.course_id = c.id").where("cl.lesson_slug", lessonSlug))
    .whereNotExists(db()("certificates as x").whereRaw("x.course_id = c.id").where("x.trainee_id", traineeId))
    .select("k.id as class_id", "c.id as course_id", "k.trainer_id", "c.organisation_id");
  const issued: string[] = [];
  for (const k of classes) {
    const slugs: string[] = (await db()("course_lessons").where({ course_id: k.course_id }).pluck("lesson_slug")) ?? [];
    if (!slugs.length) continue;
    const grades = await bestGrades([traineeId], slugs, { trainerId: k.trainer_id, organisationId: k.organisation_id });
    if (!slugs.every((s) => grades.get(cellKey(traineeId, s))?.passed)) continue;
    const rows = await db()("certificates")
      .insert({
        trainee_id: traineeId,
        course_id: k.course_id,
        organisation_id: k.organisation_id,
        code: newVerificationCode(),
      })
      .onConflict(["trainee_id", "course_id"])
      .ignore()
      .returning("id");
    for (const r of rows) issued.push(r.id as string);
  }
  return issued;
}

/**
 * For the places that grade (a new attempt, a trainer's override): issuing must never undo the
 * grade that was just stored, so a failure is logged and the grade stands; the next grade of
 * that course's lessons tries again.
 */
export async function issueCertificatesAfterGrade(traineeId: string, lessonSlug: string): Promise<void> {
  try {
    await issueCertificatesFor(traineeId, lessonSlug);
  } catch (error) {
    log().warn({ err: error, traineeId, lessonSlug }, "certificate check failed after a grade");
  }
}

/**
 * When a class starts to follow a course, its members who have already passed every lesson of it
 * get their certificate then: their last lesson was passed before the class followed the course.
 */
export async function issueCertificatesForClass(classId: string): Promise<number> {
  const cls = await db()("classes").where({ id: classId }).first("course_id");
  if (!cls?.course_id) return 0;
  const first = await db()("course_lessons").where({ course_id: cls.course_id }).first("lesson_slug");
  if (!first) return 0;
  const members: string[] = await db()("class_members").where({ class_id: classId }).pluck("user_id");
  let issued = 0;
  for (const m of members) issued += (await issueCertificatesFor(m, first.lesson_slug)).length;
  return issued;
}

const dayUtc = (col: string) => db().raw(`to_char(${col} at time zone 'UTC', 'YYYY-MM-DD')`);

function certificateQuery() {
  return db()("certificates as x")
    .join("users as u", "u.id", "x.trainee_id")
    .join("courses as c", "c.id", "x.course_id")
    .join("organisations as o", "o.id", "x.organisation_id")
    .select(
      "x.id",
      "x.trainee_id as traineeId",
      "u.name as traineeName",
      "x.course_id as courseId",
      "c.name as courseName",
      "o.name as organisationName",
      "x.code",
      "x.revoke_reason as revokeReason",
      "x.organisation_id as organisationId",
    )
    .select({ issuedOn: dayUtc("x.issued_at"), revokedOn: dayUtc("x.revoked_at") });
}

type Row = CertificateView & { organisationId: string };
const view = ({ organisationId: _org, ...r }: Row): CertificateView => ({
  ...r,
  traineeName: r.traineeName || NO_NAME,
});

/** Who may see a certificate: its owner, a trainer of one of their classes, an admin of its organisation. */
async function maySee(viewer: SessionUser, cert: Row): Promise<boolean> {
  if (viewer.id === cert.traineeId) return true;
  if (viewer.role === "admin") return viewer.organisationId === cert.organisationId;
  if (viewer.role === "trainer") return maySeeTraineeAttempts(db(), viewer, cert.traineeId);
  return false;
}

/** The certificate if this user may see it, with whether they may revoke it; else null (404). */
export async function certificateFor(
  viewer: SessionUser,
  id: string,
): Promise<{ certificate: CertificateView; canRevoke: boolean } | null> {
  if (!isUuid(id)) return null;
  const row: Row | undefined = await certificateQuery().where("x.id", id).first();
  if (!row || !(await maySee(viewer, row))) return null;
  return {
    certificate: view(row),
    canRevoke: can(viewer.role, "certificates:revoke") && viewer.id !== row.traineeId && !row.revokedOn,
  };
}

/** The public answer for a typed code, or null when no certificate has it. */
export async function verifyCertificate(typed: string): Promise<(PublicCertificate & { code: string }) | null> {
  const code = normaliseCode(typed);
  if (!code) return null;
  const row: Row | undefined = await certificateQuery().where("x.code", code).first();
  if (!row) return null;
  const v = view(row);
  return {
    traineeName: v.traineeName,
    courseName: v.courseName,
    organisationName: v.organisationName,
    issuedOn: v.issuedOn,
    revokedOn: v.revokedOn,
    code: v.code,
  };
}

/** Revokes a certificate with a reason, recorded in the audit log in the same transaction. False if it was already revoked. */
export async function revokeCertificate(o: {
  certificate: CertificateView;
  by: SessionUser;
  reason: string;
  ip: string | null;
}): Promise<boolean> {
  return db().transaction(async (trx) => {
    const n = await trx("certificates")
      .where({ id: o.certificate.id })
      .whereNull("revoked_at")
      .update({ revoked_at: trx.fn.now(), revoked_by: o.by.id, revoke_reason: o.reason });
    if (!n) return false;
    await audit(
      {
        action: "certificate_revoked",
        actorId: o.by.id,
        subjectId: o.certificate.traineeId,
        detail: {
          certificateId: o.certificate.id,
          course: o.certificate.courseName,
          code: o.certificate.code,
          reason: o.reason,
        },
        ip: o.ip,
      },
      trx,
    );
    return true;
  });
}

/** A trainee's own certificates, newest first (their Attempts page lists them). */
export async function certificatesOf(traineeId: string): Promise<CertificateView[]> {
  const rows: Row[] = await certificateQuery().where("x.trainee_id", traineeId).orderBy("x.issued_at", "desc");
  return rows.map(view);
}
