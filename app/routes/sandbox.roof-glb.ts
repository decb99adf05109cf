import type { Route } from "./+types/sandbox.roof-glb";
import { sandboxPackGet, sandboxPackResponse } from "~/lib/pack/download.server";
import { ROOF_GLB } from "~/components/pack/roof-glb";

export const loader = () => sandboxPackGet(ROOF_GLB);

/** POST /sandbox/roof.glb: the posted roof as a 3D model (binary glTF); nothing is stored. */
export const action = ({ request }: Route.ActionArgs) => sandboxPackResponse(request, ROOF_GLB);
