import type { Route } from "./+types/sandbox.plan-dxf";
import { sandboxPackGet, sandboxPackResponse } from "~/lib/pack/download.server";

export const loader = () => sandboxPackGet("plan.dxf");

/** POST /sandbox/plan.dxf: the posted roof's file of the builder's pack (nothing is stored). */
export const action = ({ request }: Route.ActionArgs) => sandboxPackResponse(request, "plan.dxf");
