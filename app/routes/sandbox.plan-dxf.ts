import type { Route } from "./+types/sandbox.plan-dxf";
import { PLAN_DXF, sandboxPackGet, sandboxPackResponse } from "~/lib/pack/download.server";

export const loader = () => sandboxPackGet(PLAN_DXF);

/** POST /sandbox/plan.dxf: the posted roof's file of the builder's pack (nothing is stored). */
export const action = ({ request, context }: Route.ActionArgs) => sandboxPackResponse(request, PLAN_DXF, context);
