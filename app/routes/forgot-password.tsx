import { data, Form, Link } from "react-router";
import type { Route } from "./+types/forgot-password";
import { retryAfterHeaders } from "~/lib/rate-limit.server";
import { requestPasswordReset } from "~/lib/password-reset.server";
import { AuthCard, Field, FormError, FormNotice, SubmitButton } from "~/components/form-field";

export const meta: Route.MetaFunction = () => [{ title: "Forgot password · Fallwright" }];

export async function action({ request, context }: Route.ActionArgs) {
  const r = await requestPasswordReset(request, context);
  return data(
    { email: r.email, message: r.ok ? r.message : null, formError: r.ok ? null : r.formError },
    { status: r.status, headers: retryAfterHeaders(r.ok ? null : r.retryAfter) },
  );
}

export default function ForgotPassword({ actionData }: Route.ComponentProps) {
  const result = actionData;
  return (
    <AuthCard
      title="Forgot your password?"
      lead="Enter the address you sign in with and we will e-mail you a link to choose a new password."
    >
      {result?.message ? (
        <div className="grid gap-4">
          <FormNotice message={result.message} />
          <p className="text-sm">
            <Link className="underline" to="/login">
              Back to sign in
            </Link>
          </p>
        </div>
      ) : (
        <Form method="post" className="grid gap-4" noValidate>
          <FormError message={result?.formError} />
          <Field
            label="E-mail"
            name="email"
            type="email"
            autoComplete="username"
            required
            autoFocus
            defaultValue={result?.email ?? ""}
          />
          <div className="flex flex-wrap items-center justify-between gap-3">
            <SubmitButton pendingText="Sending…">Send the link</SubmitButton>
            <Link className="text-sm underline" to="/login">
              Back to sign in
            </Link>
          </div>
        </Form>
      )}
    </AuthCard>
  );
}
