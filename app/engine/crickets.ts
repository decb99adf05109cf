import type { SurfaceMesh } from "./mesh";
import type { PerimeterLevels } from "./perimeter";
import type { Roof } from "./roof";
import { levelAt } from "./surface";

/**
 * Builds the crickets (docs/roof-method-plans.md P5) onto the meshed deck: the crest runs level
 * from the upstand up the fall to where it meets the deck, at that point's deck level zc; its two
 * faces fall away from the crest at the minimum fall N, so a point at distance d from the crest
 * line stands at zc - d/N wherever that is above the deck and beside the crest (its foot on the
 * crest lies between the upstand and the crest's end). The joists and their schedule do not
 * change: the cricket is built on top of the deck; the fall map and the water see it.
 */
export function raiseCrickets(roof: Roof, levels: PerimeterLevels, mesh: SurfaceMesh): void {
  const { dx, dy } = roof;
  for (const c of roof.crickets) {
    const u0 = c.x0 * dy - c.y0 * dx,
      v0 = c.x0 * dx + c.y0 * dy;
    const u1 = c.x1 * dy - c.y1 * dx,
      v1 = c.x1 * dx + c.y1 * dy;
    const zEnd = levelAt(roof, levels, u1, v1);
    const zStart = levelAt(roof, levels, u0, v0);
    const zc = Math.max(zEnd ?? -Infinity, zStart ?? -Infinity);
    if (!Number.isFinite(zc)) continue;
    const eu = u1 - u0,
      ev = v1 - v0;
    const L2 = eu * eu + ev * ev;
    const L = Math.sqrt(L2);
    if (!(L > 0)) continue;
    const slope = 1 / roof.minFall.ratio;
    const reach = slope > 0 ? (zc - Math.min(zStart ?? zc, zEnd ?? zc)) / slope + L : L;
    for (let i = 0; i < mesh.vertexCount; i++) {
      const pu = mesh.u[i] - u0,
        pv = mesh.v[i] - v0;
      const s = (pu * eu + pv * ev) / L2;
      if (s < -1e-9 || s > 1) continue;
      const d = Math.abs(pu * ev - pv * eu) / L;
      if (d > reach) continue;
      const c2 = zc - d * slope;
      if (c2 > mesh.z[i]) mesh.z[i] = c2;
    }
  }
}
