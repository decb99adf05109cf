import { fallColour } from "~/lib/fall-colour";

const WALL_RGB: [number, number, number] = [120, 112, 98];

export interface SurfaceMesh {
  positions: ArrayLike<number>;
  indices: ArrayLike<number>;
  faceRatio: ArrayLike<number | null>;
}

/**
 * The roof surface's vertex attributes, rebuilt on every analysis: faces unshared (non-indexed) so
 * each carries its own colour from the fall scale, and a flag for "flatter than the minimum" that
 * the shader hatches. Scene axes: x east, y up, z south, centred on the frame. Plain arithmetic,
 * no three.js, so the bench can time it beside the analysis it follows.
 */
export function surfaceAttributes(
  mesh: SurfaceMesh,
  frame: { cx: number; cy: number },
  minRatio: number,
): { pos: Float32Array; col: Float32Array; flat: Float32Array } {
  const faces = mesh.indices.length / 3;
  const pos = new Float32Array(faces * 9);
  const col = new Float32Array(faces * 9);
  const flat = new Float32Array(faces * 3);
  const p = mesh.positions;
  for (let f = 0; f < faces; f++) {
    const ratio = mesh.faceRatio[f];
    // A negative ratio marks a vertical face (a gutter side): neutral ink, never hatched.
    const wall = ratio != null && ratio < 0;
    const [r, g, b] = wall ? WALL_RGB : fallColour(ratio);
    const flatter = !wall && (ratio == null || ratio > minRatio * (1 + 1e-9)) ? 1 : 0;
    for (let k = 0; k < 3; k++) {
      const v = mesh.indices[3 * f + k] * 3;
      const o = (3 * f + k) * 3;
      pos[o] = p[v] - frame.cx;
      pos[o + 1] = p[v + 2];
      pos[o + 2] = -(p[v + 1] - frame.cy);
      col[o] = r / 255;
      col[o + 1] = g / 255;
      col[o + 2] = b / 255;
      flat[3 * f + k] = flatter;
    }
  }
  return { pos, col, flat };
}
