import { data, Form, Link, redirect } from "react-router";
import type { Route } from "./+types/courses._index";
import { requirePermission } from "~/lib/auth.server";
import { createCourse, listCoursesFor } from "~/lib/courses/courses.server";
import { parseCourseDetails } from "~/lib/courses/course-form";
import { can } from "~/lib/permissions";
import { GeneralErrorBoundary } from "~/components/error-boundary";
import { CourseFields } from "~/components/courses/course-fields";
import { FormError, SubmitButton } from "~/components/form-field";

export const meta: Route.MetaFunction = () => [{ title: "Courses · Fallwright" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requirePermission(request, "courses:view");
  const courses = await listCoursesFor(user);
  return { courses, manages: can(user.role, "courses:manage") };
}

export async function action({ request }: Route.ActionArgs) {
  const user = await requirePermission(request, "courses:manage");
  const parsed = parseCourseDetails(await request.formData());
  if (!parsed.ok) return data({ errors: parsed.errors, values: parsed.values }, { status: 400 });
  const id = await createCourse(user, parsed.value);
  throw redirect(`/courses/${id}?created=1`);
}

export default function Courses({ loaderData, actionData }: Route.ComponentProps) {
  const { courses, manages } = loaderData;
  return (
    <div className="grid gap-8">
      <header>
        <h1 className="text-display font-bold tracking-tight">Courses</h1>
        <p className="mt-2 max-w-2xl text-ink-soft">
          {manages
            ? "Lessons in the order your organisation teaches them. A class that follows a course gets its lessons as assignments, and a trainee who passes every lesson gets a certificate."
            : "The courses your classes follow. Pass every lesson of a course to get its certificate."}
        </p>
      </header>
      {courses.length ? (
        <div className="overflow-x-auto">
          <table className="data-table w-full bg-sheet">
            <caption className="sr-only">Courses</caption>
            <thead>
              <tr>
                <th scope="col">Course</th>
                <th scope="col" className="text-right">
                  Lessons
                </th>
                {manages ? (
                  <th scope="col" className="text-right">
                    Classes following
                  </th>
                ) : null}
              </tr>
            </thead>
            <tbody>
              {courses.map((c) => (
                <tr key={c.id}>
                  <th scope="row" className="text-left font-semibold">
                    <Link className="underline" to={`/courses/${c.id}`}>
                      {c.name}
                    </Link>
                    {c.description ? <p className="text-sm font-normal text-ink-soft">{c.description}</p> : null}
                  </th>
                  <td className="text-right tabular-nums">{c.lessons}</td>
                  {manages ? <td className="text-right tabular-nums">{c.classes}</td> : null}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : (
        <p className="card max-w-2xl text-ink-soft">
          {manages
            ? "No courses yet. Create the first one below, then add its lessons."
            : "None of your classes follows a course yet."}
        </p>
      )}
      {manages ? (
        <section className="card max-w-2xl" aria-labelledby="new-course">
          <h2 id="new-course" className="text-lg font-bold">
            New course
          </h2>
          <Form method="post" className="mt-4 grid gap-4" noValidate>
            {actionData?.errors ? <FormError message="Check the highlighted fields." /> : null}
            <CourseFields values={actionData?.values} errors={actionData?.errors} />
            <div>
              <SubmitButton pendingText="Creating…">Create course</SubmitButton>
            </div>
          </Form>
        </section>
      ) : null}
    </div>
  );
}

export function ErrorBoundary() {
  return <GeneralErrorBoundary />;
}
