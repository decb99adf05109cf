// The three.js classes the scenes write as JSX elements (<mesh>, <lineSegments>, …), and only
// those: the canvas registers this module's exports. A scene that needs another element adds it here.
export {
  AmbientLight,
  Color,
  CylinderGeometry,
  DirectionalLight,
  Group,
  InstancedMesh,
  LineBasicMaterial,
  LineDashedMaterial,
  LineSegments,
  Mesh,
  MeshBasicMaterial,
  MeshLambertMaterial,
  RingGeometry,
} from "three";
