import type { Route } from "./+types/sandbox.sheet-pdf";
import { sandboxPackGet, sandboxPackResponse } from "~/lib/pack/download.server";
import { SHEET_PDF, SHEET_PDF_LETTER } from "~/components/pack/sheet-pdf";

export const loader = () => sandboxPackGet(SHEET_PDF);

/** POST /sandbox/sheet.pdf[?paper=letter]: the posted roof's check sheet as a PDF; nothing is stored. */
export const action = ({ request }: Route.ActionArgs) =>
  sandboxPackResponse(request, new URL(request.url).searchParams.get("paper") === "letter" ? SHEET_PDF_LETTER : SHEET_PDF);
