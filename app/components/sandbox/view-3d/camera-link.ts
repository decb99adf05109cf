import * as THREE from "three";

/** Shared camera pose for views that move together (side-by-side): one view publishes, the others follow. */
export class CameraLink {
  readonly position = new THREE.Vector3();
  readonly target = new THREE.Vector3();
  private readonly listeners = new Set<(source: object) => void>();
  has = false;

  subscribe(listener: (source: object) => void) {
    this.listeners.add(listener);
    return () => {
      this.listeners.delete(listener);
    };
  }

  publish(source: object, position: THREE.Vector3, target: THREE.Vector3) {
    this.position.copy(position);
    this.target.copy(target);
    this.has = true;
    for (const l of this.listeners) l(source);
  }
}
