import type { RoofSpec } from "~/engine";
import type { SceneFrame } from "./scene-frame";

/** Outlets: a dark bowl with an accent ring, sized to the outlet (at least visible at plan scale). */
export function OutletMarkers({
  outlets,
  frame,
  exaggeration,
}: {
  outlets: RoofSpec["outlets"];
  frame: SceneFrame;
  exaggeration: number;
}) {
  return (
    <group name="outlets">
      {outlets.map((o, k) => {
        const r = Math.max((o.size ?? 0.1) / 2, frame.radius * 0.012);
        const y = (o.level ?? 0) * exaggeration;
        return (
          <group key={k} position={[o.at[0] - frame.cx, y, -(o.at[1] - frame.cy)]}>
            <mesh position={[0, -r * 0.25, 0]}>
              <cylinderGeometry args={[r, r * 0.7, r * 0.6, 24]} />
              <meshLambertMaterial color="#1f2933" />
            </mesh>
            <mesh rotation={[-Math.PI / 2, 0, 0]} position={[0, r * 0.08, 0]}>
              <ringGeometry args={[r, r * 1.35, 32]} />
              <meshBasicMaterial color="#b4471f" />
            </mesh>
          </group>
        );
      })}
    </group>
  );
}
