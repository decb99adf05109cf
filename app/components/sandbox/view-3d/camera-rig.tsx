import { OrbitControls } from "@react-three/drei";
import { useThree } from "@react-three/fiber";
import { useEffect, useRef } from "react";
import * as THREE from "three";
import type { OrbitControls as OrbitControlsImpl } from "three-stdlib";
import type { CameraPreset } from "../state/store";
import type { CameraLink } from "./camera-link";
import type { SceneFrame } from "./scene-frame";

export interface SectionPose {
  /** Scene point on the joist, half-way along it. */
  mid: THREE.Vector3;
  /** Scene direction from the camera toward the joist (horizontal, unit). */
  facing: THREE.Vector3;
  length: number;
}

/**
 * Orbit controls plus the camera presets: orbit (three-quarter view), plan (straight down, plan y up
 * the screen) and section (level with a joist, looking square at it). With a link, every move is
 * shared with the other views and theirs applied here.
 */
export function CameraRig({
  preset,
  frame,
  height,
  section,
  drains = null,
  link,
  resetKey = 0,
}: {
  preset: CameraPreset;
  frame: SceneFrame;
  /** Scene height of the high rim (level × exaggeration). */
  height: number;
  section: SectionPose | null;
  /** Plan point the water runs to (mean of the drains): the orbit view looks toward it, over the high side. */
  drains?: [number, number] | null;
  link?: CameraLink;
  /** The camera is put back to its preset only when this changes (not on every edit of the roof). */
  resetKey?: string | number;
}) {
  const camera = useThree((s) => s.camera);
  const invalidate = useThree((s) => s.invalidate);
  const controls = useRef<OrbitControlsImpl>(null);
  const applying = useRef(false);
  const id = useRef({});
  const latest = useRef({ frame, height, section, drains, link });
  latest.current = { frame, height, section, drains, link };

  useEffect(() => {
    const { frame, height, section, drains, link } = latest.current;
    const c = controls.current;
    if (!c) return;
    // Narrow views need the camera further back to keep the whole roof in the picture.
    const aspect = (camera as THREE.PerspectiveCamera).aspect || 4 / 3;
    const R = frame.radius * Math.max(1, (4 / 3 / aspect) ** 0.85);
    const target = new THREE.Vector3(0, height * 0.35, 0);
    const position = new THREE.Vector3();
    if (preset === "plan") {
      target.set(0, 0, 0);
      position.set(0, R * 3.6, R * 0.0005);
    } else if (preset === "section" && section) {
      target.copy(section.mid);
      const distance = Math.max(section.length * 1.25, R * 0.9);
      position.copy(section.mid).addScaledVector(section.facing, -distance);
      position.y = section.mid.y + height * 0.15 + R * 0.02;
    } else {
      // Stand on the high side, opposite the drains, turned a little for a three-quarter view.
      let ax = 0.5;
      let az = 0.85;
      if (drains) {
        const dx = frame.cx - drains[0];
        const dz = -(frame.cy - drains[1]);
        const len = Math.hypot(dx, dz);
        if (len > R * 0.05) {
          const c = Math.cos(0.55);
          const s = Math.sin(0.55);
          ax = (dx * c - dz * s) / len;
          az = (dx * s + dz * c) / len;
        }
      }
      const across = Math.hypot(ax, az);
      // Linked (side-by-side) views look down more steeply, so a narrow internal gutter is seen into.
      const [out, up] = link ? [1.75, 2.55] : [2.35, 1.7];
      position.set((ax / across) * R * out, R * up + height, (az / across) * R * out);
    }
    applying.current = true;
    camera.position.copy(position);
    c.target.copy(target);
    c.update();
    applying.current = false;
    link?.publish(id.current, camera.position, c.target);
    invalidate();
  }, [preset, resetKey, camera, invalidate, link]);

  useEffect(() => {
    if (!link) return;
    const follow = (source: object) => {
      const c = controls.current;
      if (source === id.current || !c) return;
      applying.current = true;
      camera.position.copy(link.position);
      c.target.copy(link.target);
      c.update();
      applying.current = false;
      invalidate();
    };
    if (link.has) follow({});
    return link.subscribe(follow);
  }, [link, camera, invalidate]);

  return (
    <OrbitControls
      ref={controls}
      makeDefault
      enableDamping={false}
      maxPolarAngle={Math.PI * 0.495}
      onChange={() => {
        if (applying.current || !controls.current) return;
        link?.publish(id.current, camera.position, controls.current.target);
      }}
    />
  );
}
