import { When } from "~/components/dates";
import { data, Form, redirect } from "react-router";
import type { Route } from "./+types/account";
import { z } from "zod";
import { audit } from "~/lib/audit.server";
import { getLiveSession, requireUser } from "~/lib/auth.server";
import { ROLE_LABELS } from "~/lib/permissions";
import { clientIp, retryAfterHeaders } from "~/lib/rate-limit.server";
import { clearSessionCookie, destroyAllSessions, listSessions } from "~/lib/session.server";
import { changeName, changePassword, changeUnits } from "~/lib/users.server";
import { describeDevice } from "~/lib/when";
import { Field, FormError, FormNotice, SubmitButton } from "~/components/form-field";
import { NewPasswordFields } from "~/components/new-password-fields";

export const meta: Route.MetaFunction = () => [{ title: "Your account · Fallwright" }];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const live = await getLiveSession(request);
  const sessions = await listSessions(user.id);
  const notice =
    new URL(request.url).searchParams.get("notice") === "password-reset"
      ? "Your new password is saved. Every other device was signed out."
      : null;
  return {
    user,
    notice,
    sessions: sessions.map((s) => ({
      key: s.id.slice(0, 12),
      current: s.id === live?.sessionId,
      device: describeDevice(s.user_agent),
      signedInAt: s.created_at.toISOString(),
      lastSeenAt: s.last_seen_at.toISOString(),
    })),
  };
}

const Intent = z.enum(["name", "units", "password", "sign-out-everywhere"]);

type AccountResult = {
  intent: "name" | "units" | "password" | null;
  message: string | null;
  formError: string | null;
  fieldErrors: Partial<Record<string, string>>;
};

export async function action({ request, context }: Route.ActionArgs) {
  const user = await requireUser(request);
  const form = await request.formData();
  const intent = Intent.safeParse(form.get("intent"));
  if (!intent.success)
    return data<AccountResult>(
      { intent: null, message: null, formError: "Unknown request.", fieldErrors: {} },
      { status: 400 },
    );
  const ip = clientIp(context);
  switch (intent.data) {
    case "name": {
      const r = await changeName(user, String(form.get("name") ?? ""), ip);
      return data<AccountResult>(
        {
          intent: "name",
          message: r.ok ? r.message : null,
          formError: null,
          fieldErrors: r.ok ? {} : { name: r.message },
        },
        { status: r.ok ? 200 : 400 },
      );
    }
    case "units": {
      const r = await changeUnits(user, form.get("units"), ip);
      return data<AccountResult>(
        {
          intent: "units",
          message: r.ok ? r.message : null,
          formError: null,
          fieldErrors: r.ok ? {} : { units: r.message },
        },
        { status: r.ok ? 200 : 400 },
      );
    }
    case "password": {
      const r = await changePassword(request, user, form, context);
      if (r.ok) {
        return data<AccountResult>(
          {
            intent: "password",
            message: "Your new password is saved. Every other device was signed out.",
            formError: null,
            fieldErrors: {},
          },
          { headers: { "Set-Cookie": r.setCookie } },
        );
      }
      return data<AccountResult>(
        { intent: "password", message: null, formError: r.formError ?? null, fieldErrors: r.fieldErrors ?? {} },
        { status: r.status, headers: retryAfterHeaders(r.retryAfter) },
      );
    }
    case "sign-out-everywhere": {
      const ended = await destroyAllSessions(user.id);
      await audit({
        action: "sign_out_everywhere",
        actorId: user.id,
        subjectId: user.id,
        detail: { sessionsEnded: ended },
        ip,
      });
      throw redirect("/login?notice=everywhere", { headers: { "Set-Cookie": clearSessionCookie(request) } });
    }
  }
}

export default function Account({ loaderData, actionData }: Route.ComponentProps) {
  const { user, sessions, notice } = loaderData;
  const result = actionData;
  const nameResult = result?.intent === "name" ? result : null;
  const passwordResult = result?.intent === "password" ? result : null;
  return (
    <div className="grid gap-6">
      <header>
        <h1 className="text-3xl font-bold tracking-tight">Your account</h1>
        <p className="mt-1 text-ink-soft">
          {user.email} · {ROLE_LABELS[user.role]}
        </p>
      </header>
      <FormNotice message={notice} />
      <FormError message={result && !result.intent ? result.formError : null} />
      <div className="grid items-start gap-6 lg:grid-cols-[3fr_2fr]">
        <div className="grid gap-6">
          <section className="card grid gap-4" aria-labelledby="name-heading">
            <h2 id="name-heading" className="text-lg font-bold">
              Name
            </h2>
            <Form method="post" className="grid gap-3" noValidate>
              <FormNotice message={nameResult?.message} />
              <Field
                label="Shown to trainers and classmates"
                name="name"
                autoComplete="name"
                required
                maxLength={100}
                defaultValue={user.name}
                error={nameResult?.fieldErrors?.name}
              />
              <div>
                <SubmitButton intent="name" pendingText="Saving…" className="btn">
                  Save name
                </SubmitButton>
              </div>
            </Form>
          </section>
          <section className="card grid gap-4" aria-labelledby="sessions-heading">
            <div className="flex flex-wrap items-baseline justify-between gap-3">
              <h2 id="sessions-heading" className="text-lg font-bold">
                Where you are signed in
              </h2>
              <Form method="post">
                <SubmitButton intent="sign-out-everywhere" pendingText="Signing out…" className="btn">
                  Sign out everywhere
                </SubmitButton>
              </Form>
            </div>
            <div className="overflow-x-auto">
              <table className="data-table w-full">
                <thead>
                  <tr>
                    <th scope="col">Device</th>
                    <th scope="col">Signed in</th>
                    <th scope="col">Last active</th>
                  </tr>
                </thead>
                <tbody>
                  {sessions.map((s) => (
                    <tr key={s.key}>
                      <td>
                        {s.device}
                        {s.current ? (
                          <span className="ml-2 rounded bg-accent-wash px-1.5 py-0.5 text-xs font-medium text-accent-deep">
                            this browser
                          </span>
                        ) : null}
                      </td>
                      <td>
                        <When iso={s.signedInAt} />
                      </td>
                      <td>
                        <When iso={s.lastSeenAt} />
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
            <p className="text-xs text-ink-soft">
              A session ends after 2 hours without use and 7 days after signing in. "Sign out everywhere" ends all of
              them, this one included.
            </p>
          </section>
        </div>
        <section className="card grid gap-4" aria-labelledby="password-heading">
          <h2 id="password-heading" className="text-lg font-bold">
            Password
          </h2>
          <Form method="post" className="grid gap-3" noValidate>
            <FormNotice message={passwordResult?.message} />
            <FormError message={passwordResult?.formError} />
            <input type="hidden" name="username" autoComplete="username" value={user.email} />
            <Field
              label="Current password"
              name="current"
              type="password"
              autoComplete="current-password"
              required
              error={passwordResult?.fieldErrors?.current}
            />
            <NewPasswordFields errors={passwordResult?.fieldErrors} label="New password" />
            <p className="text-xs text-ink-soft">Changing it signs you out on every other device.</p>
            <div>
              <SubmitButton intent="password" pendingText="Saving…" className="btn">
                Change password
              </SubmitButton>
            </div>
          </Form>
        </section>
      </div>
    </div>
  );
}
