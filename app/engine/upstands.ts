import type { FaceData } from "./faces";
import type { Routing } from "./flow";
import type { SurfaceMesh } from "./mesh";
import type { PerimeterLevels } from "./perimeter";
import { holeAt, toPlan, type Roof } from "./roof";
import { levelAt } from "./surface";
import type { Cricket, Warning } from "./types";

/** The opening whose boundary passes within `reach` of frame point (u, v), else -1. */
function openingNear(roof: Roof, u: number, v: number, reach: number): number {
  let best = -1;
  let bestD = reach;
  roof.holes.forEach((h, k) => {
    const m = h.us.length;
    for (let i = 0; i < m; i++) {
      const q = (i + 1) % m;
      const du = h.us[q] - h.us[i],
        dv = h.vs[q] - h.vs[i];
      const len2 = du * du + dv * dv;
      const s = Math.min(1, Math.max(0, len2 > 0 ? ((u - h.us[i]) * du + (v - h.vs[i]) * dv) / len2 : 0));
      const d = Math.hypot(h.us[i] + s * du - u, h.vs[i] + s * dv - v);
      if (d <= bestD) {
        bestD = d;
        best = k;
      }
    }
  });
  return best;
}

/**
 * The cricket for water held at frame point (u0, v0) against opening h (docs/roof-method-plans.md
 * P5): the crest runs along the joist away from the opening, level at zc = max(z1 + d1/N,
 * z2 + d2/N) over the two corners of the upstand either side of the held point, until it meets
 * the deck rising at its own fall. Null when the deck does not rise away from the opening there.
 */
export function cricketFor(roof: Roof, levels: PerimeterLevels, h: number, u0: number, v0: number): Cricket | null {
  const hole = roof.holes[h];
  const m = hole.us.length;
  // The boundary edge the held point lies on (the nearest), and its two ends: the corners.
  let edge = 0;
  let bestD = Infinity;
  for (let i = 0; i < m; i++) {
    const q = (i + 1) % m;
    const du = hole.us[q] - hole.us[i],
      dv = hole.vs[q] - hole.vs[i];
    const len2 = du * du + dv * dv;
    const s = Math.min(1, Math.max(0, len2 > 0 ? ((u0 - hole.us[i]) * du + (v0 - hole.vs[i]) * dv) / len2 : 0));
    const d = Math.hypot(hole.us[i] + s * du - u0, hole.vs[i] + s * dv - v0);
    if (d < bestD) {
      bestD = d;
      edge = i;
    }
  }
  const z0 = levelAt(roof, levels, u0, v0);
  if (z0 === null) return null;
  const N = roof.minFall.ratio;
  let zc = z0;
  for (const c of [edge, (edge + 1) % m]) {
    const zCorner = levelAt(roof, levels, hole.us[c], hole.vs[c]);
    if (zCorner === null) continue;
    zc = Math.max(zc, zCorner + Math.hypot(hole.us[c] - u0, hole.vs[c] - v0) / N);
  }
  // Along the joist, the way out of the opening.
  const probe = roof.spacing / 4;
  const dir = holeAt(roof, u0, v0 + probe) < 0 ? 1 : -1;
  const zAhead = levelAt(roof, levels, u0, v0 + dir * probe);
  if (zAhead === null) return null;
  const g = (zAhead - z0) / probe;
  if (!(g > 1e-12)) return null;
  const length = (zc - z0) / g;
  return {
    line: [toPlan(roof, u0, v0), toPlan(roof, u0, v0 + dir * length)],
    crestLevel: zc,
    length,
    height: zc - z0,
  };
}

/**
 * `water-held-behind-upstand` (docs/roof-method-plans.md P3): every pit of the routing that sits
 * against an opening, with the area draining to it and the cricket that would shed it.
 */
export function heldWaterWarnings(
  roof: Roof,
  levels: PerimeterLevels,
  mesh: SurfaceMesh,
  routing: Routing,
  faces: FaceData,
): Warning[] {
  if (!roof.holes.length) return [];
  const out: Warning[] = [];
  const reach = Math.max(mesh.step, roof.spacing * mesh.stride) * 1.01;
  routing.drains.forEach((d, id) => {
    if (d.kind !== "pit" || d.vertex < 0 || !(faces.drainArea[id] > 0)) return;
    const u = mesh.u[d.vertex];
    const v = mesh.v[d.vertex];
    const e = mesh.edge[d.vertex];
    const h = e <= -2 ? -2 - e : openingNear(roof, u, v, reach);
    if (h < 0) return;
    const hole = roof.holes[h];
    const area = faces.drainArea[id];
    const cricket = cricketFor(roof, levels, h, u, v);
    const at = toPlan(roof, u, v);
    out.push({
      code: "water-held-behind-upstand",
      message:
        `Water is held on the high side of opening ${hole.index + 1} (${hole.kind}) at (${at[0].toFixed(2)}, ${at[1].toFixed(2)}): ` +
        `${area.toFixed(1)} m² drain to it and the upstand stops it. A builder sets a small diverting ridge there, a cricket (saddle)` +
        (cricket
          ? `: a crest ${cricket.length.toFixed(2)} m long up the fall, ${Math.round(cricket.height * 1000)} mm above the deck at the upstand, so the water runs round both sides.`
          : ", so the water runs round both sides."),
      at,
      area,
      opening: hole.index,
      ...(cricket ? { cricket } : {}),
    });
  });
  return out;
}
