import type { Route } from "./+types/roofs.$id.roof-glb";
import { roofPackResponse } from "~/lib/pack/download.server";

/** GET /roofs/:id/roof.glb: the saved roof as a 3D model (binary glTF), for whoever may read the roof. */
export async function loader({ request, params }: Route.LoaderArgs) {
  // Loaded on first use, so the server starts without three's exporter.
  const { ROOF_GLB } = await import("~/components/pack/roof-glb");
  return roofPackResponse(request, params.id, ROOF_GLB);
}
