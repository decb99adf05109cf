import { useEffect, useMemo } from "react";
import * as THREE from "three";
import type { RoofSpec } from "~/engine";
import type { MeshSampler } from "./mesh-sample";
import type { SceneFrame } from "./scene-frame";

type V3 = [number, number, number];

/**
 * Openings as boxes standing on the deck (docs/roof-method-plans.md P2): an upstand wall round each
 * from just below the deck's level at each corner to a top set by its upstand height (never less
 * than a visible minimum), with a lid (glass-blue for a rooflight). One draw call each for walls and lids.
 */
export function Upstands({
  openings,
  sampler,
  frame,
  exaggeration,
  clippingPlanes,
}: {
  openings: NonNullable<RoofSpec["openings"]>;
  sampler: MeshSampler;
  frame: SceneFrame;
  exaggeration: number;
  clippingPlanes?: THREE.Plane[];
}) {
  const { walls, glass, lids } = useMemo(() => {
    const wall: number[] = [];
    const glassTop: number[] = [];
    const lidTop: number[] = [];
    const s = (x: number, y: number, z: number): V3 => [x - frame.cx, z, -(y - frame.cy)];
    for (const o of openings) {
      const ring = o.outline;
      const levels = ring.map((p) => sampler.levelAt(p[0], p[1]) ?? 0);
      const deckTop = Math.max(...levels) * exaggeration;
      const top = deckTop + Math.max(o.upstand ?? 0.15, frame.radius * 0.02);
      for (let i = 0; i < ring.length; i++) {
        const a = ring[i];
        const b = ring[(i + 1) % ring.length];
        const za = levels[i] * exaggeration - frame.radius * 0.005;
        const zb = levels[(i + 1) % ring.length] * exaggeration - frame.radius * 0.005;
        wall.push(
          ...s(a[0], a[1], za),
          ...s(b[0], b[1], zb),
          ...s(b[0], b[1], top),
          ...s(a[0], a[1], za),
          ...s(b[0], b[1], top),
          ...s(a[0], a[1], top),
        );
      }
      // The lid: a fan from the first corner (openings are drawn convex as a rule; a concave one still closes).
      const out = o.kind === "rooflight" ? glassTop : lidTop;
      for (let i = 1; i + 1 < ring.length; i++)
        out.push(
          ...s(ring[0][0], ring[0][1], top),
          ...s(ring[i][0], ring[i][1], top),
          ...s(ring[i + 1][0], ring[i + 1][1], top),
        );
    }
    const make = (arr: number[]) => {
      const g = new THREE.BufferGeometry();
      g.setAttribute("position", new THREE.Float32BufferAttribute(arr, 3));
      g.computeVertexNormals();
      return g;
    };
    return { walls: make(wall), glass: make(glassTop), lids: make(lidTop) };
  }, [openings, sampler, frame, exaggeration]);

  useEffect(
    () => () => {
      walls.dispose();
      glass.dispose();
      lids.dispose();
    },
    [walls, glass, lids],
  );

  return (
    <group name="upstands">
      <mesh geometry={walls}>
        <meshLambertMaterial color="#ddd3bf" side={THREE.DoubleSide} clippingPlanes={clippingPlanes ?? null} />
      </mesh>
      <mesh geometry={glass}>
        <meshLambertMaterial color="#8fb8d8" side={THREE.DoubleSide} clippingPlanes={clippingPlanes ?? null} />
      </mesh>
      <mesh geometry={lids}>
        <meshLambertMaterial color="#9aa5b1" side={THREE.DoubleSide} clippingPlanes={clippingPlanes ?? null} />
      </mesh>
    </group>
  );
}
