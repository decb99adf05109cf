import { useId } from "react";
import type { CourseField, CourseValues } from "~/lib/courses/course-form";
import { Field } from "~/components/form-field";

/** Name and description of a course: the create form and the edit form share them. */
export function CourseFields({
  values,
  errors,
}: {
  values?: Partial<CourseValues> | null;
  errors?: Partial<Record<CourseField, string>> | null;
}) {
  const id = useId();
  return (
    <>
      <Field
        label="Name"
        name="name"
        required
        maxLength={120}
        placeholder="e.g. Falls to outlets, foundation"
        defaultValue={values?.name ?? ""}
        error={errors?.name}
      />
      <div>
        <label className="label" htmlFor={id}>
          Description
        </label>
        <textarea
          id={id}
          name="description"
          className="field min-h-24"
          maxLength={2000}
          defaultValue={values?.description ?? ""}
          aria-invalid={errors?.description ? true : undefined}
          aria-describedby={errors?.description ? `${id}-error` : undefined}
        />
        {errors?.description ? (
          <p id={`${id}-error`} className="field-error">
            {errors.description}
          </p>
        ) : null}
      </div>
    </>
  );
}
