import { data, isRouteErrorResponse, useParams, useRouteError } from "react-router";
import { BadgeCheck, Ban } from "lucide-react";
import type { Route } from "./+types/verify.$code";
import { verifyCertificate } from "~/lib/certificates/certificates.server";
import { formatCode } from "~/lib/certificates/certificate-text";
import { formatDay } from "~/lib/when";
import { GeneralErrorBoundary } from "~/components/error-boundary";
import { VerifyForm } from "~/components/certificates/verify-form";

export const meta: Route.MetaFunction = () => [
  { title: "Verify a certificate · Fallwright" },
  { name: "robots", content: "noindex" },
];

/**
 * GET /verify/:code, public, no sign-in: whether a certificate with this code exists and is valid.
 * It shows the name on it, the course, the organisation and the date, and nothing else about the
 * person (docs/security.md, "Certificates").
 */
export async function loader({ params }: Route.LoaderArgs) {
  const found = await verifyCertificate(params.code.slice(0, 64));
  if (!found) throw data("No such certificate.", { status: 404, headers: { "Cache-Control": "no-store" } });
  return data(found, { headers: { "Cache-Control": "no-store", "X-Robots-Tag": "noindex" } });
}

export default function Verify({ loaderData: c }: Route.ComponentProps) {
  const valid = !c.revokedOn;
  return (
    <section className="card mx-auto grid max-w-2xl gap-3" aria-labelledby="verify-heading" data-testid="verify">
      <p className="text-xs font-medium uppercase tracking-widest text-accent">Certificate check</p>
      <h1 id="verify-heading" className="flex items-center gap-2 text-2xl font-bold tracking-tight">
        {valid ? (
          <>
            <BadgeCheck aria-hidden="true" className="h-7 w-7 text-ok" /> Valid certificate
          </>
        ) : (
          <>
            <Ban aria-hidden="true" className="h-7 w-7 text-bad" /> Revoked certificate
          </>
        )}
      </h1>
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1">
        <dt className="font-semibold">Name</dt>
        <dd data-testid="verify-name">{c.traineeName}</dd>
        <dt className="font-semibold">Course</dt>
        <dd data-testid="verify-course">{c.courseName}</dd>
        <dt className="font-semibold">Organisation</dt>
        <dd data-testid="verify-organisation">{c.organisationName}</dd>
        <dt className="font-semibold">Date</dt>
        <dd data-testid="verify-date">{formatDay(c.issuedOn)}</dd>
        <dt className="font-semibold">Code</dt>
        <dd>{formatCode(c.code)}</dd>
        <dt className="font-semibold">Status</dt>
        <dd data-testid="verify-status" className={valid ? "text-ok" : "font-bold text-bad"}>
          {valid ? "Valid" : `Revoked on ${formatDay(c.revokedOn)}`}
        </dd>
      </dl>
    </section>
  );
}

export function ErrorBoundary() {
  const error = useRouteError();
  const params = useParams();
  if (!isRouteErrorResponse(error) || error.status !== 404) return <GeneralErrorBoundary />;
  return (
    <section className="card mx-auto grid max-w-2xl gap-3" role="alert" data-testid="verify-none">
      <title>No such certificate · Fallwright</title>
      <p className="text-xs font-medium uppercase tracking-widest text-accent">Certificate check</p>
      <h1 className="text-2xl font-bold tracking-tight">No such certificate</h1>
      <p>No certificate has this code. Check the code on the certificate and type it again.</p>
      <VerifyForm typed={params.code ?? ""} />
    </section>
  );
}
