import { data, Form, Link, redirect, useParams } from "react-router";
import type { Route } from "./+types/invite.$token";
import { formFailure } from "~/lib/password-form.server";
import { getOptionalUser } from "~/lib/auth.server";
import { acceptInvitation, findInvitation, joinClassByInvitation } from "~/lib/invitations.server";
import { clientIp } from "~/lib/rate-limit.server";
import { ROLE_LABELS } from "~/lib/permissions";
import { AuthCard, Field, FormError, SubmitButton } from "~/components/form-field";
import { LINK_STATUS, LinkProblem } from "~/components/link-problem";
import { NewPasswordFields } from "~/components/new-password-fields";

export const meta: Route.MetaFunction = () => [
  { title: "Accept your invitation · Fallwright" },
  { name: "referrer", content: "no-referrer" },
];

export async function loader({ request, params }: Route.LoaderArgs) {
  const found = await findInvitation(params.token);
  if (found.state !== "valid")
    return data({ invitation: null, state: found.state }, { status: LINK_STATUS[found.state] });
  const { userId, ...invitation } = found;
  const user = found.existingAccount ? await getOptionalUser(request) : null;
  return {
    invitation: { ...invitation, signedIn: !!user, signedInAsInvitee: !!user && user.id === userId },
    state: found.state,
  };
}

export async function action({ request, params, context }: Route.ActionArgs) {
  const found = await findInvitation(params.token);
  const joining = (await request.clone().formData()).get("intent") === "join";
  if (joining || (found.state === "valid" && found.existingAccount)) {
    // An account that is already set up joins a class only by its own choice, signed in as itself.
    const user = await getOptionalUser(request);
    if (!user) throw redirect(`/login?redirectTo=${encodeURIComponent(`/invite/${params.token}`)}`);
    const joined = await joinClassByInvitation(params.token, user, clientIp(context));
    if (!joined.ok)
      return data(
        { formError: joined.message, fieldErrors: {} as Record<string, string>, values: {} as Record<string, string> },
        { status: joined.status },
      );
    throw redirect(`/classes/${joined.classId}`);
  }
  const r = await acceptInvitation(request, params.token, context);
  if (r.ok) throw redirect("/", { headers: { "Set-Cookie": r.setCookie } });
  return formFailure(r);
}

export default function AcceptInvitation({ loaderData, actionData }: Route.ComponentProps) {
  const { invitation, state } = loaderData;
  const result = actionData;
  const { token } = useParams();
  if (!invitation) return <LinkProblem state={state} kind="invitation" />;
  if (invitation.existingAccount) {
    return (
      <AuthCard
        title="Join a class?"
        lead={
          <>
            You are invited to join the class <strong>{invitation.className}</strong> with the account{" "}
            <strong>{invitation.email}</strong>. If you join, the class's trainer sees your attempts at its lessons and
            can review them.
          </>
        }
      >
        <FormError message={result?.formError} />
        {invitation.signedInAsInvitee ? (
          <Form method="post" className="flex flex-wrap gap-3">
            <SubmitButton intent="join" pendingText="Joining…">
              Join the class
            </SubmitButton>
            <Link className="btn" to="/classes">
              Not now
            </Link>
          </Form>
        ) : (
          <div className="grid gap-3 text-sm">
            <p>
              {invitation.signedIn
                ? `You are signed in with another account. Sign out, then sign in as ${invitation.email} to answer this invitation.`
                : `Sign in as ${invitation.email} to answer this invitation.`}
            </p>
            {invitation.signedIn ? null : (
              <p>
                <Link className="btn-primary" to={`/login?redirectTo=${encodeURIComponent(`/invite/${token}`)}`}>
                  Sign in
                </Link>
              </p>
            )}
          </div>
        )}
      </AuthCard>
    );
  }
  return (
    <AuthCard
      title="Welcome to Fallwright"
      lead={
        <>
          You are joining <strong>{invitation.organisationName}</strong> as a{" "}
          {ROLE_LABELS[invitation.role].toLowerCase()}
          {invitation.className ? (
            <>
              {" "}
              in the class <strong>{invitation.className}</strong>
            </>
          ) : null}
          . Choose the name others will see and a password.
        </>
      }
    >
      <Form method="post" className="grid gap-4" noValidate>
        <FormError message={result?.formError} />
        <Field label="E-mail" name="username" type="email" autoComplete="username" value={invitation.email} readOnly />
        <Field
          label="Your name"
          name="name"
          autoComplete="name"
          required
          autoFocus
          maxLength={100}
          defaultValue={result?.values?.name ?? ""}
          error={result?.fieldErrors?.name}
        />
        <NewPasswordFields errors={result?.fieldErrors} />
        <div>
          <SubmitButton pendingText="Setting up…">Set up my account</SubmitButton>
        </div>
      </Form>
    </AuthCard>
  );
}
