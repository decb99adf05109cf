import { Line } from "@react-three/drei";
import type { SceneFrame } from "./scene-frame";

/** A polyline lying on the surface (already draped), drawn thick in the accent colour. */
export function SurfaceLine({
  points,
  frame,
  exaggeration,
  color = "#b4471f",
  width = 3,
  dashed = false,
}: {
  points: [number, number, number][];
  frame: SceneFrame;
  exaggeration: number;
  color?: string;
  width?: number;
  dashed?: boolean;
}) {
  if (points.length < 2) return null;
  const lift = 0.01 * exaggeration + 0.005;
  return (
    <Line
      points={points.map(([x, y, z]) => [x - frame.cx, z * exaggeration + lift, -(y - frame.cy)] as [number, number, number])}
      color={color}
      lineWidth={width}
      dashed={dashed}
      dashSize={frame.radius * 0.04}
      gapSize={frame.radius * 0.02}
    />
  );
}
