import { useEffect, useMemo } from "react";
import * as THREE from "three";
import { contourSegments } from "./contours";
import type { SurfaceMesh } from "./surface-attributes";
import type { SceneFrame } from "./scene-frame";

/** Contour lines of the surface at a level interval, one line draw. */
export function ContourLines({
  mesh,
  frame,
  interval,
  exaggeration,
}: {
  mesh: SurfaceMesh;
  frame: SceneFrame;
  interval: number;
  exaggeration: number;
}) {
  const geometry = useMemo(() => {
    const seg = contourSegments(mesh.positions, mesh.indices, interval);
    for (let i = 0; i < seg.length; i += 3) {
      const x = seg[i];
      const y = seg[i + 1];
      const z = seg[i + 2];
      seg[i] = x - frame.cx;
      seg[i + 1] = z;
      seg[i + 2] = -(y - frame.cy);
    }
    const g = new THREE.BufferGeometry();
    g.setAttribute("position", new THREE.BufferAttribute(seg, 3));
    return g;
  }, [mesh, frame, interval]);
  useEffect(() => () => geometry.dispose(), [geometry]);
  return (
    <lineSegments
      geometry={geometry}
      scale={[1, exaggeration, 1]}
      position={[0, 0.004 * exaggeration + 0.002, 0]}
      name="contours"
    >
      <lineBasicMaterial color="#1f2933" transparent opacity={0.7} />
    </lineSegments>
  );
}
