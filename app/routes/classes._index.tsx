import { Day, DateRange } from "~/components/dates";
import { data, Form, Link, redirect } from "react-router";
import { CalendarDays, MapPin, Radio, Users } from "lucide-react";
import type { Route } from "./+types/classes._index";
import { requirePermission, requireUser } from "~/lib/auth.server";
import {
  assignmentsForTrainee,
  createClass,
  listClassesFor,
  type ClassSummary,
  type MyAssignment,
} from "~/lib/classes.server";
import { parseClassDetails } from "~/lib/class-form";
import { can } from "~/lib/permissions";
import { GeneralErrorBoundary } from "~/components/error-boundary";
import { ClassDetailsFields } from "~/components/classes/class-details-fields";
import { GradeMark } from "~/components/classes/grade-mark";
import { FormError, SubmitButton } from "~/components/form-field";

export const meta: Route.MetaFunction = () => [{ title: "Classes · Fallwright" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const classes = await listClassesFor(user);
  const manages = can(user.role, "classes:manage");
  const assignments = manages
    ? {}
    : await assignmentsForTrainee(
        user.id,
        classes.map((c) => c.id),
      );
  return { role: user.role, manages, classes, assignments, today: new Date().toISOString().slice(0, 10) };
}

export async function action({ request }: Route.ActionArgs) {
  const user = await requirePermission(request, "classes:manage");
  const form = await request.formData();
  const parsed = parseClassDetails(form);
  if (!parsed.ok) return data({ errors: parsed.errors, values: parsed.values }, { status: 400 });
  const id = await createClass(user, parsed.value);
  throw redirect(`/classes/${id}?created=1`);
}

export default function Classes({ loaderData, actionData }: Route.ComponentProps) {
  const { role, manages, classes, assignments, today } = loaderData;
  const result = actionData;
  return (
    <div className="grid gap-8">
      <header>
        <h1 className="text-display font-bold tracking-tight">Classes</h1>
        <p className="mt-2 max-w-2xl text-ink-soft">
          {manages
            ? role === "admin"
              ? "Every class in your organisation: roster, invitations, assignments, gradebook and live sessions."
              : "Your cohorts: invite trainees, hand out lessons with due dates, follow their grades and present live."
            : "The classes you belong to, what is assigned and when it is due."}
        </p>
      </header>
      {manages ? (
        <>
          <ClassTable classes={classes} showTrainer={role === "admin"} />
          <section className="card max-w-2xl" aria-labelledby="new-class">
            <h2 id="new-class" className="text-lg font-bold">
              New class
            </h2>
            <Form method="post" className="mt-4 grid gap-4" noValidate>
              {result?.errors && Object.keys(result.errors).length ? (
                <FormError message="Check the highlighted fields." />
              ) : null}
              <ClassDetailsFields values={result?.values} errors={result?.errors} />
              <div>
                <SubmitButton pendingText="Creating…">Create class</SubmitButton>
              </div>
            </Form>
          </section>
        </>
      ) : (
        <TraineeClasses classes={classes} assignments={assignments} today={today} />
      )}
    </div>
  );
}

function ClassTable({ classes, showTrainer }: { classes: ClassSummary[]; showTrainer: boolean }) {
  if (!classes.length) {
    return (
      <p className="card max-w-2xl text-ink-soft">
        No classes yet. Create the first one below; you can invite trainees straight after.
      </p>
    );
  }
  return (
    <div className="overflow-x-auto">
      <table className="data-table w-full bg-sheet">
        <caption className="sr-only">Classes</caption>
        <thead>
          <tr>
            <th scope="col">Class</th>
            {showTrainer ? <th scope="col">Trainer</th> : null}
            <th scope="col">Dates</th>
            <th scope="col">Venue</th>
            <th scope="col" className="text-right">
              Trainees
            </th>
            <th scope="col" className="text-right">
              Invited
            </th>
            <th scope="col" className="text-right">
              Lessons
            </th>
            <th scope="col">
              <span className="sr-only">Open</span>
            </th>
          </tr>
        </thead>
        <tbody>
          {classes.map((c) => (
            <tr key={c.id}>
              <th scope="row">
                <Link className="underline" to={`/classes/${c.id}`}>
                  {c.name}
                </Link>
              </th>
              {showTrainer ? <td>{c.trainer_name}</td> : null}
              <td>
                <DateRange from={c.starts_on} to={c.ends_on} />
              </td>
              <td>{c.venue || <span className="text-ink-soft">—</span>}</td>
              <td className="text-right">{c.members}</td>
              <td className="text-right">{c.pending}</td>
              <td className="text-right">{c.assignments}</td>
              <td className="whitespace-nowrap text-right">
                <Link className="underline" to={`/classes/${c.id}/gradebook`}>
                  Gradebook
                </Link>
                {" · "}
                <Link className="underline" to={`/classes/${c.id}/present`}>
                  Present
                </Link>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function TraineeClasses({
  classes,
  assignments,
  today,
}: {
  classes: ClassSummary[];
  assignments: Record<string, MyAssignment[]>;
  today: string;
}) {
  if (!classes.length) {
    return (
      <p className="card max-w-2xl text-ink-soft">
        You are not in a class yet. When a trainer invites you, the class appears here with its lessons and due dates.
      </p>
    );
  }
  return (
    <div className="grid gap-6">
      {classes.map((c) => (
        <section key={c.id} className="card" aria-labelledby={`class-${c.id}`}>
          <div className="flex flex-wrap items-start justify-between gap-3">
            <div>
              <h2 id={`class-${c.id}`} className="text-xl font-bold">
                {c.name}
              </h2>
              <p className="mt-1 flex flex-wrap gap-x-4 gap-y-1 text-sm text-ink-soft">
                <span className="inline-flex items-center gap-1">
                  <CalendarDays aria-hidden="true" className="h-4 w-4" />
                  <DateRange from={c.starts_on} to={c.ends_on} />
                </span>
                {c.venue ? (
                  <span className="inline-flex items-center gap-1">
                    <MapPin aria-hidden="true" className="h-4 w-4" />
                    {c.venue}
                  </span>
                ) : null}
                <span className="inline-flex items-center gap-1">
                  <Users aria-hidden="true" className="h-4 w-4" />
                  Trainer: {c.trainer_name}
                </span>
              </p>
            </div>
            <Link className="btn" to={`/classes/${c.id}/follow`}>
              <Radio aria-hidden="true" className="h-4 w-4" /> Follow live
            </Link>
          </div>
          {assignments[c.id]?.length ? (
            <table className="data-table mt-4 w-full">
              <caption className="sr-only">Assigned lessons for {c.name}</caption>
              <thead>
                <tr>
                  <th scope="col">Lesson</th>
                  <th scope="col">Due</th>
                  <th scope="col">Your best</th>
                </tr>
              </thead>
              <tbody>
                {assignments[c.id].map((a) => {
                  const late = a.dueOn && a.dueOn < today && !a.cell?.passed;
                  return (
                    <tr key={a.slug}>
                      <td>
                        <Link className="underline" to={`/lessons/${a.slug}`}>
                          {a.title}
                        </Link>
                      </td>
                      <td className={late ? "font-medium text-bad" : undefined}>
                        {a.dueOn ? <Day iso={a.dueOn} /> : <span className="text-ink-soft">No due date</span>}
                        {late ? " · overdue" : null}
                      </td>
                      <td>
                        {a.cell ? (
                          <Link className="no-underline hover:underline" to={`/attempts/${a.cell.attemptId}`}>
                            <GradeMark cell={a.cell} />
                          </Link>
                        ) : (
                          <GradeMark cell={null} />
                        )}
                      </td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          ) : (
            <p className="mt-4 text-sm text-ink-soft">No lessons assigned yet.</p>
          )}
        </section>
      ))}
    </div>
  );
}

export function ErrorBoundary() {
  return <GeneralErrorBoundary />;
}
