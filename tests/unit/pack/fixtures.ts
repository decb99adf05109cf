import { analyse, parseSpec, type RoofSpec } from "~/engine";
import type { PackRoof } from "~/lib/pack/facts";

/**
 * An invented U-shaped roof (12 m × 8 m with a 4 m × 5 m notch from the top), joists along x so
 * the joists above y = 3 m cross the notch and have two spans each; two outlets on the side walls.
 */
export const U_ROOF: RoofSpec = {
  outline: [
    [0, 0],
    [12, 0],
    [12, 8],
    [8, 8],
    [8, 3],
    [4, 3],
    [4, 8],
    [0, 8],
  ],
  outlets: [{ at: [0, 2] }, { at: [12, 6], level: -0.02 }],
  baseFall: "1:60",
  joists: { spacing: 0.5, direction: [1, 0], fromOutlets: true },
  rainfall: { intensity: 75 },
};

/** A name a spreadsheet would run as a formula, with commas and quotes. */
export const NASTY_NAME = `=HYPERLINK("http://x.invalid","click"), Annex "B", east`;

export function packOf(
  spec: RoofSpec,
  name = "Annex roof",
  date = new Date("2026-12-04T10:00:00Z"),
  mesh = false,
): PackRoof {
  const parsed = parseSpec(spec);
  if (!parsed.ok) throw new Error(parsed.error.message);
  return { name, date, spec: parsed.spec, analysis: analyse(parsed.spec, { mesh, traces: false }) };
}
