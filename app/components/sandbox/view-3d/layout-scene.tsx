import { useMemo } from "react";
import type { EdgeKind, RoofSpec } from "~/engine";
import type { LayoutSurface } from "../layout-scenes";
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
}: {
  surface: LayoutSurface;
  spec: RoofSpec;
  kinds: EdgeKind[];
  frame: SceneFrame;
  exaggeration: number;
  minRatio: number;
  showOutlets?: boolean;
}) {
  const labels = useMemo(() => {
    const out: LevelLabel[] = [];
    if (spec.outline.length <= 40) {
      spec.outline.forEach((p, i) => {
        const z = surface.levelAt(p[0], p[1]);
        if (z !== null) out.push({ at: p, level: z, kind: "corner", name: `Corner ${i + 1}` });
      });
    }
    if (showOutlets) spec.outlets.forEach((o, k) => out.push({ at: o.at, level: o.level ?? 0, kind: "outlet", name: `Outlet ${k + 1}` }));
    return out;
  }, [surface, spec, showOutlets]);
  return (
    <group>
      <SceneLights />
      <RoofSurface mesh={surface} frame={frame} minRatio={minRatio} exaggeration={exaggeration} />
      <Parapets outline={spec.outline} kinds={kinds} frame={frame} low={Math.min(0, surface.low)} high={surface.high} exaggeration={exaggeration} />
      {showOutlets && <OutletMarkers outlets={spec.outlets} frame={frame} exaggeration={exaggeration} />}
      <LevelLabels labels={labels} frame={frame} exaggeration={exaggeration} />
    </group>
  );
}
