import { data, redirect } from "react-router";
import type { Route } from "./+types/verify._index";
import { normaliseCode } from "~/lib/certificates/code.server";
import { formatCode } from "~/lib/certificates/certificate-text";
import { VerifyForm } from "~/components/certificates/verify-form";

export const meta: Route.MetaFunction = () => [
  { title: "Check a certificate · Fallwright" },
  { name: "robots", content: "noindex" },
];

/**
 * GET /verify, public: type the code printed on a certificate. `?code=` that reads as a code
 * (docs/security.md, "Certificates": case, spaces and hyphens forgiven) opens /verify/:code;
 * anything else stays here with what was typed and why it cannot be a code.
 */
export async function loader({ request }: Route.LoaderArgs) {
  const typed = (new URL(request.url).searchParams.get("code") ?? "").slice(0, 64);
  if (!typed.trim()) return { typed: "", error: null };
  const code = normaliseCode(typed);
  if (code) throw redirect(`/verify/${formatCode(code)}`);
  return data(
    { typed, error: "This cannot be a certificate code: a code is 12 letters and digits." },
    { status: 400, headers: { "Cache-Control": "no-store" } },
  );
}

export default function VerifyEntry({ loaderData }: Route.ComponentProps) {
  return (
    <section className="card mx-auto grid max-w-2xl gap-3" aria-labelledby="verify-heading">
      <p className="text-xs font-medium uppercase tracking-widest text-accent">Certificate check</p>
      <h1 id="verify-heading" className="text-2xl font-bold tracking-tight">
        Check a certificate
      </h1>
      <p>
        Type the verification code printed on a Fallwright certificate to see whether it is valid, and the name, course,
        organisation and date it was issued for.
      </p>
      <VerifyForm typed={loaderData.typed} error={loaderData.error} />
    </section>
  );
}
