import type { Route } from "./+types/sandbox.sheet-pdf";
import { sandboxPackResponse } from "~/lib/pack/download.server";

export const loader = () =>
  new Response("POST the roof spec (form field `spec`, JSON) to get its sheet.pdf.", {
    status: 405,
    headers: { Allow: "POST", "Content-Type": "text/plain; charset=utf-8" },
  });

/** POST /sandbox/sheet.pdf[?paper=letter]: the posted roof's check sheet as a PDF; nothing is stored. */
export async function action({ request, context }: Route.ActionArgs) {
  const { SHEET_PDF, SHEET_PDF_LETTER } = await import("~/components/pack/sheet-pdf");
  return sandboxPackResponse(
    request,
    new URL(request.url).searchParams.get("paper") === "letter" ? SHEET_PDF_LETTER : SHEET_PDF,
    context,
  );
}
