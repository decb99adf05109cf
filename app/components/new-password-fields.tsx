import { Field } from "~/components/form-field";

/** The "choose a password" pair used by invitation, reset, sign-up and account pages. */
export function NewPasswordFields({
  errors,
  label = "Password",
}: {
  errors?: Partial<Record<string, string>>;
  label?: string;
}) {
  return (
    <>
      <Field
        label={label}
        name="password"
        type="password"
        autoComplete="new-password"
        required
        minLength={8}
        error={errors?.password}
        hint="At least 8 characters. A few unrelated words make a good one."
      />
      <Field
        label="Type it again"
        name="confirm"
        type="password"
        autoComplete="new-password"
        required
        error={errors?.confirm}
      />
    </>
  );
}
