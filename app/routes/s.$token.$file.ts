/** GET /s/<token>/<file>: a shared roof's file of the builder's pack (schedule.csv, sheet.pdf, plan.dxf, roof.glb). */
import type { Route } from "./+types/s.$token.$file";
import { savedSpecResponse, SCHEDULE_CSV, PLAN_DXF, type PackWriter } from "~/lib/pack/download.server";
import { findSharedRoof } from "~/lib/share-links.server";

const notFound = () =>
  new Response("Not found", { status: 404, headers: { "Content-Type": "text/plain; charset=utf-8" } });

export async function loader({ request, params }: Route.LoaderArgs) {
  const letter = new URL(request.url).searchParams.get("paper") === "letter";
  // The heavier writers load on first use, so the server starts without them.
  const writers: Record<string, () => Promise<PackWriter>> = {
    "schedule.csv": async () => SCHEDULE_CSV,
    "sheet.pdf": async () => {
      const m = await import("~/components/pack/sheet-pdf");
      return letter ? m.SHEET_PDF_LETTER : m.SHEET_PDF;
    },
    "plan.dxf": async () => PLAN_DXF,
    "roof.glb": async () => (await import("~/components/pack/roof-glb")).ROOF_GLB,
  };
  if (!Object.hasOwn(writers, params.file)) return notFound();
  const shared = await findSharedRoof(params.token);
  if (!shared) return notFound();
  const writer = await writers[params.file]();
  return savedSpecResponse(writer, shared.name, shared.spec, "private, no-store");
}
