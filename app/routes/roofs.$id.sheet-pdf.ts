import type { Route } from "./+types/roofs.$id.sheet-pdf";
import { roofPackResponse } from "~/lib/pack/download.server";

/** GET /roofs/:id/sheet.pdf[?paper=letter]: the saved roof's check sheet and drop schedule, A4 unless US Letter is asked for. */
export async function loader({ request, params }: Route.LoaderArgs) {
  // Loaded on first use, so the server starts without the PDF library.
  const { SHEET_PDF, SHEET_PDF_LETTER } = await import("~/components/pack/sheet-pdf");
  return roofPackResponse(
    request,
    params.id,
    new URL(request.url).searchParams.get("paper") === "letter" ? SHEET_PDF_LETTER : SHEET_PDF,
  );
}
