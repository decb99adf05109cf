import type { Route } from "./+types/sandbox.roof-glb";
import { sandboxPackResponse } from "~/lib/pack/download.server";

export const loader = () =>
  new Response("POST the roof spec (form field `spec`, JSON) to get its roof.glb.", {
    status: 405,
    headers: { Allow: "POST", "Content-Type": "text/plain; charset=utf-8" },
  });

/** POST /sandbox/roof.glb: the posted roof as a 3D model (binary glTF); nothing is stored. */
export async function action({ request, context }: Route.ActionArgs) {
  const { ROOF_GLB } = await import("~/components/pack/roof-glb");
  return sandboxPackResponse(request, ROOF_GLB, context);
}
