import { describe, expect, it } from "vitest";
import type { RoofSpec } from "~/engine";
import { changedFixedKeys } from "~/lib/lessons/grade";

const start: RoofSpec = {
  outline: [
    [0, 0],
    [12, 0],
    [12, 8],
    [0, 8],
  ],
  outlets: [{ at: [6, 0] }],
  baseFall: "1:60",
  openings: [
    {
      outline: [
        [5, 3],
        [7, 3],
        [7, 4.5],
        [5, 4.5],
      ],
      kind: "plant",
    },
  ],
};

describe("a task's openings are fixed unless editable", () => {
  it("counts deleting, moving or changing an opening as a change", () => {
    const fixed = { editable: ["outlets" as const] };
    expect(changedFixedKeys(fixed, start, { ...start, openings: undefined })).toContain("openings");
    expect(
      changedFixedKeys(fixed, start, {
        ...start,
        openings: [
          {
            outline: [
              [6, 3],
              [8, 3],
              [8, 4.5],
              [6, 4.5],
            ],
            kind: "plant",
          },
        ],
      }),
    ).toContain("openings");
    expect(
      changedFixedKeys(fixed, start, { ...start, openings: [{ ...start.openings![0], kind: "hatch" }] }),
    ).toContain("openings");
    expect(
      changedFixedKeys(fixed, start, { ...start, openings: [{ ...start.openings![0], upstand: 0.15 }] }),
    ).not.toContain("openings");
    expect(changedFixedKeys(fixed, start, { ...start, outlets: [{ at: [3, 0] }, { at: [9, 0] }] })).toEqual([]);
  });

  it("lets them change when the task says so", () => {
    expect(changedFixedKeys({ editable: ["openings" as const] }, start, { ...start, openings: undefined })).toEqual([]);
  });
});
