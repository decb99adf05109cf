import type { Route } from "./+types/roofs.$id.plan-dxf";
import { PLAN_DXF, roofPackResponse } from "~/lib/pack/download.server";

/** GET /roofs/:id/plan.dxf: the saved roof's file of the builder's pack, for whoever may read the roof. */
export const loader = ({ request, params }: Route.LoaderArgs) => roofPackResponse(request, params.id, PLAN_DXF);
