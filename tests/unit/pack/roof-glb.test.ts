import * as THREE from "three";
import { GLTFLoader } from "three/examples/jsm/loaders/GLTFLoader.js";
import { describe, expect, it } from "vitest";
import { DEMO_ROOF } from "~/components/sandbox/state/demo-roof";
import { fallColour } from "~/lib/fall-colour";
import { roofGlb } from "~/components/pack/roof-glb";
import { CAUTION_LINE } from "~/lib/caution";
import { packOf, U_ROOF } from "./fixtures";

/** Loaded back with three.js's own GLTFLoader, as any viewer would read it. */
async function load(bytes: Uint8Array) {
  const buffer = bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer;
  return new Promise<{
    scene: THREE.Group;
    parser: { json: { scenes: { extras?: Record<string, string> }[]; asset: { version: string } } };
  }>((resolve, reject) => new GLTFLoader().parse(buffer, "", (g) => resolve(g as never), reject));
}

describe("roof.glb", () => {
  it("holds the shaped roof's mesh: vertex count, bounds and fall colours of the analysis", async () => {
    const pack = packOf(DEMO_ROOF, "Depot", undefined, true);
    const mesh = pack.analysis.shaped.mesh!;
    const bytes = await roofGlb(pack);
    // glTF binary header: magic "glTF", version 2 (Khronos glTF 2.0, §4.4 GLB file format).
    expect(new TextDecoder().decode(bytes.slice(0, 4))).toBe("glTF");
    expect(new DataView(bytes.buffer, bytes.byteOffset).getUint32(4, true)).toBe(2);
    const gltf = await load(bytes);
    const roof = gltf.scene.getObjectByName("shaped-roof") as THREE.Mesh;
    const position = roof.geometry.getAttribute("position");
    // One vertex per face corner (faces unshared so each keeps its colour).
    expect(position.count).toBe(mesh.indices.length);
    roof.geometry.computeBoundingBox();
    const box = roof.geometry.boundingBox!;
    const xs = mesh.positions.filter((_, i) => i % 3 === 0);
    const ys = mesh.positions.filter((_, i) => i % 3 === 1);
    const zs = mesh.positions.filter((_, i) => i % 3 === 2);
    expect(box.min.x).toBeCloseTo(Math.min(...xs), 5);
    expect(box.max.x).toBeCloseTo(Math.max(...xs), 5);
    expect(box.min.y).toBeCloseTo(Math.min(...zs), 5);
    expect(box.max.y).toBeCloseTo(pack.analysis.shaped.highLevel, 5);
    expect(box.min.z).toBeCloseTo(-Math.max(...ys), 5);
    expect(box.max.z).toBeCloseTo(-Math.min(...ys), 5);
    // COLOR_0 present, and face 0's colour is the 3D view's fall colour for its ratio (stored linear).
    const colour = roof.geometry.getAttribute("color");
    expect(colour.count).toBe(position.count);
    const want = new THREE.Color().setRGB(
      ...(fallColour(mesh.faceRatio[0]).map((v) => v / 255) as [number, number, number]),
      THREE.SRGBColorSpace,
    );
    expect(colour.getX(0)).toBeCloseTo(want.r, 4);
    expect(colour.getY(0)).toBeCloseTo(want.g, 4);
    expect(colour.getZ(0)).toBeCloseTo(want.b, 4);
    expect((roof.material as THREE.MeshStandardMaterial).vertexColors).toBe(true);
  });

  it("has the gutter layout beside it and carries the roof's name, datum and caution as scene extras", async () => {
    const pack = packOf(DEMO_ROOF, "Depot", undefined, true);
    const gltf = await load(await roofGlb(pack));
    const gutter = gltf.scene.getObjectByName("gutter-layout") as THREE.Mesh;
    expect(gutter).toBeDefined();
    gutter.geometry.computeBoundingBox();
    // Shifted 1.25 × the roof's 12 m width along x, so the two sit side by side.
    expect(gutter.geometry.boundingBox!.min.x).toBeCloseTo(15, 5);
    const extras = gltf.parser.json.scenes[0].extras!;
    expect(extras.roof).toBe("Depot");
    expect(extras.caution).toBe(CAUTION_LINE);
    expect(extras.datum).toContain(`H = ${Math.round(pack.analysis.shaped.highLevel * 1000)} mm`);
  });

  it("writes a roof whose gutter layout is not comparable with the shaped roof alone", async () => {
    const pack = packOf(
      {
        ...U_ROOF,
        outlets: [],
        edges: ["eaves", "parapet", "parapet", "parapet", "parapet", "parapet", "parapet", "parapet"],
      },
      "Eaves",
      undefined,
      true,
    );
    const gltf = await load(await roofGlb(pack));
    expect(gltf.scene.getObjectByName("shaped-roof")).toBeDefined();
    expect(gltf.scene.getObjectByName("gutter-layout")).toBeUndefined();
  });
});
