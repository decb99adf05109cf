import type { Route } from "./+types/roofs.$id.sheet-pdf";
import { roofPackResponse } from "~/lib/pack/download.server";
import { SHEET_PDF, SHEET_PDF_LETTER } from "~/components/pack/sheet-pdf";

/** GET /roofs/:id/sheet.pdf[?paper=letter]: the saved roof's check sheet and drop schedule, A4 unless US Letter is asked for. */
export const loader = ({ request, params }: Route.LoaderArgs) =>
  roofPackResponse(request, params.id, new URL(request.url).searchParams.get("paper") === "letter" ? SHEET_PDF_LETTER : SHEET_PDF);
