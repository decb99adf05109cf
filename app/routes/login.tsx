import { useEffect, useRef } from "react";
import { data, Form, Link, redirect } from "react-router";
import type { Route } from "./+types/login";
import { retryAfterHeaders } from "~/lib/rate-limit.server";
import { requireAnonymous, safeRedirect, signIn } from "~/lib/auth.server";
import { primaryOrganisation } from "~/lib/users.server";
import { AuthCard, Field, FormError, FormNotice, SubmitButton } from "~/components/form-field";

export const meta: Route.MetaFunction = () => [{ title: "Sign in · Fallwright" }];

const NOTICES: Record<string, string> = {
  "signed-out": "You are signed out.",
  everywhere: "You are signed out on every device.",
};

export async function loader({ request }: Route.LoaderArgs) {
  const url = new URL(request.url);
  const redirectTo = safeRedirect(url.searchParams.get("redirectTo"));
  await requireAnonymous(request, redirectTo);
  const org = await primaryOrganisation();
  return {
    redirectTo,
    notice: NOTICES[url.searchParams.get("notice") ?? ""] ?? null,
    signupOpen: !!org?.open_designer_signup,
  };
}

export async function action({ request, context }: Route.ActionArgs) {
  const form = await request.clone().formData();
  const redirectTo = safeRedirect(form.get("redirectTo"));
  const result = await signIn(request, context);
  if (result.ok) throw redirect(redirectTo, { headers: { "Set-Cookie": result.setCookie } });
  return data(
    { email: result.email, formError: result.formError ?? null, fieldErrors: result.fieldErrors ?? {} },
    { status: result.status, headers: retryAfterHeaders(result.retryAfter) },
  );
}

export default function Login({ loaderData, actionData }: Route.ComponentProps) {
  const { redirectTo, notice, signupOpen } = loaderData;
  const result = actionData;
  const password = useRef<HTMLInputElement>(null);
  // After a refused attempt the password is cleared and focused, ready to type again.
  useEffect(() => {
    if (result?.formError && password.current) {
      password.current.value = "";
      password.current.focus();
    }
  }, [result]);
  return (
    <AuthCard title="Sign in" lead="Use the e-mail address your invitation came to.">
      <Form method="post" className="grid gap-4" noValidate>
        <FormNotice message={result ? null : notice} />
        <FormError message={result?.formError} />
        <input type="hidden" name="redirectTo" value={redirectTo} />
        <Field
          label="E-mail"
          name="email"
          type="email"
          autoComplete="username"
          required
          autoFocus
          defaultValue={result?.email ?? ""}
          error={result?.fieldErrors?.email}
        />
        <Field
          label="Password"
          name="password"
          type="password"
          autoComplete="current-password"
          required
          ref={password}
          error={result?.fieldErrors?.password}
        />
        <div className="flex flex-wrap items-center justify-between gap-3">
          <SubmitButton pendingText="Signing in…">Sign in</SubmitButton>
          <Link className="text-sm underline" to="/forgot-password">
            Forgot your password?
          </Link>
        </div>
      </Form>
      <p className="mt-6 border-t border-rule pt-4 text-sm text-ink-soft">
        New here? Accounts come by invitation from a trainer or an admin.
        {signupOpen ? (
          <>
            {" "}
            Designers can also{" "}
            <Link className="underline" to="/signup">
              create an account
            </Link>
            .
          </>
        ) : null}
      </p>
    </AuthCard>
  );
}
