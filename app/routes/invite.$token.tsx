import { data, Form, redirect, useActionData, useLoaderData } from "react-router";
import type { Route } from "./+types/invite.$token";
import { formFailure } from "~/lib/password-form.server";
import { acceptInvitation, findInvitation } from "~/lib/invitations.server";
import { ROLE_LABELS } from "~/lib/permissions";
import { AuthCard, Field, FormError, SubmitButton } from "~/components/form-field";
import { LINK_STATUS, LinkProblem } from "~/components/link-problem";
import { NewPasswordFields } from "~/components/new-password-fields";

export const meta: Route.MetaFunction = () => [{ title: "Accept your invitation · Fallwright" }, { name: "referrer", content: "no-referrer" }];

export async function loader({ params }: Route.LoaderArgs) {
  const found = await findInvitation(params.token);
  if (found.state !== "valid") return data({ invitation: null, state: found.state }, { status: LINK_STATUS[found.state] });
  return { invitation: found, state: found.state };
}

export async function action({ request, params, context }: Route.ActionArgs) {
  const r = await acceptInvitation(request, params.token, context);
  if (r.ok) throw redirect("/", { headers: { "Set-Cookie": r.setCookie } });
  return formFailure(r);
}

export default function AcceptInvitation() {
  const { invitation, state } = useLoaderData<typeof loader>();
  const result = useActionData<typeof action>();
  if (!invitation) return <LinkProblem state={state} kind="invitation" />;
  return (
    <AuthCard
      title="Welcome to Fallwright"
      lead={
        <>
          You are joining <strong>{invitation.organisationName}</strong> as a {ROLE_LABELS[invitation.role].toLowerCase()}
          {invitation.className ? <> in the class <strong>{invitation.className}</strong></> : null}. Choose the name others will see and a password.
        </>
      }
    >
      <Form method="post" className="grid gap-4" noValidate>
        <FormError message={result?.formError} />
        <Field label="E-mail" name="username" type="email" autoComplete="username" value={invitation.email} readOnly />
        <Field label="Your name" name="name" autoComplete="name" required autoFocus maxLength={100} defaultValue={result?.values?.name ?? ""} error={result?.fieldErrors?.name} />
        <NewPasswordFields errors={result?.fieldErrors} />
        <div>
          <SubmitButton pendingText="Setting up…">Set up my account</SubmitButton>
        </div>
      </Form>
    </AuthCard>
  );
}
