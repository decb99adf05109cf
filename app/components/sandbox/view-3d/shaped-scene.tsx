import { useMemo } from "react";
import * as THREE from "three";
import type { Analysis, RoofSpec } from "~/engine";
import { MeshSampler } from "./mesh-sample";
import { sectionJoistIndex } from "./section-joist";
import { edgeKindsOf } from "../state/spec-edit";
import type { ViewSettings } from "../state/store";
import type { SectionPose } from "./camera-rig";
import { ContourLines } from "./contour-lines";
import { SurfaceLine } from "./fall-line-3d";
import { JoistMembers } from "./joists";
import { LevelLabels, type LevelLabel } from "./level-labels";
import { OutletMarkers } from "./outlet-markers";
import { Parapets } from "./parapets";
import { Upstands } from "./upstands";
import { RoofSurface } from "./roof-surface";
import type { SceneFrame } from "./scene-frame";
import { WaterPaths } from "./water-paths";

export function SceneLights() {
  return (
    <>
      <ambientLight intensity={1.4} />
      <directionalLight position={[8, 14, 6]} intensity={1.6} />
    </>
  );
}

/** The section joist: where the camera stands and the plane that cuts away the roof in front of it. */
export function sectionPose(
  analysis: Analysis,
  index: number,
  frame: SceneFrame,
  exaggeration: number,
): { pose: SectionPose; plane: THREE.Plane } | null {
  const joists = analysis.shaped.joists;
  const j = joists[Math.min(Math.max(index, 0), joists.length - 1)];
  if (!j || j.spans.length === 0) return null;
  const first = j.spans[0];
  const last = j.spans[j.spans.length - 1];
  const [dx, dy] = analysis.shaped.joistDirection;
  const mx = (first.start[0] + last.end[0]) / 2;
  const my = (first.start[1] + last.end[1]) / 2;
  const level = (first.startLevel + last.endLevel) / 2;
  // Square to the joist in plan; stand on the side away from the roof's centre so the cut shows the rest.
  let px = -dy;
  let py = dx;
  if ((frame.cx - mx) * px + (frame.cy - my) * py < 0) {
    px = -px;
    py = -py;
  }
  const mid = new THREE.Vector3(mx - frame.cx, level * exaggeration, -(my - frame.cy));
  const facing = new THREE.Vector3(px, 0, -py).normalize();
  const length = Math.hypot(last.end[0] - first.start[0], last.end[1] - first.start[1]);
  const cut = Math.max(0.02, frame.radius * 0.004);
  const plane = new THREE.Plane(facing.clone(), -facing.dot(mid) + cut);
  return { pose: { mid, facing, length }, plane };
}

/** The shaped roof as the engine built it, with everything the view settings ask for. */
export function ShapedScene({
  analysis,
  spec,
  frame,
  view,
  animate,
  section,
}: {
  analysis: Analysis;
  spec: RoofSpec;
  frame: SceneFrame;
  view: ViewSettings;
  animate: boolean;
  section: { pose: SectionPose; plane: THREE.Plane } | null;
}) {
  // The worker's answer carries typed arrays; a loader's (from JSON) plain ones.
  const mesh = analysis.shaped.meshBuffers ?? analysis.shaped.mesh;
  const sampler = useMemo(() => (mesh ? new MeshSampler(mesh) : null), [mesh]);
  const kinds = useMemo(() => edgeKindsOf(spec), [spec]);
  const exaggeration = view.exaggeration;
  const low = useMemo(() => {
    let min = 0;
    if (mesh) for (let i = 2; i < mesh.positions.length; i += 3) min = Math.min(min, mesh.positions[i]);
    return min;
  }, [mesh]);

  const labels = useMemo(() => {
    const out: LevelLabel[] = [];
    if (!sampler) return out;
    if (spec.outline.length <= 40) {
      spec.outline.forEach((p, i) => {
        const z = sampler.levelAt(p[0], p[1]);
        if (z !== null) out.push({ at: p, level: z, kind: "corner", name: `Corner ${i + 1}` });
      });
    }
    spec.outlets.forEach((o, k) =>
      out.push({ at: o.at, level: o.level ?? 0, kind: "outlet", name: `Outlet O${k + 1}` }),
    );
    return out;
  }, [sampler, spec]);

  const fallLine = useMemo(() => {
    const line = analysis.shaped.longestFallLine;
    if (!line || !sampler) return [];
    return sampler.drape(line.path.length >= 2 ? line.path : [line.from, line.to], Math.max(0.1, frame.radius / 60));
  }, [analysis, sampler, frame]);

  // Ridges (docs/roof-method-plans.md P4, P5) draped on the surface: dividing ones run at H.
  const ridges = useMemo(() => {
    if (!sampler) return [];
    return (analysis.shaped.ridges ?? []).map((r) => ({
      kind: r.kind,
      points: sampler.drape(r.line, Math.max(0.1, frame.radius / 60)),
    }));
  }, [analysis, sampler, frame]);

  const sectionJoist = view.camera === "section" ? sectionJoistIndex(analysis.shaped.joists, view.sectionJoist) : -1;
  const sectionLabels = useMemo(() => {
    const j = analysis.shaped.joists[sectionJoist];
    if (!j) return [];
    return j.spans.flatMap((s, k): LevelLabel[] => [
      { at: s.start, level: s.startLevel, kind: "joist", name: `Joist ${j.index + 1} span ${k + 1} start` },
      { at: s.end, level: s.endLevel, kind: "joist", name: `Joist ${j.index + 1} span ${k + 1} end` },
    ]);
  }, [analysis, sectionJoist]);
  const clipping = section && view.camera === "section" ? [section.plane] : undefined;

  if (!mesh) return null;
  return (
    <group>
      <SceneLights />
      <RoofSurface
        mesh={mesh}
        frame={frame}
        minRatio={analysis.minFall.ratio}
        exaggeration={exaggeration}
        clippingPlanes={clipping}
      />
      <Parapets
        outline={spec.outline}
        kinds={kinds}
        frame={frame}
        low={low}
        high={analysis.shaped.highLevel}
        exaggeration={exaggeration}
        clippingPlanes={clipping}
      />
      <OutletMarkers outlets={spec.outlets} frame={frame} exaggeration={exaggeration} />
      {spec.openings && spec.openings.length > 0 && sampler && (
        <Upstands
          openings={spec.openings}
          sampler={sampler}
          frame={frame}
          exaggeration={exaggeration}
          clippingPlanes={clipping}
        />
      )}
      {(view.showJoists || sectionJoist >= 0) && (
        <JoistMembers
          joists={analysis.shaped.joists}
          frame={frame}
          exaggeration={exaggeration}
          highlight={analysis.shaped.joists[sectionJoist]?.index ?? -1}
          clippingPlanes={clipping}
        />
      )}
      {view.showWater && analysis.shaped.flowTraces && !clipping && (
        <WaterPaths traces={analysis.shaped.flowTraces} frame={frame} exaggeration={exaggeration} animate={animate} />
      )}
      {view.showContours && (
        <ContourLines mesh={mesh} frame={frame} interval={view.contourInterval} exaggeration={exaggeration} />
      )}
      {!clipping &&
        ridges.map((r, i) => (
          <SurfaceLine
            key={i}
            points={r.points}
            frame={frame}
            exaggeration={exaggeration}
            color="#1f2933"
            width={4}
            dashed={r.kind === "cricket"}
          />
        ))}
      {view.highlightFallLine && !clipping && (
        <SurfaceLine points={fallLine} frame={frame} exaggeration={exaggeration} />
      )}
      <LevelLabels labels={clipping ? sectionLabels : labels} frame={frame} exaggeration={exaggeration} />
    </group>
  );
}
