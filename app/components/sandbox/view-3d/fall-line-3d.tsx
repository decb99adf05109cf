import { useThree } from "@react-three/fiber";
import { useEffect, useLayoutEffect, useMemo, useState } from "react";
import { Line2, LineGeometry, LineMaterial } from "three-stdlib";
import type { SceneFrame } from "./scene-frame";

/**
 * A polyline lying on the surface (already draped), drawn thick in the accent colour. One line
 * material lives as long as the line: only the geometry is rebuilt when the points move, so an
 * edit never recompiles a shader (slow where WebGL is drawn on the CPU).
 */
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
  const size = useThree((s) => s.size);
  const invalidate = useThree((s) => s.invalidate);
  const [material] = useState(() => new LineMaterial());
  const [line] = useState(() => new Line2(undefined, material));
  const geometry = useMemo(() => {
    const lift = 0.01 * exaggeration + 0.005;
    const g = new LineGeometry();
    g.setPositions(points.flatMap(([x, y, z]) => [x - frame.cx, z * exaggeration + lift, -(y - frame.cy)]));
    return g;
  }, [points, frame, exaggeration]);

  useLayoutEffect(() => {
    line.geometry = geometry;
    line.computeLineDistances();
    invalidate();
    return () => geometry.dispose();
  }, [line, geometry, invalidate]);

  useLayoutEffect(() => {
    material.color.set(color);
    material.linewidth = width;
    material.resolution.set(size.width, size.height);
    material.dashed = dashed;
    material.dashSize = frame.radius * 0.04;
    material.gapSize = frame.radius * 0.02;
    invalidate();
  }, [material, color, width, size.width, size.height, dashed, frame.radius, invalidate]);

  useEffect(() => () => material.dispose(), [material]);

  if (points.length < 2) return null;
  return <primitive object={line} />;
}
