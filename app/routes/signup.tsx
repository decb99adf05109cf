import { data, Form, Link, redirect } from "react-router";
import type { Route } from "./+types/signup";
import { formFailure } from "~/lib/password-form.server";
import { requireAnonymous } from "~/lib/auth.server";
import { primaryOrganisation, signUpDesigner } from "~/lib/users.server";
import { AuthCard, Field, FormError, SubmitButton } from "~/components/form-field";
import { NewPasswordFields } from "~/components/new-password-fields";

export const meta: Route.MetaFunction = () => [{ title: "Create a designer account · Fallwright" }];

export async function loader({ request }: Route.LoaderArgs) {
  await requireAnonymous(request);
  const org = await primaryOrganisation();
  if (!org?.open_designer_signup)
    return data({ open: false as const, organisationName: org?.name ?? "" }, { status: 404 });
  return { open: true as const, organisationName: org.name };
}

export async function action({ request, context }: Route.ActionArgs) {
  await requireAnonymous(request);
  const r = await signUpDesigner(request, await request.formData(), context);
  if (r.ok) throw redirect("/", { headers: { "Set-Cookie": r.setCookie } });
  return formFailure(r);
}

export default function SignUp({ loaderData, actionData }: Route.ComponentProps) {
  const { open, organisationName } = loaderData;
  const result = actionData;
  if (!open) {
    return (
      <AuthCard title="Sign-up is closed">
        <p>Accounts on this Fallwright are made by invitation. Ask a trainer or an admin to invite you.</p>
        <p className="mt-5">
          <Link className="btn" to="/login">
            Sign in
          </Link>
        </p>
      </AuthCard>
    );
  }
  return (
    <AuthCard
      title="Create a designer account"
      lead={
        <>
          Designers can join <strong>{organisationName}</strong> on their own to check parapet roofs before detailing
          them.
        </>
      }
    >
      <Form method="post" className="grid gap-4" noValidate>
        <FormError message={result?.formError} />
        <Field
          label="E-mail"
          name="email"
          type="email"
          autoComplete="username"
          required
          autoFocus
          defaultValue={result?.values?.email ?? ""}
          error={result?.fieldErrors?.email}
        />
        <Field
          label="Your name"
          name="name"
          autoComplete="name"
          required
          maxLength={100}
          defaultValue={result?.values?.name ?? ""}
          error={result?.fieldErrors?.name}
        />
        <NewPasswordFields errors={result?.fieldErrors} />
        <div className="flex flex-wrap items-center justify-between gap-3">
          <SubmitButton pendingText="Creating…">Create my account</SubmitButton>
          <Link className="text-sm underline" to="/login">
            I have an account
          </Link>
        </div>
      </Form>
    </AuthCard>
  );
}
