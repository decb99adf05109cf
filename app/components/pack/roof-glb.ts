/**
 * The shaped roof (and the gutter layout beside it) as binary glTF 2.0 (.glb, Khronos) with the
 * fall colours of the 3D view as vertex colours (COLOR_0), written by three.js's own exporter.
 * Pure TypeScript with three.js, no React: the server writes it for the download addresses.
 */
import * as THREE from "three";
import { GLTFExporter } from "three/examples/jsm/exporters/GLTFExporter.js";
import { CAUTION_LINE } from "~/lib/caution";
import { datumText, isoDate, type PackRoof, type PackWriter } from "~/lib/pack/facts";
import { fallColour } from "~/lib/fall-colour";
import { gutterSurface, WALL_FACE } from "~/components/sandbox/view-3d/layout-scenes";

/** The neutral colour of a vertical gutter side, as the 3D view draws it. */
const WALL_RGB: [number, number, number] = [0x52, 0x60, 0x6d];

interface SurfaceInput {
  positions: ArrayLike<number>;
  indices: ArrayLike<number>;
  faceRatio: ArrayLike<number | null>;
}

/**
 * One mesh, faces unshared so each carries its own colour. glTF is Y-up in metres: x = plan x,
 * y = level, z = −plan y (so the plan reads the right way round from above). Colours are stored
 * linear, as glTF asks; the 3D view's sRGB scale is converted.
 */
export function surfaceMesh(s: SurfaceInput, name: string, shiftX = 0): THREE.Mesh {
  const faces = s.indices.length / 3;
  const pos = new Float32Array(faces * 9);
  const col = new Float32Array(faces * 9);
  const c = new THREE.Color();
  for (let f = 0; f < faces; f++) {
    const ratio = s.faceRatio[f];
    const [r, g, b] = ratio != null && ratio === WALL_FACE ? WALL_RGB : fallColour(ratio);
    c.setRGB(r / 255, g / 255, b / 255, THREE.SRGBColorSpace);
    for (let k = 0; k < 3; k++) {
      const v = s.indices[3 * f + k] * 3;
      const o = (3 * f + k) * 3;
      pos[o] = s.positions[v] + shiftX;
      pos[o + 1] = s.positions[v + 2];
      pos[o + 2] = -s.positions[v + 1];
      col[o] = c.r;
      col[o + 1] = c.g;
      col[o + 2] = c.b;
    }
  }
  const geometry = new THREE.BufferGeometry();
  geometry.setAttribute("position", new THREE.BufferAttribute(pos, 3));
  geometry.setAttribute("color", new THREE.BufferAttribute(col, 3));
  geometry.computeVertexNormals();
  const mesh = new THREE.Mesh(
    geometry,
    new THREE.MeshStandardMaterial({
      vertexColors: true,
      side: THREE.DoubleSide,
      roughness: 0.9,
      name: `${name}-fall-colours`,
    }),
  );
  mesh.name = name;
  return mesh;
}

/** The scene the .glb holds: the shaped roof, and the gutter layout beside it when comparable. */
export function packScene(p: PackRoof): THREE.Scene {
  const mesh = p.analysis.shaped.mesh;
  if (!mesh) throw new Error("The glb needs the analysis with its mesh.");
  const scene = new THREE.Scene();
  scene.name = p.name;
  scene.add(surfaceMesh(mesh, "shaped-roof"));
  const gutter = gutterSurface(p.spec, p.analysis);
  if (gutter) {
    const xs = p.spec.outline.map((q) => q[0]);
    const width = Math.max(...xs) - Math.min(...xs);
    scene.add(surfaceMesh(gutter, "gutter-layout", width * 1.25));
  }
  scene.userData = {
    roof: p.name,
    date: isoDate(p.date),
    units: "metres; y is the level above datum, x and -z the plan",
    datum: datumText(p),
    layout: gutter
      ? "shaped-roof at the plan's place; gutter-layout beside it, shifted along x"
      : "shaped-roof only (the gutter layout is not comparable)",
    caution: CAUTION_LINE,
  };
  return scene;
}

// three's exporter reads its binary chunks back through FileReader, which Node does not have.
// A minimal one over Blob.arrayBuffer (Node ≥ 18 has Blob) does the same job on the server.
function ensureFileReader() {
  if (typeof globalThis.FileReader !== "undefined") return;
  class NodeFileReader {
    result: ArrayBuffer | string | null = null;
    onload: ((e: unknown) => void) | null = null;
    onloadend: ((e: unknown) => void) | null = null;
    onerror: ((e: unknown) => void) | null = null;
    readAsArrayBuffer(blob: Blob) {
      blob.arrayBuffer().then(
        (buffer) => {
          this.result = buffer;
          this.onload?.({ target: this });
          this.onloadend?.({ target: this });
        },
        (error) => this.onerror?.(error),
      );
    }
    readAsDataURL(blob: Blob) {
      blob.arrayBuffer().then(
        (buffer) => {
          this.result = `data:${blob.type || "application/octet-stream"};base64,${Buffer.from(buffer).toString("base64")}`;
          this.onload?.({ target: this });
          this.onloadend?.({ target: this });
        },
        (error) => this.onerror?.(error),
      );
    }
  }
  (globalThis as unknown as { FileReader: unknown }).FileReader = NodeFileReader;
}

/** The .glb bytes. */
export async function roofGlb(p: PackRoof): Promise<Uint8Array> {
  ensureFileReader();
  const scene = packScene(p);
  const out = await new GLTFExporter().parseAsync(scene, { binary: true });
  scene.traverse((o) => {
    if (o instanceof THREE.Mesh) {
      o.geometry.dispose();
      (o.material as THREE.Material).dispose();
    }
  });
  return new Uint8Array(out as ArrayBuffer);
}

export const ROOF_GLB: PackWriter = {
  file: "roof.glb",
  what: "roof",
  ext: "glb",
  type: "model/gltf-binary",
  mesh: true,
  write: roofGlb,
};
