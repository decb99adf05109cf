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
  joists: { spacing: 0.4 },
  rainfall: { intensity: 100 },
  ruleSet: "common-practice",
};
