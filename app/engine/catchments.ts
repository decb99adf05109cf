import type { FaceData } from "./faces";
import type { Routing } from "./flow";
import { designFlow, DESIGN_HEAD, outletCapacity } from "./hydraulics";
import type { SurfaceMesh } from "./mesh";
import { toPlan, type Roof } from "./roof";
import { drainLabel } from "./traces";
import type { Analysis, Catchment, Warning } from "./types";
import { outletName } from "./names";

/**
 * The area draining to each outlet and eaves edge with its design flow (rational method, C = 1,
 * ASCE 7-05 Commentary C8), outlets' rough capacity, and the ponding pits (docs/roof-method.md §7).
 */
export function catchmentsOf(roof: Roof, mesh: SurfaceMesh, routing: Routing, faces: FaceData, warnings: Warning[]) {
  const catchments: Catchment[] = [];
  const ponding: Analysis["shaped"]["ponding"] = [];
  const mm = (m: number) => `${Math.round(m * 1000)} mm`;
  routing.drains.forEach((d, id) => {
    const area = faces.drainArea[id];
    if (d.kind === "pit") {
      if (area > 0) ponding.push({ at: toPlan(roof, mesh.u[d.vertex], mesh.v[d.vertex]), area, level: d.level });
      return;
    }
    const flow = designFlow(roof.rainfall.intensity, area);
    const c: Catchment = {
      drain: drainLabel(roof, routing, id),
      kind: d.kind,
      index: d.kind === "eaves" ? roof.userEdge[d.index] : d.index,
      label: d.kind === "eaves" ? `Eaves edge ${roof.userEdge[d.index] + 1}` : `Outlet ${outletName(d.index)}`,
      area,
      flow,
    };
    if (d.kind === "outlet") {
      // Outlet drains come first, in the roof's outlet order: drain id k is roof.outlets[k].
      const o = roof.outlets[id];
      c.capacity = outletCapacity(o.size);
      if (flow > c.capacity) {
        warnings.push({
          code: "outlet-capacity",
          message: `Outlet ${outletName(d.index)} (${mm(o.size)}) takes ${flow.toFixed(1)} L/s, more than the ${c.capacity.toFixed(1)} L/s it passes at a ${mm(DESIGN_HEAD)} head (assumed). Use a larger outlet or add one.`,
          at: toPlan(roof, o.u, o.v),
        });
      }
    }
    catchments.push(c);
  });
  return { catchments, ponding };
}
