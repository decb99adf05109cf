/**
 * What an uploaded plan image really is, read from its bytes (never from its name or the type the
 * browser claims): file-type's magic-number check, then the pixel size from the format's header.
 */
import { fileTypeFromBuffer } from "file-type";

export const UNDERLAY_TYPES = { "image/png": "png", "image/jpeg": "jpg", "image/webp": "webp" } as const;
export type UnderlayType = keyof typeof UNDERLAY_TYPES;
export const MAX_SIDE_PX = 20_000;
export { UNDERLAY_MAX_BYTES } from "~/lib/underlay";
/**
 * Memory an underlay may take once decoded: every browser that opens the roof decodes it to
 * 4 bytes a pixel (RGBA). A small file can declare a huge image (a decompression bomb), so the
 * declared size is checked against this before the file is kept: 256 MiB is 67,108,864 px,
 * e.g. 8192 × 8192, well above an A1 plan scanned at 200 dpi (about 4,700 × 6,600).
 */
export const DECODE_BUDGET_BYTES = 256 * 1024 * 1024;
export const BYTES_PER_PIXEL = 4;
export const MAX_PIXELS = DECODE_BUDGET_BYTES / BYTES_PER_PIXEL;

const MB = (bytes: number) => `${Math.round(bytes / 1024 / 1024).toLocaleString("en-GB")} MB`;

export type SniffResult =
  | { ok: true; mime: UnderlayType; ext: string; widthPx: number; heightPx: number }
  | { ok: false; status: 415 | 422; message: string };

export async function sniffUnderlay(bytes: Uint8Array): Promise<SniffResult> {
  const found = await fileTypeFromBuffer(bytes);
  if (!found || !(found.mime in UNDERLAY_TYPES)) {
    return {
      ok: false,
      status: 415,
      message: "Only PNG, JPEG or WebP images can be used as an underlay (the file's contents are something else).",
    };
  }
  const mime = found.mime as UnderlayType;
  const size = imageSize(bytes, mime);
  if (!size) return { ok: false, status: 422, message: "The image header could not be read; the file may be damaged." };
  if (size.width > MAX_SIDE_PX || size.height > MAX_SIDE_PX) {
    return {
      ok: false,
      status: 422,
      message: `The image is ${size.width} × ${size.height} px; at most ${MAX_SIDE_PX} px a side.`,
    };
  }
  const pixels = size.width * size.height;
  if (pixels > MAX_PIXELS) {
    return {
      ok: false,
      status: 422,
      message:
        `The image is ${size.width} × ${size.height} px: decoded, it would need about ${MB(pixels * BYTES_PER_PIXEL)} of memory, ` +
        `over the ${MB(DECODE_BUDGET_BYTES)} budget for an underlay (at most ${MAX_PIXELS.toLocaleString("en-GB")} pixels, e.g. 8192 × 8192). Export the plan at a lower resolution.`,
    };
  }
  return { ok: true, mime, ext: UNDERLAY_TYPES[mime], widthPx: size.width, heightPx: size.height };
}

/** Header layouts: PNG IHDR chunk (W3C PNG specification), JPEG SOFn (ITU-T T.81 B.2.2), WebP (RFC 9649 §2.5-2.7). */
function imageSize(b: Uint8Array, mime: UnderlayType): { width: number; height: number } | null {
  const v = new DataView(b.buffer, b.byteOffset, b.byteLength);
  const ok = (s: { width: number; height: number }) => (s.width > 0 && s.height > 0 ? s : null);
  try {
    if (mime === "image/png") return ok({ width: v.getUint32(16), height: v.getUint32(20) }); // IHDR
    if (mime === "image/webp") return webpSize(b, v);
    // JPEG: walk the markers to the first start-of-frame (SOF0..SOF15 except DHT, JPG, DAC).
    let at = 2;
    while (at + 9 < b.length) {
      if (b[at] !== 0xff) return null;
      const marker = b[at + 1];
      if (marker === 0xff) {
        at++;
        continue;
      }
      const length = v.getUint16(at + 2);
      if (marker >= 0xc0 && marker <= 0xcf && marker !== 0xc4 && marker !== 0xc8 && marker !== 0xcc) {
        return ok({ height: v.getUint16(at + 5), width: v.getUint16(at + 7) });
      }
      at += 2 + length;
    }
    return null;
  } catch {
    return null;
  }
}

function webpSize(b: Uint8Array, v: DataView) {
  const chunk = String.fromCharCode(b[12], b[13], b[14], b[15]);
  if (chunk === "VP8 ") return { width: v.getUint16(26, true) & 0x3fff, height: v.getUint16(28, true) & 0x3fff };
  if (chunk === "VP8L") {
    const bits = v.getUint32(21, true);
    return { width: (bits & 0x3fff) + 1, height: ((bits >> 14) & 0x3fff) + 1 };
  }
  if (chunk === "VP8X") {
    const w = 1 + (b[24] | (b[25] << 8) | (b[26] << 16));
    const h = 1 + (b[27] | (b[28] << 8) | (b[29] << 16));
    return { width: w, height: h };
  }
  return null;
}
