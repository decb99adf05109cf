import { data, Form, redirect } from "react-router";
import type { Route } from "./+types/reset-password.$token";
import { formFailure } from "~/lib/password-form.server";
import { findResetToken, resetPassword } from "~/lib/password-reset.server";
import { AuthCard, FormError, SubmitButton } from "~/components/form-field";
import { LINK_STATUS, LinkProblem } from "~/components/link-problem";
import { NewPasswordFields } from "~/components/new-password-fields";

export const meta: Route.MetaFunction = () => [
  { title: "Choose a new password · Fallwright" },
  { name: "referrer", content: "no-referrer" },
];

export async function loader({ params }: Route.LoaderArgs) {
  const found = await findResetToken(params.token);
  if (found.state !== "valid") return data({ state: found.state, email: null }, { status: LINK_STATUS[found.state] });
  return { state: found.state, email: found.email };
}

export async function action({ request, params, context }: Route.ActionArgs) {
  const r = await resetPassword(request, params.token, context);
  if (r.ok) throw redirect("/account?notice=password-reset", { headers: { "Set-Cookie": r.setCookie } });
  return formFailure(r);
}

export default function ResetPassword({ loaderData, actionData }: Route.ComponentProps) {
  const { state, email } = loaderData;
  const result = actionData;
  if (state !== "valid") return <LinkProblem state={state} kind="reset" />;
  return (
    <AuthCard
      title="Choose a new password"
      lead={
        <>
          For <strong>{email}</strong>. Every device signed in to this account will be signed out.
        </>
      }
    >
      <Form method="post" className="grid gap-4" noValidate>
        <FormError message={result?.formError} />
        <input type="hidden" name="username" autoComplete="username" value={email ?? ""} />
        <NewPasswordFields errors={result?.fieldErrors} label="New password" />
        <div>
          <SubmitButton pendingText="Saving…">Save and sign in</SubmitButton>
        </div>
      </Form>
    </AuthCard>
  );
}
