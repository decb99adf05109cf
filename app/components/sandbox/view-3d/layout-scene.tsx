import { useMemo } from "react";
import type { EdgeKind, RoofSpec } from "~/engine";
import type { LayoutSurface } from "./layout-scenes";
import { SurfaceLine } from "./fall-line-3d";
import { LevelLabels, type LevelLabel } from "./level-labels";
import { OutletMarkers } from "./outlet-markers";
import { Parapets } from "./parapets";
import { RoofSurface } from "./roof-surface";
import type { SceneFrame } from "./scene-frame";
import { SceneLights } from "./shaped-scene";

/** A comparison layout (gutter or open edge) drawn with the same fall colours, walls and labels as the shaped roof. */
export function LayoutScene({
  surface,
  spec,
  kinds,
  frame,
  exaggeration,
  minRatio,
  showOutlets = true,
  note,
}: {
  surface: LayoutSurface;
  spec: RoofSpec;
  kinds: EdgeKind[];
  frame: SceneFrame;
  exaggeration: number;
  minRatio: number;
  showOutlets?: boolean;
  /** Text for a label on the first highlighted line (e.g. what the gutter is). */
  note?: string;
}) {
  const labels = useMemo(() => {
    const out: LevelLabel[] = [];
    if (spec.outline.length <= 40) {
      spec.outline.forEach((p, i) => {
        const z = surface.levelAt(p[0], p[1]);
        if (z !== null) out.push({ at: p, level: z, kind: "corner", name: `Corner ${i + 1}` });
      });
    }
    if (showOutlets)
      spec.outlets.forEach((o, k) =>
        out.push({ at: o.at, level: o.level ?? 0, kind: "outlet", name: `Outlet O${k + 1}` }),
      );
    const longest = [...surface.lines].sort(
      (a, b) => Math.hypot(b[1][0] - b[0][0], b[1][1] - b[0][1]) - Math.hypot(a[1][0] - a[0][0], a[1][1] - a[0][1]),
    )[0];
    if (note && longest) {
      const [p, q] = longest;
      out.push({ at: [(p[0] + q[0]) / 2, (p[1] + q[1]) / 2], level: p[2], kind: "note", name: note, text: note });
    }
    return out;
  }, [surface, spec, showOutlets, note]);
  return (
    <group>
      <SceneLights />
      <RoofSurface mesh={surface} frame={frame} minRatio={minRatio} exaggeration={exaggeration} />
      <Parapets
        outline={spec.outline}
        kinds={kinds}
        frame={frame}
        low={Math.min(0, surface.low)}
        high={surface.high}
        exaggeration={exaggeration}
      />
      {showOutlets && <OutletMarkers outlets={spec.outlets} frame={frame} exaggeration={exaggeration} />}
      {surface.lines.map(([p, q], i) => (
        <SurfaceLine key={i} points={[p, q]} frame={frame} exaggeration={exaggeration} color="#1f2933" width={2.5} />
      ))}
      <LevelLabels labels={labels} frame={frame} exaggeration={exaggeration} />
    </group>
  );
}
