import { data, Form, Link } from "react-router";
import { ArrowDown, ArrowUp, Trash2 } from "lucide-react";
import type { Route } from "./+types/courses.$id";
import { requirePermission } from "~/lib/auth.server";
import { db } from "~/lib/db.server";
import { classesFollowing, courseLessonChoices, courseLessons, getCourseFor } from "~/lib/courses/courses.server";
import { handleCourseAction } from "~/lib/courses/course-actions.server";
import { GeneralErrorBoundary } from "~/components/error-boundary";
import { CourseFields } from "~/components/courses/course-fields";
import { DateRange } from "~/components/dates";
import { FormError, FormNotice, SubmitButton } from "~/components/form-field";

export const meta: Route.MetaFunction = ({ data }) => [
  { title: `${data?.course.name ?? "Course"} · Courses · Fallwright` },
];

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requirePermission(request, "courses:view");
  const course = await getCourseFor(user, params.id, "view");
  if (!course) throw data("Course not found", { status: 404 });
  const [lessons, choices, classes] = await Promise.all([
    courseLessons(course.id),
    course.canManage ? courseLessonChoices(db(), user) : Promise.resolve([]),
    classesFollowing(user, course.id),
  ]);
  const created = new URL(request.url).searchParams.get("created") === "1";
  return { course, lessons, choices, classes, created };
}

export async function action({ request, params }: Route.ActionArgs) {
  const user = await requirePermission(request, "courses:manage");
  const course = await getCourseFor(user, params.id, "manage");
  if (!course) throw data("Course not found", { status: 404 });
  return handleCourseAction(user, course, await request.formData());
}

export default function CoursePage({ loaderData, actionData }: Route.ComponentProps) {
  const { course, lessons, choices, classes, created } = loaderData;
  const result = actionData;
  const inCourse = new Set(lessons.map((l) => l.slug));
  const addable = choices.filter((c) => !inCourse.has(c.slug));
  const detailsFailed = result?.intent === "details" && !!result.errors;
  const notice = result?.notice ?? (created && !result ? "Course created. Add its lessons below." : null);
  return (
    <div className="grid gap-8">
      <header>
        <p className="text-sm">
          <Link className="underline" to="/courses">
            Courses
          </Link>
        </p>
        <h1 className="text-display font-bold tracking-tight">{course.name}</h1>
        {course.description ? <p className="mt-2 max-w-2xl text-ink-soft">{course.description}</p> : null}
      </header>

      <div aria-live="polite">
        <FormNotice message={notice} />
        <FormError message={result?.error} />
      </div>

      <section className="card" aria-labelledby="course-lessons">
        <h2 id="course-lessons" className="text-lg font-bold">
          Lessons <span className="font-normal text-ink-soft">({lessons.length})</span>
        </h2>
        {lessons.length ? (
          <ol className="mt-3 grid gap-2" data-testid="course-lessons">
            {lessons.map((l, i) => (
              <li key={l.slug} className="flex flex-wrap items-center gap-3 rounded border border-rule px-3 py-2">
                <span className="w-6 text-right tabular-nums text-ink-soft">{i + 1}.</span>
                <Link className="flex-1 underline" to={`/lessons/${l.slug}`}>
                  {l.title}
                </Link>
                {course.canManage ? (
                  <Form method="post" className="flex gap-1">
                    <input type="hidden" name="lesson" value={l.slug} />
                    <input type="hidden" name="intent" value="move" />
                    <button
                      type="submit"
                      name="direction"
                      value="up"
                      className="btn"
                      disabled={i === 0}
                      aria-label={`Move “${l.title}” up`}
                    >
                      <ArrowUp aria-hidden="true" className="h-4 w-4" />
                    </button>
                    <button
                      type="submit"
                      name="direction"
                      value="down"
                      className="btn"
                      disabled={i === lessons.length - 1}
                      aria-label={`Move “${l.title}” down`}
                    >
                      <ArrowDown aria-hidden="true" className="h-4 w-4" />
                    </button>
                  </Form>
                ) : null}
                {course.canManage ? (
                  <Form method="post">
                    <input type="hidden" name="lesson" value={l.slug} />
                    <button
                      type="submit"
                      name="intent"
                      value="remove"
                      className="btn"
                      aria-label={`Remove “${l.title}” from the course`}
                    >
                      <Trash2 aria-hidden="true" className="h-4 w-4" /> Remove
                    </button>
                  </Form>
                ) : null}
              </li>
            ))}
          </ol>
        ) : (
          <p className="mt-2 text-ink-soft">No lessons in this course yet.</p>
        )}
        {course.canManage ? (
          <Form method="post" className="mt-4 flex flex-wrap items-end gap-3" noValidate>
            <input type="hidden" name="intent" value="add" />
            <div>
              <label className="label" htmlFor="add-lesson">
                Add a lesson
              </label>
              <select
                id="add-lesson"
                name="lesson"
                className="field"
                key={result?.intent === "add" ? `${result.lesson}:${lessons.length}` : lessons.length}
                defaultValue={result?.intent === "add" && result.lessonError ? result.lesson : ""}
                aria-invalid={result?.lessonError ? true : undefined}
                aria-describedby={result?.lessonError ? "add-lesson-error" : undefined}
              >
                <option value="">Choose a lesson…</option>
                {addable.map((c) => (
                  <option key={c.slug} value={c.slug}>
                    {c.title}
                  </option>
                ))}
              </select>
              {result?.lessonError ? (
                <p id="add-lesson-error" className="field-error">
                  {result.lessonError}
                </p>
              ) : null}
            </div>
            <SubmitButton intent="add" pendingText="Adding…" className="btn">
              Add to the course
            </SubmitButton>
          </Form>
        ) : null}
      </section>

      <section className="card" aria-labelledby="following">
        <h2 id="following" className="text-lg font-bold">
          Classes following this course
        </h2>
        {classes.length ? (
          <ul className="mt-2 grid gap-1">
            {classes.map((k) => (
              <li key={k.id}>
                {course.canManage ? (
                  <Link className="underline" to={`/classes/${k.id}`}>
                    {k.name}
                  </Link>
                ) : (
                  k.name
                )}{" "}
                <span className="text-ink-soft">
                  (<DateRange from={k.starts_on} to={k.ends_on} />)
                </span>
              </li>
            ))}
          </ul>
        ) : (
          <p className="mt-2 text-ink-soft">
            {course.canManage ? "None yet. On a class's page, choose this course under “Course”." : "None of yours."}
          </p>
        )}
      </section>

      {course.canManage ? (
        <details key={detailsFailed ? "open" : "closed"} open={detailsFailed || undefined} className="card">
          <summary className="cursor-pointer font-bold">Edit name and description</summary>
          <Form method="post" className="mt-4 grid max-w-2xl gap-4" noValidate>
            <input type="hidden" name="intent" value="details" />
            <CourseFields
              values={
                result?.intent === "details" && result.values
                  ? result.values
                  : { name: course.name, description: course.description }
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
      ) : null}
    </div>
  );
}

export function ErrorBoundary() {
  return <GeneralErrorBoundary />;
}
