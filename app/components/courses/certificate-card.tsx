import type { CertificateFacts } from "~/lib/certificates/certificate-text";
import { certificateLines } from "~/lib/certificates/certificate-text";

/** A certificate as the page shows it: the same lines as its PDF (certificateLines). */
export function CertificateCard({ facts, origin }: { facts: CertificateFacts; origin: string }) {
  const l = certificateLines(facts, origin);
  return (
    <article
      className="card mx-auto grid max-w-3xl gap-2 border-2 border-accent p-8 text-center"
      data-testid="certificate"
    >
      <p className="text-xs font-medium uppercase tracking-widest text-accent">Fallwright</p>
      <h1 className="text-display font-bold tracking-tight">{l.title}</h1>
      <p className="text-ink-soft">{l.intro}</p>
      <p className="text-3xl font-bold" data-testid="certificate-name">
        {l.name}
      </p>
      <p className="text-ink-soft">{l.passed}</p>
      <p className="text-2xl font-bold" data-testid="certificate-course">
        {l.course}
      </p>
      <p className="mt-4">{l.organisation}</p>
      <p>{l.date}</p>
      <p className="mt-4 font-bold" data-testid="certificate-code">
        {l.code}
      </p>
      <p className="text-sm text-ink-soft">{l.verify}</p>
      {l.revoked ? (
        <p className="mt-4 font-bold text-bad" role="status">
          {l.revoked}
        </p>
      ) : null}
    </article>
  );
}
