import type { Route } from "./+types/certificates.$id-pdf";
import { requireUser } from "~/lib/auth.server";
import { appOrigin } from "~/lib/app-url";
import { certificateFor } from "~/lib/certificates/certificates.server";
import { certificatePdf } from "~/lib/certificates/certificate-pdf";
import { packFileName } from "~/lib/pack/facts";

const text = (body: string, status: number) =>
  new Response(body, { status, headers: { "Content-Type": "text/plain; charset=utf-8" } });

/** GET /certificates/:id.pdf: the certificate as a PDF, for whoever may see its page. */
export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireUser(request);
  const found = await certificateFor(user, params.id);
  if (!found) return text("No certificate with that id that you may see.", 404);
  const c = found.certificate;
  const bytes = await certificatePdf(c, appOrigin());
  const name = packFileName(c.courseName, "certificate", new Date(`${c.issuedOn}T12:00:00Z`), "pdf");
  return new Response(bytes as BodyInit, {
    headers: {
      "Content-Type": "application/pdf",
      "Content-Disposition": `attachment; filename="${name}"`,
      "Cache-Control": "private, no-store",
    },
  });
}
