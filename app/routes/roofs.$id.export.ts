/** GET /roofs/:id/export: the saved roof as a Fallwright roof file (download). */
import type { Route } from "./+types/roofs.$id.export";
import { requirePermission } from "~/lib/auth.server";
import { roofFileName, writeRoofFile } from "~/lib/roof-file";
import { getRoofFor } from "~/lib/roofs.server";

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requirePermission(request, "roofs:own");
  const roof = await getRoofFor(user, params.id);
  if (!roof)
    return new Response("Not found", { status: 404, headers: { "Content-Type": "text/plain; charset=utf-8" } });
  const file = writeRoofFile(roof);
  return new Response(JSON.stringify(file, null, 2) + "\n", {
    headers: {
      "Content-Type": "application/json; charset=utf-8",
      "Content-Disposition": `attachment; filename="${roofFileName(roof.name)}"`,
      "Cache-Control": "private, no-store",
    },
  });
}
