import { Form, Link } from "react-router";
import { SubmitButton } from "~/components/form-field";

/** On a class's page: the course the class follows; choosing one assigns its lessons with due dates spread over the class's days. */
export function FollowCourseForm({
  courseId,
  courses,
  hasDates,
  error,
}: {
  courseId: string | null;
  courses: { id: string; name: string }[];
  hasDates: boolean;
  error?: string;
}) {
  if (!courses.length) {
    return (
      <p className="text-sm text-ink-soft">
        Your organisation has no courses yet.{" "}
        <Link className="underline" to="/courses">
          Create one
        </Link>{" "}
        and the class can follow it here.
      </p>
    );
  }
  return (
    <Form method="post" className="flex flex-wrap items-end gap-3" noValidate>
      <div>
        <label className="label" htmlFor="class-course">
          Course this class follows
        </label>
        <select
          id="class-course"
          name="courseId"
          className="field"
          defaultValue={courseId ?? ""}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? "class-course-error" : "class-course-hint"}
        >
          <option value="">No course</option>
          {courses.map((c) => (
            <option key={c.id} value={c.id}>
              {c.name}
            </option>
          ))}
        </select>
        {error ? (
          <p id="class-course-error" className="field-error">
            {error}
          </p>
        ) : (
          <p id="class-course-hint" className="mt-1 text-xs text-ink-soft">
            {hasDates
              ? "Its lessons are assigned at once, due dates spread evenly over the class's dates. Other assignments stay."
              : "Its lessons are assigned at once; give the class an end date to get due dates spread over its days."}
          </p>
        )}
      </div>
      <SubmitButton intent="course" pendingText="Assigning…" className="btn">
        Follow and assign
      </SubmitButton>
    </Form>
  );
}
