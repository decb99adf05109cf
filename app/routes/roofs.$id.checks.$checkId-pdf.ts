import type { Route } from "./+types/roofs.$id.checks.$checkId-pdf";
import { requirePermission } from "~/lib/auth.server";
import { getRoofFor } from "~/lib/roofs.server";
import { checkAccess } from "~/lib/permissions";
import { getCheck } from "~/lib/as-built-checks.server";
import { checkReportPdf } from "~/lib/as-built-pdf";
import { packFileName } from "~/lib/pack/facts";
import type { Point } from "~/engine";

const text = (body: string, status: number) =>
  new Response(body, { status, headers: { "Content-Type": "text/plain; charset=utf-8" } });

/** GET /roofs/:id/checks/:checkId.pdf: a saved as-built check's printable report, for whoever may read the roof. */
export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requirePermission(request, "roofs:own");
  const roof = await getRoofFor(user, params.id);
  if (!roof || !checkAccess(roof).read) return text("No roof with that id in your library.", 404);
  const check = await getCheck(roof.id, params.checkId);
  if (!check) return text("No as-built check with that id on this roof.", 404);
  const bytes = await checkReportPdf({
    roofName: roof.name,
    measuredOn: check.measuredOn,
    measuredBy: check.measuredBy,
    checkedBy: check.checkedBy,
    roofVersion: check.roofVersion,
    outline: check.spec.outline as Point[],
    result: check.result,
  });
  return new Response(bytes as BodyInit, {
    headers: {
      "Content-Type": "application/pdf",
      "Content-Disposition": `attachment; filename="${packFileName(roof.name, `as-built-check-${check.measuredOn}`, new Date(`${check.measuredOn}T12:00:00Z`), "pdf").replace(/-\d{4}-\d{2}-\d{2}\.pdf$/, ".pdf")}"`,
      "Cache-Control": "private, no-store",
    },
  });
}
