import { fallFromRatio } from "./fall";
import { outletsOnEdge, type PerimeterLevels } from "./perimeter";
import type { Roof } from "./roof";
import type { EdgeFall, Point } from "./types";

/** Each rising piece of an outlet edge with its own fall, length over rise (docs/roof-method.md §2). */
export function edgeFalls(roof: Roof, levels: PerimeterLevels): EdgeFall[] {
  const out: EdgeFall[] = [];
  for (let j = 0; j < roof.n; j++) {
    if (roof.eaves[j] || outletsOnEdge(roof, j).length === 0) continue;
    const q = (j + 1) % roof.n;
    const at = (t: number): Point => {
      const s = t / roof.len[j];
      return [
        roof.ox + roof.xs[j] + s * (roof.xs[q] - roof.xs[j]),
        roof.oy + roof.ys[j] + s * (roof.ys[q] - roof.ys[j]),
      ];
    };
    const kt = levels.t[j];
    const kz = levels.z[j];
    for (let k = 1; k < kt.length; k++) {
      const rise = kz[k] - kz[k - 1];
      if (Math.abs(rise) <= 1e-12) continue;
      const ratio = (kt[k] - kt[k - 1]) / Math.abs(rise);
      const [lo, hi] = rise > 0 ? [k - 1, k] : [k, k - 1];
      out.push({ edge: roof.userEdge[j], from: at(kt[lo]), to: at(kt[hi]), ratio, fall: fallFromRatio(ratio) });
    }
  }
  return out.sort((a, b) => a.edge - b.edge);
}
