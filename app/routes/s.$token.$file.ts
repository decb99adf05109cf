/** GET /s/<token>/<file>: a shared roof's file of the builder's pack (schedule.csv, sheet.pdf, plan.dxf, roof.glb). */
import type { Route } from "./+types/s.$token.$file";
import { savedSpecResponse, SCHEDULE_CSV, PLAN_DXF, type PackWriter } from "~/lib/pack/download.server";
import { findSharedRoof } from "~/lib/share-links.server";
import { ROOF_GLB } from "~/components/pack/roof-glb";
import { SHEET_PDF, SHEET_PDF_LETTER } from "~/components/pack/sheet-pdf";

const notFound = () => new Response("Not found", { status: 404, headers: { "Content-Type": "text/plain; charset=utf-8" } });

export async function loader({ request, params }: Route.LoaderArgs) {
  const letter = new URL(request.url).searchParams.get("paper") === "letter";
  const writers: Record<string, PackWriter> = {
    "schedule.csv": SCHEDULE_CSV,
    "sheet.pdf": letter ? SHEET_PDF_LETTER : SHEET_PDF,
    "plan.dxf": PLAN_DXF,
    "roof.glb": ROOF_GLB,
  };
  const writer = Object.hasOwn(writers, params.file) ? writers[params.file] : null;
  if (!writer) return notFound();
  const shared = await findSharedRoof(params.token);
  if (!shared) return notFound();
  return savedSpecResponse(writer, shared.name, shared.spec, "private, no-store");
}
