import { useEffect, useMemo } from "react";
import * as THREE from "three";
import type { EdgeKind, Point } from "~/engine";
import { pointsSignedArea } from "~/engine/geometry/area";
import type { SceneFrame } from "./scene-frame";

type V3 = [number, number, number];

function quad(out: number[], a: V3, b: V3, c: V3, d: V3) {
  out.push(...a, ...b, ...c, ...a, ...c, ...d);
}

/**
 * Parapet walls round the outline (one draw call for all of them) and a low spouting strip along
 * eaves edges. The upstand is drawn at a fixed visual height whatever the exaggeration.
 */
export function Parapets({
  outline,
  kinds,
  frame,
  low,
  high,
  exaggeration,
  clippingPlanes,
}: {
  outline: Point[];
  kinds: EdgeKind[];
  frame: SceneFrame;
  low: number;
  high: number;
  exaggeration: number;
  clippingPlanes?: THREE.Plane[];
}) {
  const { walls, spouting } = useMemo(() => {
    const n = outline.length;
    const sign = pointsSignedArea(outline) > 0 ? 1 : -1;
    const t = Math.max(0.08, frame.radius * 0.018);
    const top = high * exaggeration + Math.max(0.12, frame.radius * 0.045);
    const bottom = low * exaggeration - Math.max(0.05, frame.radius * 0.02);
    const wall: number[] = [];
    const spout: number[] = [];
    for (let i = 0; i < n; i++) {
      const a = outline[i];
      const b = outline[(i + 1) % n];
      const len = Math.hypot(b[0] - a[0], b[1] - a[1]);
      if (len < 1e-9) continue;
      const ux = (b[0] - a[0]) / len;
      const uy = (b[1] - a[1]) / len;
      // Outward normal in plan.
      const nx = sign * uy;
      const ny = -sign * ux;
      const s = (x: number, y: number, z: number): V3 => [x - frame.cx, z, -(y - frame.cy)];
      const a0: Point = [a[0] - ux * t, a[1] - uy * t];
      const b0: Point = [b[0] + ux * t, b[1] + uy * t];
      if (kinds[i] === "eaves") {
        const w = t * 1.6;
        const zt = low * exaggeration - t * 0.3;
        const zb = zt - t * 1.2;
        const o = (p: Point, k: number): Point => [p[0] + nx * k, p[1] + ny * k];
        quad(spout, s(...o(a, 0), zt), s(...o(b, 0), zt), s(...o(b, 0), zb), s(...o(a, 0), zb));
        quad(spout, s(...o(a, 0), zb), s(...o(b, 0), zb), s(...o(b, w), zb), s(...o(a, w), zb));
        quad(spout, s(...o(a, w), zb), s(...o(b, w), zb), s(...o(b, w), zt), s(...o(a, w), zt));
        continue;
      }
      const ai: Point = a0;
      const bi: Point = b0;
      const ao: Point = [a0[0] + nx * t, a0[1] + ny * t];
      const bo: Point = [b0[0] + nx * t, b0[1] + ny * t];
      quad(wall, s(...ai, bottom), s(...bi, bottom), s(...bi, top), s(...ai, top));
      quad(wall, s(...ai, top), s(...bi, top), s(...bo, top), s(...ao, top));
      quad(wall, s(...ao, top), s(...bo, top), s(...bo, bottom), s(...ao, bottom));
      quad(wall, s(...ao, bottom), s(...ai, bottom), s(...ai, top), s(...ao, top));
      quad(wall, s(...bi, bottom), s(...bo, bottom), s(...bo, top), s(...bi, top));
    }
    const make = (arr: number[]) => {
      const g = new THREE.BufferGeometry();
      g.setAttribute("position", new THREE.Float32BufferAttribute(arr, 3));
      g.computeVertexNormals();
      return g;
    };
    return { walls: make(wall), spouting: make(spout) };
  }, [outline, kinds, frame, low, high, exaggeration]);

  useEffect(
    () => () => {
      walls.dispose();
      spouting.dispose();
    },
    [walls, spouting],
  );

  return (
    <group name="parapets">
      <mesh geometry={walls}>
        <meshLambertMaterial color="#ddd3bf" side={THREE.DoubleSide} clippingPlanes={clippingPlanes ?? null} />
      </mesh>
      <mesh geometry={spouting}>
        <meshLambertMaterial color="#52606d" side={THREE.DoubleSide} clippingPlanes={clippingPlanes ?? null} />
      </mesh>
    </group>
  );
}
