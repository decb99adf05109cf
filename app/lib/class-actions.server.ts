/** The /classes/:id page's form handlers (one per intent), kept out of the route module. */
import { data } from "react-router";
import type { SessionUser } from "~/lib/auth.server";
import { inviteToClass } from "~/lib/class-invites.server";
import type { InviteReport } from "~/lib/roster";
import { isIsoDay, parseClassDetails, type ClassDetailsField, type ClassDetailsValues } from "~/lib/class-form";
import {
  isUuid,
  listLessons,
  removeMember,
  saveAssignments,
  updateClass,
  withdrawInvitation,
  type ClassRow,
} from "~/lib/classes.server";
import { clientIp } from "~/lib/rate-limit.server";
import { appOrigin } from "~/lib/app-url";
import type { AppLoadContext } from "react-router";
import { followCourse } from "~/lib/courses/courses.server";
import { issueCertificatesForClass } from "~/lib/certificates/certificates.server";

export interface ClassActionResult {
  intent: string;
  notice?: string;
  error?: string;
  errors?: Partial<Record<ClassDetailsField, string>>;
  values?: ClassDetailsValues;
  report?: InviteReport;
  /** What goes back into the invite box: the addresses that could not be read. */
  text?: string;
  assignmentErrors?: Record<string, string>;
  courseError?: string;
}

const reply = (result: ClassActionResult, status = 200) => data(result, { status });

export async function handleClassAction(o: {
  request: Request;
  context: AppLoadContext;
  user: SessionUser;
  cls: ClassRow;
  form: FormData;
}) {
  const { form, cls } = o;
  const intent = String(form.get("intent") ?? "");
  switch (intent) {
    case "details": {
      const parsed = parseClassDetails(form);
      if (!parsed.ok) return reply({ intent, errors: parsed.errors, values: parsed.values }, 400);
      await updateClass(cls.id, parsed.value);
      return reply({ intent, notice: "Class details saved." });
    }
    case "invite": {
      const text = String(form.get("addresses") ?? "");
      if (!text.trim()) return reply({ intent, error: "Paste at least one e-mail address.", text }, 400);
      if (text.length > 50_000)
        return reply({ intent, error: "That list is too long; paste at most 200 addresses at a time.", text: "" }, 400);
      const report = await inviteToClass({
        classId: cls.id,
        text,
        inviter: o.user,
        origin: appOrigin(),
        ip: clientIp(o.context),
      });
      const nothingValid =
        !report.invited.length &&
        !report.askedToJoin.length &&
        !report.alreadyMember.length &&
        !report.alreadyInvited.length &&
        !report.refused.length;
      return reply({ intent, report, text: report.invalid.join("\n") }, nothingValid ? 400 : 200);
    }
    case "remove": {
      const userId = String(form.get("userId") ?? "");
      const removed = isUuid(userId) ? await removeMember(cls.id, userId) : null;
      if (!removed) return reply({ intent, error: "That person is not in this class (any more)." }, 404);
      return reply({ intent, notice: `${removed} was removed from the class. Their attempts are kept.` });
    }
    case "withdraw": {
      const email = String(form.get("email") ?? "").slice(0, 320);
      const n = await withdrawInvitation(cls.id, email);
      if (!n) return reply({ intent, error: "There is no open invitation for that address." }, 404);
      return reply({ intent, notice: `The invitation to ${email} was withdrawn; its link no longer works.` });
    }
    case "assignments": {
      const known = new Set((await listLessons(cls.organisation_id)).map((l) => l.slug));
      const chosen = form
        .getAll("assign")
        .map(String)
        .filter((s) => known.has(s));
      const errors: Record<string, string> = {};
      const items = chosen.map((slug) => {
        const due = String(form.get(`due:${slug}`) ?? "").trim();
        if (due && !isIsoDay(due)) errors[slug] = "Use a date like 2027-03-01.";
        return { slug, dueOn: due || null };
      });
      if (Object.keys(errors).length) return reply({ intent, assignmentErrors: errors }, 400);
      await saveAssignments(cls.id, [...new Map(items.map((i) => [i.slug, i])).values()]);
      return reply({
        intent,
        notice: items.length
          ? `${items.length} lesson${items.length === 1 ? "" : "s"} assigned.`
          : "No lessons are assigned now.",
      });
    }
    case "course": {
      // The class follows a course: its lessons assigned in one step (docs/product.md capability 10).
      const courseId = String(form.get("courseId") ?? "");
      const done = courseId === "" || isUuid(courseId) ? await followCourse(cls, courseId || null) : null;
      if (!done) return reply({ intent, courseError: "Choose one of your organisation's courses (courseId)." }, 400);
      if (!courseId) return reply({ intent, notice: "The class follows no course now; its assignments stay." });
      const issued = await issueCertificatesForClass(cls.id);
      return reply({
        intent,
        notice: `The class follows the course: ${done.assigned} lesson${done.assigned === 1 ? "" : "s"} assigned${cls.ends_on ? ", due dates spread over the class's dates" : ""}.${issued ? ` ${issued} trainee${issued === 1 ? " has" : "s have"} already passed every lesson and got the certificate.` : ""}`,
      });
    }
    default:
      return reply({ intent, error: "Unknown action." }, 400);
  }
}
