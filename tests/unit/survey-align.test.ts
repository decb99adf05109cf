import { describe, expect, it } from "vitest";
import { alignSurvey, referenceSchema } from "~/lib/survey-align";
import { checkAccess } from "~/lib/permissions";

describe("placing a survey on the roof by two reference points", () => {
  // The roof's corners (0, 0), (12, 0), (12, 8) and a point at (3, 2). The survey was taken in
  // the surveyor's own axes: the roof turned 30° anticlockwise and moved by (100, 50), so its
  // point p reads R(30°)·p + (100, 50). By trigonometry: cos 30° = √3/2, sin 30° = 1/2.
  const c = Math.sqrt(3) / 2,
    s = 0.5;
  const survey = (p: [number, number]): [number, number] => [100 + c * p[0] - s * p[1], 50 + s * p[0] + c * p[1]];
  const roofPoints: { at: [number, number]; level: number; label: string }[] = [
    { at: [0, 0], level: 0.1, label: "NW" },
    { at: [12, 0], level: 0.12, label: "NE" },
    { at: [12, 8], level: 0.09, label: "SE" },
    { at: [3, 2], level: 0.04, label: "P1" },
  ];
  const surveyed = roofPoints.map((p) => ({ ...p, at: survey(p.at) }));

  it("turns and moves the survey so the two named points land where picked; levels unchanged", () => {
    const ref = referenceSchema.parse({
      align: "points",
      refA: "NW",
      refAx: "0",
      refAy: "0",
      refB: "NE",
      refBx: "12",
      refBy: "0",
    });
    const r = alignSurvey(surveyed, ref);
    if (!r.ok) throw new Error(r.message);
    r.points.forEach((p, i) => {
      expect(p.at[0]).toBeCloseTo(roofPoints[i].at[0], 9);
      expect(p.at[1]).toBeCloseTo(roofPoints[i].at[1], 9);
      expect(p.level).toBe(roofPoints[i].level);
      expect(p.label).toBe(roofPoints[i].label);
    });
    expect(r.rotation).toBeCloseTo(-Math.PI / 6, 9);
  });

  it("in the roof's own coordinates, points are kept as they are", () => {
    const r = alignSurvey(roofPoints, referenceSchema.parse({}));
    expect(r.ok && r.points.map((p) => p.at)).toEqual(roofPoints.map((p) => p.at));
  });

  it("refuses a name not in the file and reference points whose spacing disagrees with the plan, naming the field", () => {
    const base = { align: "points", refA: "NW", refAx: "0", refAy: "0", refB: "NE", refBx: "12", refBy: "0" };
    const missing = alignSurvey(surveyed, referenceSchema.parse({ ...base, refB: "X9" }));
    expect(missing).toEqual({ ok: false, field: "refB", message: 'No point labelled "X9" in the file.' });
    // NW to SE is 14.42 m in the survey; picked 12 m apart on the plan.
    const wrong = alignSurvey(surveyed, referenceSchema.parse({ ...base, refB: "SE" }));
    expect(wrong.ok).toBe(false);
    if (!wrong.ok) expect(wrong.message).toContain("14.422 m apart in the survey but 12.000 m apart on the plan");
    expect(referenceSchema.safeParse({ ...base, refAx: "east" }).success).toBe(false);
  });
});

describe("who reads and adds as-built checks", () => {
  it("follows the roof: read with it, added by whoever may edit it", () => {
    expect(checkAccess(null)).toEqual({ read: false, create: false });
    expect(checkAccess({ canEdit: false })).toEqual({ read: true, create: false });
    expect(checkAccess({ canEdit: true })).toEqual({ read: true, create: true });
  });
});
