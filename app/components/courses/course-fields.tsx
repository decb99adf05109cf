import type { CourseField, CourseValues } from "~/lib/courses/course-form";
import { FieldRow } from "~/components/field-row";
import { Field } from "~/components/form-field";

/** Name and description of a course: the create form and the edit form share them. */
export function CourseFields({
  values,
  errors,
}: {
  values?: Partial<CourseValues> | null;
  errors?: Partial<Record<CourseField, string>> | null;
}) {
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
      <FieldRow label="Description" error={errors?.description}>
        {(control) => (
          <textarea
            name="description"
            className="field min-h-24"
            maxLength={2000}
            defaultValue={values?.description ?? ""}
            {...control}
          />
        )}
      </FieldRow>
    </>
  );
}
