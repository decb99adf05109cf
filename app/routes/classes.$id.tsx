import { DateRange } from "~/components/dates";
import { Form, Link } from "react-router";
import { BookOpenCheck, CalendarDays, MapPin, MonitorPlay, Radio, Table2 } from "lucide-react";
import type { Route } from "./+types/classes.$id";
import { requirePermission } from "~/lib/auth.server";
import { handleClassAction } from "~/lib/class-actions.server";
import { classAssignments, classRoster, findClassFor, listLessons, pendingInvitations } from "~/lib/classes.server";
import { GeneralErrorBoundary } from "~/components/error-boundary";
import { AssignmentsForm } from "~/components/classes/assignments-form";
import { ClassDetailsFields } from "~/components/classes/class-details-fields";
import { InviteForm } from "~/components/classes/invite-form";
import { PendingInvitations, RosterTable } from "~/components/classes/roster";
import { FormError, FormNotice, SubmitButton } from "~/components/form-field";
import { classCourseChoice } from "~/lib/courses/courses.server";
import { FollowCourseForm } from "~/components/courses/follow-course-form";

export const meta: Route.MetaFunction = ({ data }) => [
  { title: `${data?.cls.name ?? "Class"} · Classes · Fallwright` },
];

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requirePermission(request, "classes:manage");
  const cls = await findClassFor(user, params.id, "manage");
  const [members, pending, assignments, lessons, course] = await Promise.all([
    classRoster(cls.id),
    pendingInvitations(cls.id),
    classAssignments(cls.id),
    listLessons(cls.organisation_id),
    classCourseChoice(user, cls.id),
  ]);
  const created = new URL(request.url).searchParams.get("created") === "1";
  return { cls, members, pending, assignments, lessons, created, course };
}

export async function action({ request, params, context }: Route.ActionArgs) {
  const user = await requirePermission(request, "classes:manage");
  const cls = await findClassFor(user, params.id, "manage");
  const form = await request.formData();
  return handleClassAction({ request, context, user, cls, form });
}

export default function ClassPage({ loaderData, actionData }: Route.ComponentProps) {
  const { cls, members, pending, assignments, lessons, created, course } = loaderData;
  const result = actionData;
  const detailsFailed = result?.intent === "details" && !!result.errors;
  const notice =
    result?.notice ?? (created && !result ? "Class created. Invite trainees and assign lessons below." : null);
  return (
    <div className="grid gap-8">
      <header className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <p className="text-sm">
            <Link className="underline" to="/classes">
              Classes
            </Link>
          </p>
          <h1 className="text-display font-bold tracking-tight">{cls.name}</h1>
          <p className="mt-2 flex flex-wrap gap-x-5 gap-y-1 text-ink-soft">
            <span className="inline-flex items-center gap-1">
              <CalendarDays aria-hidden="true" className="h-4 w-4" />
              <DateRange from={cls.starts_on} to={cls.ends_on} />
            </span>
            {cls.venue ? (
              <span className="inline-flex items-center gap-1">
                <MapPin aria-hidden="true" className="h-4 w-4" />
                {cls.venue}
              </span>
            ) : null}
            <span>Trainer: {cls.trainer_name}</span>
          </p>
        </div>
        <nav aria-label="Class tools" className="flex flex-wrap gap-2">
          <Link className="btn" to={`/classes/${cls.id}/gradebook`}>
            <Table2 aria-hidden="true" className="h-4 w-4" /> Gradebook
          </Link>
          <Link className="btn-primary" to={`/classes/${cls.id}/present`}>
            <MonitorPlay aria-hidden="true" className="h-4 w-4" /> Present
          </Link>
          <Link className="btn" to={`/classes/${cls.id}/follow`}>
            <Radio aria-hidden="true" className="h-4 w-4" /> Follower's view
          </Link>
        </nav>
      </header>

      <div aria-live="polite">
        <FormNotice message={notice} />
        {result?.intent !== "invite" ? <FormError message={result?.error} /> : null}
      </div>

      <div className="grid gap-8 lg:grid-cols-[3fr_2fr]">
        <section className="card" aria-labelledby="roster">
          <h2 id="roster" className="text-lg font-bold">
            Roster <span className="font-normal text-ink-soft">({members.length})</span>
          </h2>
          <div className="mt-3">
            <RosterTable members={members} className={cls.name} />
          </div>
        </section>
        <div className="grid content-start gap-8">
          <section className="card" aria-labelledby="invite">
            <h2 id="invite" className="text-lg font-bold">
              Invite trainees
            </h2>
            <div className="mt-3">
              <InviteForm
                report={result?.intent === "invite" ? result.report : undefined}
                text={result?.intent === "invite" ? result.text : undefined}
                error={result?.intent === "invite" ? result.error : undefined}
              />
            </div>
          </section>
          <section className="card" aria-labelledby="pending">
            <h2 id="pending" className="text-lg font-bold">
              Pending invitations{" "}
              <span className="font-normal text-ink-soft">({pending.filter((p) => !p.expired).length})</span>
            </h2>
            <div className="mt-2">
              <PendingInvitations pending={pending} />
            </div>
          </section>
        </div>
      </div>

      <section className="card" aria-labelledby="assignments">
        <h2 id="assignments" className="flex items-center gap-2 text-lg font-bold">
          <BookOpenCheck aria-hidden="true" className="h-5 w-5" /> Assigned lessons
        </h2>
        <p className="mt-1 text-sm text-ink-soft">
          Tick the lessons this class must do and give each a due date. Trainees see them on their Classes page; the
          gradebook has a column for each.
        </p>
        <div className="mt-3">
          <FollowCourseForm
            key={course.courseId ?? "none"}
            courseId={course.courseId}
            courses={course.courses}
            hasDates={!!cls.ends_on}
            error={result?.intent === "course" ? result.courseError : undefined}
          />
        </div>
        <div className="mt-3">
          <AssignmentsForm
            key={assignments.map((a) => `${a.lesson_slug}:${a.due_on}`).join()}
            lessons={lessons}
            assigned={assignments}
            errors={result?.assignmentErrors}
          />
        </div>
      </section>

      <details key={detailsFailed ? "open" : "closed"} open={detailsFailed || undefined} className="card">
        <summary className="cursor-pointer font-bold">Edit name, dates and venue</summary>
        <Form method="post" className="mt-4 grid max-w-2xl gap-4" noValidate>
          <input type="hidden" name="intent" value="details" />
          <ClassDetailsFields
            values={
              result?.intent === "details" && result.values
                ? result.values
                : { name: cls.name, startsOn: cls.starts_on ?? "", endsOn: cls.ends_on ?? "", venue: cls.venue }
            }
            errors={result?.intent === "details" ? result.errors : undefined}
          />
          <div>
            <SubmitButton intent="details" pendingText="Saving…">
              Save details
            </SubmitButton>
          </div>
        </Form>
      </details>
    </div>
  );
}

export function ErrorBoundary() {
  return <GeneralErrorBoundary />;
}
