import { describe, expect, it } from "vitest";
import { CHANGED_LIVE, describeRoof, liveCaption, liveRoofKey, sameRoof } from "~/lib/live-caption";

// Issue 16 item 6: after a trainer's edit the caption said "The same roof at 1:68" above "Base fall 1:40".
const ROOF = {
  outline: [
    [0, 0],
    [18, 0],
    [18, 9],
    [0, 9],
  ],
  outlets: [{ at: [9, 0] }],
  baseFall: "1:68",
};
const STEP = { caption: "The same roof at 1:68", spec: ROOF };

describe("live caption", () => {
  it("keeps the step's caption while the roof on screen is the step's roof, whatever the key order", () => {
    const reordered = { baseFall: "1:68", outlets: [{ at: [9, 0] }], outline: ROOF.outline };
    expect(liveCaption(STEP, reordered)).toEqual({ title: "The same roof at 1:68", changed: false });
  });

  it("describes the shown roof once the trainer changes it, never the step's old figures", () => {
    const edited = { ...ROOF, baseFall: "1:40" };
    const caption = liveCaption(STEP, edited);
    expect(caption.changed).toBe(true);
    expect(caption.title).toBe("Changed live: 18 × 9 m plan, one outlet, base fall 1:40");
    expect(caption.title).not.toContain("1:68");
  });

  it("a moved outlet is a different roof; a roof with no base to compare with is described", () => {
    expect(sameRoof(ROOF, { ...ROOF, outlets: [{ at: [4, 0] }] })).toBe(false);
    expect(liveCaption(null, ROOF).title).toBe("Changed live: 18 × 9 m plan, one outlet, base fall 1:68");
    expect(describeRoof({ ...ROOF, outlets: [{ at: [1, 0] }, { at: [17, 0] }] })).toContain("2 outlets");
    expect(describeRoof(null)).toBe("a roof");
  });
});

describe("which roof of the trainer's is live", () => {
  it("stays the same while the trainer edits a step's roof, and changes with the step or a roof handed up", () => {
    const step = { deck: "lesson:falls", step: { index: 1 }, source: "1. Reading falls" };
    const edited = { ...step, source: `1. Reading falls${CHANGED_LIVE}` };
    expect(liveRoofKey(edited)).toBe(liveRoofKey(step));
    expect(liveRoofKey({ ...step, step: { index: 2 } })).not.toBe(liveRoofKey(step));
    const tess = { deck: "lesson:falls", step: null, source: "Hands up · Tess" };
    expect(liveRoofKey(tess)).not.toBe(liveRoofKey(step));
    expect(liveRoofKey({ ...tess, source: `Hands up · Tess${CHANGED_LIVE}` })).toBe(liveRoofKey(tess));
    expect(liveRoofKey({ ...tess, source: "Hands up · Marco" })).not.toBe(liveRoofKey(tess));
  });
});
