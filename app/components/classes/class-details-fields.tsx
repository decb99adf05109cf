import type { ClassDetailsField, ClassDetailsValues } from "~/lib/class-form";
import { Field } from "~/components/form-field";

/** Name, dates and venue of a class: the create form and the edit form share them. */
export function ClassDetailsFields({
  values,
  errors,
}: {
  values?: Partial<ClassDetailsValues> | null;
  errors?: Partial<Record<ClassDetailsField, string>> | null;
}) {
  return (
    <>
      <Field
        label="Name"
        name="name"
        required
        maxLength={120}
        placeholder="e.g. Parapet roofs, autumn cohort"
        defaultValue={values?.name ?? ""}
        error={errors?.name}
      />
      <div className="grid gap-4 sm:grid-cols-2">
        <Field
          label="Starts on"
          name="startsOn"
          type="date"
          defaultValue={values?.startsOn ?? ""}
          error={errors?.startsOn}
        />
        <Field label="Ends on" name="endsOn" type="date" defaultValue={values?.endsOn ?? ""} error={errors?.endsOn} />
      </div>
      <Field
        label="Venue"
        name="venue"
        maxLength={200}
        placeholder="e.g. Training hall, bay 2"
        defaultValue={values?.venue ?? ""}
        error={errors?.venue}
      />
    </>
  );
}
