import { data, Form, Link } from "react-router";
import { Download } from "lucide-react";
import type { Route } from "./+types/certificates.$id";
import { requireUser } from "~/lib/auth.server";
import { appOrigin } from "~/lib/app-url";
import { certificateFor, revokeCertificate } from "~/lib/certificates/certificates.server";
import { clientIp } from "~/lib/rate-limit.server";
import { GeneralErrorBoundary } from "~/components/error-boundary";
import { CertificateCard } from "~/components/courses/certificate-card";
import { FormError, FormNotice, SubmitButton } from "~/components/form-field";

export const meta: Route.MetaFunction = ({ data }) => [
  { title: `${data?.certificate.courseName ?? "Certificate"} · Certificate · Fallwright` },
];

const NOT_FOUND = "No certificate with that id that you may see.";

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const found = await certificateFor(user, params.id);
  if (!found) throw data(NOT_FOUND, { status: 404 });
  return { ...found, origin: appOrigin(), own: found.certificate.traineeId === user.id };
}

export async function action({ request, params, context }: Route.ActionArgs) {
  const user = await requireUser(request);
  const found = await certificateFor(user, params.id);
  if (!found) throw data(NOT_FOUND, { status: 404 });
  const form = await request.formData();
  const reason = String(form.get("reason") ?? "").slice(0, 2000);
  if (form.get("intent") !== "revoke") return data({ error: "Unknown action.", reason }, { status: 400 });
  if (!found.canRevoke)
    return data(
      {
        error: found.certificate.revokedOn ? "This certificate is already revoked." : "You may not revoke it.",
        reason,
      },
      { status: found.certificate.revokedOn ? 409 : 403 },
    );
  const trimmed = reason.trim();
  if (trimmed.length < 3)
    return data(
      { reasonError: "Give the reason for revoking it (at least 3 characters); it is kept in the audit log.", reason },
      { status: 400 },
    );
  if (trimmed.length > 500)
    return data({ reasonError: "Keep the reason under 500 characters.", reason }, { status: 400 });
  const done = await revokeCertificate({
    certificate: found.certificate,
    by: user,
    reason: trimmed,
    ip: clientIp(context),
  });
  if (!done) return data({ error: "This certificate is already revoked.", reason }, { status: 409 });
  return { notice: "The certificate is revoked. Its verification page now says so." };
}

export default function CertificatePage({ loaderData, actionData }: Route.ComponentProps) {
  const { certificate: c, canRevoke, origin, own } = loaderData;
  const result = actionData as { notice?: string; error?: string; reasonError?: string; reason?: string } | undefined;
  return (
    <div className="grid gap-6">
      <p className="text-sm">
        <Link className="underline" to={own ? "/attempts" : "/gradebook"}>
          {own ? "My attempts and certificates" : "Gradebook"}
        </Link>
      </p>
      <div aria-live="polite">
        <FormNotice message={result?.notice} />
        <FormError message={result?.error} />
      </div>
      <CertificateCard facts={c} origin={origin} />
      <p className="flex flex-wrap justify-center gap-2">
        <a className="btn-primary" href={`/certificates/${c.id}.pdf`} download>
          <Download aria-hidden="true" className="h-4 w-4" /> Download PDF
        </a>
        <Link className="btn" to={`/verify/${c.code}`}>
          Open the public verification page
        </Link>
      </p>
      {c.revokedOn && c.revokeReason ? (
        <p className="mx-auto max-w-3xl text-sm text-ink-soft">Reason for revoking: {c.revokeReason}</p>
      ) : null}
      {canRevoke ? (
        <section className="card mx-auto w-full max-w-3xl" aria-labelledby="revoke">
          <h2 id="revoke" className="text-lg font-bold">
            Revoke this certificate
          </h2>
          <p className="mt-1 text-sm text-ink-soft">
            The verification page will say it is revoked. The reason is kept in the audit log and is not shown to the
            public.
          </p>
          <Form method="post" className="mt-3 grid gap-3" noValidate>
            <div>
              <label className="label" htmlFor="revoke-reason">
                Reason
              </label>
              <textarea
                id="revoke-reason"
                name="reason"
                className="field min-h-20"
                required
                maxLength={500}
                defaultValue={result?.reason ?? ""}
                aria-invalid={result?.reasonError ? true : undefined}
                aria-describedby={result?.reasonError ? "revoke-reason-error" : undefined}
              />
              {result?.reasonError ? (
                <p id="revoke-reason-error" className="field-error">
                  {result.reasonError}
                </p>
              ) : null}
            </div>
            <div>
              <SubmitButton intent="revoke" pendingText="Revoking…" className="btn">
                Revoke certificate
              </SubmitButton>
            </div>
          </Form>
        </section>
      ) : null}
    </div>
  );
}

export function ErrorBoundary() {
  return <GeneralErrorBoundary />;
}
