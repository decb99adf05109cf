import { SceneCanvas } from "./scene-canvas";
import { useMemo, useRef, useState } from "react";
import type { Analysis, RoofSpec } from "~/engine";
import { useFormat } from "../format";
import { gutterSurface, openEdgeKinds, openEdgeSurface } from "./layout-scenes";
import { edgeKindsOf } from "../state/spec-edit";
import { useSandbox } from "../state/store";
import { CameraLink } from "./camera-link";
import { CameraRig } from "./camera-rig";
import { sceneGlOptions } from "./cpu-drawing";
import { LayoutScene } from "./layout-scene";
import { drainCentre, frameKey, useStableFrame, type SceneFrame } from "./scene-frame";
import { ShapedScene } from "./shaped-scene";
import { useAnimationAllowed } from "./use-animation-allowed";
import { WaterPaused } from "./water-paused";

function Panel({
  title,
  figure,
  children,
  testId,
  note,
}: {
  title: string;
  figure: string;
  children: React.ReactNode;
  testId: string;
  /** Shown over the view's lower edge, so the panel keeps its size when it comes and goes. */
  note?: React.ReactNode;
}) {
  return (
    <figure className="flex min-w-0 flex-col overflow-hidden rounded border border-rule bg-sheet" data-testid={testId}>
      <figcaption className="flex flex-wrap items-baseline justify-between gap-x-2 border-b border-rule px-3 py-1.5">
        <span className="text-sm font-bold">{title}</span>
        <span className="text-sm tabular-nums text-ink-soft">{figure}</span>
      </figcaption>
      <div className="relative h-64 md:h-56 lg:h-80">
        {children}
        {note}
      </div>
    </figure>
  );
}

function View({
  label,
  children,
  frame,
  height,
  link,
  preset,
  resetKey,
  drains,
}: {
  label: string;
  drains: [number, number] | null;
  children: React.ReactNode;
  frame: SceneFrame;
  height: number;
  link: CameraLink;
  preset: "orbit" | "plan";
  resetKey: string;
}) {
  const [gl] = useState(sceneGlOptions);
  return (
    <SceneCanvas
      frameloop="demand"
      dpr={[1, 2]}
      gl={gl}
      camera={{ fov: 35, near: 0.05, far: 20000, position: [10, 10, 10] }}
      aria-label={label}
      role="img"
    >
      <color attach="background" args={["#f1eadb"]} />
      {children}
      <CameraRig
        preset={preset}
        frame={frame}
        height={height}
        section={null}
        drains={drains}
        link={link}
        resetKey={resetKey}
      />
    </SceneCanvas>
  );
}

/**
 * Side-by-side: the shaped roof, the gutter layout and the open-edge option on linked cameras
 * (orbit one, the others follow), same exaggeration and fall colours.
 */
export default function SideBySide({ resetKey = 0 }: { resetKey?: number }) {
  const { mm } = useFormat();
  const analysis = useSandbox((s) => s.analysis);
  const spec = useSandbox((s) => s.analysedSpec);
  const view = useSandbox((s) => s.view);
  const wrapper = useRef<HTMLDivElement>(null);
  const { animate, paused, water } = useAnimationAllowed(wrapper, view.showWater);
  const link = useMemo(() => new CameraLink(), []);
  const frame = useStableFrame(spec?.outline);
  if (!analysis || !spec)
    return <p className="text-sm text-ink-soft">The comparison appears once the roof can be built.</p>;
  const preset = view.camera === "plan" ? "plan" : "orbit";
  const height = analysis.shaped.highLevel * view.exaggeration;
  const key = `${frameKey(frame)}|${resetKey}`;
  const drains = drainCentre(spec);
  return (
    <div ref={wrapper} className="grid gap-3 md:grid-cols-3" data-testid="side-by-side" data-water={water}>
      <Panel
        title="Shaped roof"
        figure={`H ${mm(analysis.shaped.highLevel)}`}
        testId="panel-shaped"
        note={paused && <WaterPaused className="absolute right-2 bottom-2 left-2" />}
      >
        <View
          label="Shaped roof in 3D"
          frame={frame}
          height={height}
          link={link}
          preset={preset}
          resetKey={key}
          drains={drains}
        >
          <ShapedScene
            analysis={analysis}
            spec={spec}
            frame={frame}
            view={{ ...view, camera: "orbit" }}
            animate={animate}
            section={null}
          />
        </View>
      </Panel>
      <GutterPanel
        analysis={analysis}
        spec={spec}
        frame={frame}
        height={height}
        link={link}
        preset={preset}
        resetKey={key}
        drains={drains}
        exaggeration={view.exaggeration}
      />
      <OpenEdgePanel
        analysis={analysis}
        spec={spec}
        frame={frame}
        height={height}
        link={link}
        preset={preset}
        resetKey={key}
        drains={drains}
        exaggeration={view.exaggeration}
      />
    </div>
  );
}

interface LayoutPanelProps {
  analysis: Analysis;
  spec: RoofSpec;
  frame: SceneFrame;
  height: number;
  link: CameraLink;
  preset: "orbit" | "plan";
  resetKey: string;
  drains: [number, number] | null;
  exaggeration: number;
}

function GutterPanel({ analysis, spec, exaggeration, ...rest }: LayoutPanelProps) {
  const { mm } = useFormat();
  const surface = useMemo(() => gutterSurface(spec, analysis), [spec, analysis]);
  const kinds = useMemo(() => edgeKindsOf(spec), [spec]);
  return (
    <Panel
      title="Gutter layout"
      figure={analysis.gutter.comparable ? `H ${mm(analysis.gutter.highLevel)}` : "not comparable"}
      testId="panel-gutter"
    >
      {surface ? (
        <View label="Gutter layout in 3D" {...rest}>
          <LayoutScene
            surface={surface}
            spec={spec}
            kinds={kinds}
            frame={rest.frame}
            exaggeration={exaggeration}
            minRatio={analysis.minFall.ratio}
            note={`gutter lip ${Math.round(analysis.gutter.lipLevel! * 1000)} · ${Math.round(analysis.gutter.width * 1000)} mm wide`}
          />
        </View>
      ) : (
        <p className="p-4 text-sm text-ink-soft">{analysis.gutter.reason ?? "No gutter layout for this roof."}</p>
      )}
    </Panel>
  );
}

function OpenEdgePanel({ analysis, spec, exaggeration, ...rest }: LayoutPanelProps) {
  const { mm } = useFormat();
  const surface = useMemo(() => openEdgeSurface(spec, analysis), [spec, analysis]);
  const kinds = useMemo(() => openEdgeKinds(spec, analysis), [spec, analysis]);
  return (
    <Panel
      title={`Open edge (edge ${analysis.openEdge.edge + 1})`}
      figure={`H ${mm(analysis.openEdge.highLevel)}`}
      testId="panel-open-edge"
    >
      <View label="Open-edge option in 3D" {...rest}>
        <LayoutScene
          surface={surface}
          spec={spec}
          kinds={kinds}
          frame={rest.frame}
          exaggeration={exaggeration}
          minRatio={analysis.minFall.ratio}
          showOutlets={false}
        />
      </View>
    </Panel>
  );
}
