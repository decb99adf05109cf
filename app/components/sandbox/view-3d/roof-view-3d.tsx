import { useFrame, useThree } from "@react-three/fiber";
import { SceneCanvas } from "./scene-canvas";
import { useEffect, useLayoutEffect, useMemo, useRef, useState, type RefObject } from "react";
import type { Analysis } from "~/engine";
import { useSandbox } from "../state/store";
import { CameraRig } from "./camera-rig";
import { sceneGlOptions } from "./cpu-drawing";
import { drainCentre, frameKey, useStableFrame } from "./scene-frame";
import { sectionJoistIndex } from "./section-joist";
import { sectionPose, ShapedScene } from "./shaped-scene";
import { useAnimationAllowed } from "./use-animation-allowed";
import { WaterPaused } from "./water-paused";

function Kick({ on }: { on: boolean }) {
  const invalidate = useThree((s) => s.invalidate);
  useEffect(() => {
    if (on) invalidate();
  }, [on, invalidate]);
  return null;
}

/**
 * Counts, on the view's wrapper (`data-drawn`), the frames that first showed a new analysis: a
 * signal that the canvas itself has changed, for tests and for anyone timing the live view.
 */
function DrawnMark({ analysis, target }: { analysis: Analysis | null; target: RefObject<HTMLDivElement | null> }) {
  const waiting = useRef(false);
  const count = useRef(0);
  useLayoutEffect(() => {
    if (analysis) waiting.current = true;
  }, [analysis]);
  useFrame(() => {
    if (!waiting.current || !target.current) return;
    waiting.current = false;
    target.current.dataset.drawn = String(++count.current);
  });
  return null;
}

/**
 * The 3D fall map of the shaped roof. Loaded lazily: three.js only reaches the pages that draw.
 * Renders on demand; the water animation asks for frames only while it runs.
 */
export default function RoofView3D({ className = "", resetKey = 0 }: { className?: string; resetKey?: number }) {
  const analysis = useSandbox((s) => s.analysis);
  const spec = useSandbox((s) => s.analysedSpec);
  const view = useSandbox((s) => s.view);
  const wrapper = useRef<HTMLDivElement>(null);
  const [gl] = useState(sceneGlOptions);
  const { animate, paused, water } = useAnimationAllowed(wrapper, view.showWater && view.camera !== "section");
  const frame = useStableFrame(spec?.outline);
  const joist = analysis ? sectionJoistIndex(analysis.shaped.joists, view.sectionJoist) : -1;
  const section = useMemo(
    () => (analysis && view.camera === "section" ? sectionPose(analysis, joist, frame, view.exaggeration) : null),
    [analysis, view.camera, joist, frame, view.exaggeration],
  );
  const height = (analysis?.shaped.highLevel ?? 0) * view.exaggeration;
  const drains = useMemo(() => drainCentre(spec), [spec]);

  return (
    <div ref={wrapper} className={`relative h-full w-full ${className}`} data-testid="view-3d" data-water={water}>
      <SceneCanvas
        frameloop="demand"
        dpr={[1, 2]}
        gl={gl}
        camera={{ fov: 35, near: 0.05, far: 20000, position: [10, 10, 10] }}
        onCreated={({ gl }) => {
          gl.localClippingEnabled = true;
        }}
        aria-label="3D fall map of the shaped roof"
        role="img"
      >
        <color attach="background" args={["#f1eadb"]} />
        {analysis && spec && (
          <ShapedScene analysis={analysis} spec={spec} frame={frame} view={view} animate={animate} section={section} />
        )}
        <CameraRig
          preset={view.camera}
          frame={frame}
          height={height}
          section={section?.pose ?? null}
          drains={drains}
          resetKey={`${frameKey(frame)}|${view.camera === "section" ? joist : ""}|${resetKey}`}
        />
        <Kick on={animate} />
        <DrawnMark analysis={analysis} target={wrapper} />
      </SceneCanvas>
      {paused && <WaterPaused className="absolute bottom-2 left-2 max-w-[calc(100%-1rem)]" />}
    </div>
  );
}
