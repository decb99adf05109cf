import type { Route } from "./+types/roofs.$id.roof-glb";
import { roofPackResponse } from "~/lib/pack/download.server";
import { ROOF_GLB } from "~/components/pack/roof-glb";

/** GET /roofs/:id/roof.glb: the saved roof as a 3D model (binary glTF), for whoever may read the roof. */
export const loader = ({ request, params }: Route.LoaderArgs) => roofPackResponse(request, params.id, ROOF_GLB);
