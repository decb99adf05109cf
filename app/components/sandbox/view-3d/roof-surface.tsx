import { useEffect, useMemo } from "react";
import * as THREE from "three";
import { HATCH_INK, HATCH_MIX, SHADE_MIN } from "~/lib/fall-colour";
import type { SceneFrame } from "./scene-frame";
import { surfaceAttributes, type SurfaceMesh } from "./surface-attributes";

const vertexShader = /* glsl */ `
#include <common>
#include <clipping_planes_pars_vertex>
attribute vec3 faceColor;
attribute float flatter;
varying vec3 vColor;
varying float vFlatter;
varying vec3 vWorld;
varying vec2 vPlan;
void main() {
  vColor = faceColor;
  vFlatter = flatter;
  vPlan = position.xz;
  vec4 mvPosition = modelViewMatrix * vec4(position, 1.0);
  vWorld = (modelMatrix * vec4(position, 1.0)).xyz;
  #include <clipping_planes_vertex>
  gl_Position = projectionMatrix * mvPosition;
}
`;

// Flat shading from screen-space derivatives; faces flatter than the minimum get ink hatching in plan.
const fragmentShader = /* glsl */ `
#include <common>
#include <clipping_planes_pars_fragment>
uniform vec3 lightDir;
uniform vec3 hatchColor;
uniform float hatchPeriod;
uniform float dim;
varying vec3 vColor;
varying float vFlatter;
varying vec3 vWorld;
varying vec2 vPlan;
void main() {
  #include <clipping_planes_fragment>
  vec3 n = normalize(cross(dFdx(vWorld), dFdy(vWorld)));
  float light = ${SHADE_MIN.toFixed(2)} + ${(1 - SHADE_MIN).toFixed(2)} * abs(dot(n, lightDir));
  vec3 c = vColor * light;
  if (vFlatter > 0.5) {
    float s = fract((vPlan.x - vPlan.y) / hatchPeriod);
    if (s < 0.28) c = mix(c, hatchColor, ${HATCH_MIX.toFixed(2)});
  }
  gl_FragColor = vec4(mix(c, vec3(0.97, 0.95, 0.91), dim), 1.0);
}
`;

/**
 * The roof surface in one draw call: faces unshared (non-indexed) so each carries its own colour
 * from the fall scale, and a flag for "flatter than the minimum" that the shader hatches.
 */
export function RoofSurface({
  mesh,
  frame,
  minRatio,
  exaggeration,
  clippingPlanes,
  dim = 0,
}: {
  mesh: SurfaceMesh;
  frame: SceneFrame;
  minRatio: number;
  exaggeration: number;
  clippingPlanes?: THREE.Plane[];
  dim?: number;
}) {
  const geometry = useMemo(() => {
    const { pos, col, flat } = surfaceAttributes(mesh, frame, minRatio);
    const g = new THREE.BufferGeometry();
    g.setAttribute("position", new THREE.BufferAttribute(pos, 3));
    g.setAttribute("faceColor", new THREE.BufferAttribute(col, 3));
    g.setAttribute("flatter", new THREE.BufferAttribute(flat, 1));
    g.computeBoundingSphere();
    return g;
  }, [mesh, frame, minRatio]);

  const material = useMemo(
    () =>
      new THREE.ShaderMaterial({
        vertexShader,
        fragmentShader,
        side: THREE.DoubleSide,
        clipping: true,
        uniforms: {
          lightDir: { value: new THREE.Vector3(0.35, 0.85, 0.4).normalize() },
          hatchColor: { value: new THREE.Color(`rgb(${HATCH_INK.join(",")})`) },
          hatchPeriod: { value: 0.25 },
          dim: { value: 0 },
        },
      }),
    [],
  );
  material.uniforms.hatchPeriod.value = Math.max(0.08, frame.radius / 45);
  material.uniforms.dim.value = dim;
  material.clippingPlanes = clippingPlanes ?? null;

  useEffect(() => () => geometry.dispose(), [geometry]);
  useEffect(() => () => material.dispose(), [material]);

  return <mesh geometry={geometry} material={material} scale={[1, exaggeration, 1]} name="roof-surface" />;
}
