import type { RoofSpec } from "~/engine";

/** The sandbox's opening roof: an invented 12 m × 8 m deck inside parapets, one outlet mid-way on a long edge. */
export const DEMO_ROOF: RoofSpec = {
  outline: [
    [0, 0],
    [12, 0],
    [12, 8],
    [0, 8],
  ],
  edges: ["parapet", "parapet", "parapet", "parapet"],
  outlets: [{ at: [6, 0] }],
  baseFall: "2°",
  // New roofs start from this one, so they set their joists out from the outlets by default.
  joists: { spacing: 0.4, fromOutlets: true },
  rainfall: { intensity: 100 },
  ruleSet: "common-practice",
};
