import { ratioOfSlope } from "./fall-map";
import type { SurfaceMesh } from "./mesh";
import type { Roof } from "./roof";
import type { Mesh, MeshBuffers } from "./types";

function planPositions<T extends number[] | Float64Array>(roof: Roof, mesh: SurfaceMesh, out: T): T {
  const { dx, dy, ox, oy } = roof;
  for (let i = 0; i < mesh.vertexCount; i++) {
    const u = mesh.u[i];
    const v = mesh.v[i];
    out[3 * i] = ox + u * dy + v * dx;
    out[3 * i + 1] = oy - u * dx + v * dy;
    out[3 * i + 2] = mesh.z[i];
  }
  return out;
}

/**
 * A plain array of n numbers, filled before use: `new Array(n)` alone is a holey array, and past
 * about 100,000 elements V8 makes it a dictionary, which is several times slower to fill (the
 * large bench roof's mesh has 190,000 coordinates and 378,000 indices).
 */
const numbers = (n: number) => new Array<number>(n).fill(0);

/** The mesh as plain arrays (squared face falls in, ratios out) in request coordinates, ready for JSON. */
export function meshArrays(roof: Roof, mesh: SurfaceMesh, slope2: Float64Array, faceDrain: Int32Array): Mesh {
  const positions = planPositions(roof, mesh, numbers(3 * mesh.vertexCount));
  const F = mesh.faceCount;
  // Infinity (not null) keeps the array unboxed; JSON writes it as null.
  const faceRatio = numbers(F);
  const indices = numbers(3 * F);
  const drains = numbers(F);
  const tri = mesh.tri;
  for (let f = 0; f < F; f++) {
    faceRatio[f] = ratioOfSlope(Math.sqrt(slope2[f]));
    drains[f] = faceDrain[f];
    indices[3 * f] = tri[3 * f];
    indices[3 * f + 1] = tri[3 * f + 1];
    indices[3 * f + 2] = tri[3 * f + 2];
  }
  return { positions, indices, faceRatio, faceDrain: drains };
}

/** The mesh as typed arrays, for a Web Worker to transfer. */
export function meshBuffers(roof: Roof, mesh: SurfaceMesh, slope2: Float64Array, faceDrain: Int32Array): MeshBuffers {
  const positions = planPositions(roof, mesh, new Float64Array(3 * mesh.vertexCount));
  const faceRatio = new Float64Array(mesh.faceCount);
  for (let f = 0; f < mesh.faceCount; f++) faceRatio[f] = ratioOfSlope(Math.sqrt(slope2[f]));
  return { positions, indices: mesh.tri.slice(), faceRatio, faceDrain: faceDrain.slice() };
}
