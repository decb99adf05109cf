import { Link } from "react-router";
import { Day } from "~/components/dates";

/** A trainee's certificates, on their attempts page. */
export function MyCertificates({
  certificates,
}: {
  certificates: {
    id: string;
    courseName: string;
    organisationName: string;
    issuedOn: string;
    revokedOn: string | null;
  }[];
}) {
  if (!certificates.length) return null;
  return (
    <section className="card" aria-labelledby="my-certificates">
      <h2 id="my-certificates" className="text-lg font-bold">
        My certificates
      </h2>
      <ul className="mt-2 grid gap-1" data-testid="my-certificates">
        {certificates.map((c) => (
          <li key={c.id}>
            <Link className="underline" to={`/certificates/${c.id}`}>
              {c.courseName}
            </Link>{" "}
            <span className="text-ink-soft">
              ({c.organisationName}, <Day iso={c.issuedOn} />)
            </span>
            {c.revokedOn ? <span className="ml-2 font-bold text-bad">revoked</span> : null}
          </li>
        ))}
      </ul>
    </section>
  );
}
