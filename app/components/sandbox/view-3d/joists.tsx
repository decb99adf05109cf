import { useEffect, useLayoutEffect, useMemo, useRef } from "react";
import * as THREE from "three";
import type { Analysis } from "~/engine";
import type { SceneFrame } from "./scene-frame";

type Joists = Analysis["shaped"]["joists"];

/**
 * Joists as one instanced box each span (one draw call), hung under the deck with their top on the
 * surface, plus faint lines on the surface so they read from above too.
 */
export function JoistMembers({
  joists,
  frame,
  exaggeration,
  highlight,
  clippingPlanes,
}: {
  joists: Joists;
  frame: SceneFrame;
  exaggeration: number;
  highlight: number;
  clippingPlanes?: THREE.Plane[];
}) {
  const ref = useRef<THREE.InstancedMesh>(null);
  const spans = useMemo(() => joists.flatMap((j) => j.spans.map((s) => ({ s, joist: j.index }))), [joists]);
  const depth = Math.max(0.06, frame.radius * 0.018);
  const width = Math.max(0.03, Math.min(0.08, frame.radius * 0.006));

  useLayoutEffect(() => {
    const mesh = ref.current;
    if (!mesh) return;
    const m = new THREE.Matrix4();
    const q = new THREE.Quaternion();
    const pos = new THREE.Vector3();
    const scale = new THREE.Vector3();
    const dir = new THREE.Vector3();
    const xAxis = new THREE.Vector3(1, 0, 0);
    const colour = new THREE.Color();
    spans.forEach(({ s, joist }, i) => {
      const a = new THREE.Vector3(s.start[0] - frame.cx, s.startLevel * exaggeration, -(s.start[1] - frame.cy));
      const b = new THREE.Vector3(s.end[0] - frame.cx, s.endLevel * exaggeration, -(s.end[1] - frame.cy));
      dir.subVectors(b, a);
      const length = dir.length();
      q.setFromUnitVectors(xAxis, dir.normalize());
      pos.addVectors(a, b).multiplyScalar(0.5);
      pos.y -= depth / 2 + 0.002;
      scale.set(Math.max(length, 1e-6), depth, width);
      m.compose(pos, q, scale);
      mesh.setMatrixAt(i, m);
      mesh.setColorAt(i, colour.set(joist === highlight ? "#b4471f" : "#8a7a5c"));
    });
    mesh.count = spans.length;
    mesh.instanceMatrix.needsUpdate = true;
    if (mesh.instanceColor) mesh.instanceColor.needsUpdate = true;
    mesh.computeBoundingSphere();
  }, [spans, frame, exaggeration, depth, width, highlight]);

  const lines = useMemo(() => {
    const arr = new Float32Array(spans.length * 6);
    spans.forEach(({ s }, i) => {
      arr.set(
        [
          s.start[0] - frame.cx,
          s.startLevel,
          -(s.start[1] - frame.cy),
          s.end[0] - frame.cx,
          s.endLevel,
          -(s.end[1] - frame.cy),
        ],
        i * 6,
      );
    });
    const g = new THREE.BufferGeometry();
    g.setAttribute("position", new THREE.BufferAttribute(arr, 3));
    return g;
  }, [spans, frame]);
  const box = useMemo(() => new THREE.BoxGeometry(1, 1, 1), []);
  useEffect(() => () => lines.dispose(), [lines]);
  useEffect(() => () => box.dispose(), [box]);

  return (
    <group name="joists">
      <instancedMesh ref={ref} args={[box, undefined, Math.max(1, spans.length)]} frustumCulled={false}>
        <meshLambertMaterial clippingPlanes={clippingPlanes ?? null} />
      </instancedMesh>
      <lineSegments geometry={lines} scale={[1, exaggeration, 1]} position={[0, 0.004 * exaggeration + 0.003, 0]}>
        <lineBasicMaterial color="#1f2933" transparent opacity={0.28} clippingPlanes={clippingPlanes ?? null} />
      </lineSegments>
    </group>
  );
}
