/**
 * A plan image drawn under the outline to trace over. Pixel (0, 0), the image's top-left corner,
 * sits at plan point (originX, originY) in metres; the image runs +x to the right and −y downward
 * (plan y points up), `metresPerPixel` metres per image pixel.
 */
export interface Underlay {
  url: string;
  /** 0..1 */
  opacity: number;
  originX: number;
  originY: number;
  metresPerPixel: number;
  widthPx: number;
  heightPx: number;
}

export function underlayBounds(u: Underlay) {
  return {
    minX: u.originX,
    maxX: u.originX + u.widthPx * u.metresPerPixel,
    minY: u.originY - u.heightPx * u.metresPerPixel,
    maxY: u.originY,
  };
}
