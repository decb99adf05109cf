import { describe, expect, it } from "vitest";
import type { Analysis, RoofSpec } from "~/engine";
import { changedFixedKeys, gradeCriterion, gradeLesson, gradeQuestion, gradeTask } from "~/lib/lessons/grade";
import {
  criterionSchema,
  questionSchema,
  roofTaskSchema as taskSchema,
  type Criterion,
  type Question,
} from "~/lib/lessons/schema";

const q = (raw: object): Question => questionSchema.parse(raw);
const c = (raw: object): Criterion => criterionSchema.parse(raw);

describe("numeric answers through mathjs units", () => {
  const length = q({ id: "q1", kind: "numeric", prompt: "How far?", answer: "250 mm", tolerance: "1 mm" });

  it.each(["250 mm", "0.25 m", "0.25m", "25 cm", "250mm", " 250 mm ", "0.250 m"])("counts %s as 250 mm", (given) => {
    const r = gradeQuestion(length, given);
    expect(r.passed, r.feedback).toBe(true);
    expect(r.score).toBe(1);
  });

  it("counts feet, inches and fractions of an inch (1 in = 25.4 mm exactly, NIST SP 811)", () => {
    // 250 mm = 9.843 in; 9 13/16 in = 249.2 mm and 9 7/8 in = 250.8 mm are both within 1 mm.
    for (const given of ["9 13/16 in", '9 7/8"', "9.843 in", "0.8202 ft"])
      expect(gradeQuestion(length, given).passed, given).toBe(true);
    expect(gradeQuestion(length, '10"').passed).toBe(false); // 254 mm
    const long = q({ id: "q2", kind: "numeric", prompt: "How long?", answer: "3.81 m", tolerance: "5 mm" });
    for (const given of [`12' 6"`, "12 ft 6 in", "12.5 ft"])
      expect(gradeQuestion(long, given).passed, given).toBe(true);
    expect(gradeQuestion(long, `12' 7"`).passed).toBe(false);
  });

  it("refuses an answer of the wrong kind of unit and says what was asked for", () => {
    const r = gradeQuestion(length, "250 kg");
    expect(r.passed).toBe(false);
    expect(r.feedback).toMatch(/a mass/);
    expect(r.feedback).toMatch(/a length/);
    expect(gradeQuestion(length, "250 L/s").feedback).toMatch(/a flow/);
    expect(gradeQuestion(length, "2.5 %").passed).toBe(false);
  });

  it("asks for a unit when a bare number is given, unless the question names one", () => {
    const r = gradeQuestion(length, "250");
    expect(r.passed).toBe(false);
    expect(r.feedback).toMatch(/no unit/);
    const withBare = q({
      id: "q1",
      kind: "numeric",
      prompt: "How far?",
      answer: "250 mm",
      tolerance: "1 mm",
      bareUnit: "mm",
    });
    expect(gradeQuestion(withBare, "250").passed).toBe(true);
    expect(gradeQuestion(withBare, "0.25").passed).toBe(false);
  });

  it("passes exactly at the tolerance and fails just beyond it", () => {
    expect(gradeQuestion(length, "251 mm").passed).toBe(true);
    expect(gradeQuestion(length, "249 mm").passed).toBe(true);
    expect(gradeQuestion(length, "0.251 m").passed).toBe(true);
    expect(gradeQuestion(length, "251.01 mm").passed).toBe(false);
    expect(gradeQuestion(length, "248.99 mm").passed).toBe(false);
  });

  it("uses a relative tolerance of 1 % when none is given", () => {
    const flow = q({ id: "f", kind: "numeric", prompt: "Flow?", answer: "5 L/s" });
    expect(gradeQuestion(flow, "5.05 L/s").passed).toBe(true);
    expect(gradeQuestion(flow, "4.95 l/s").passed).toBe(true);
    expect(gradeQuestion(flow, "5.06 L/s").passed).toBe(false);
    expect(gradeQuestion(flow, "0.005 m^3/s").passed).toBe(true);
    expect(gradeQuestion(flow, "5 m^3/s").passed).toBe(false);
  });

  it("reads percent, millimetres per metre and degrees as falls", () => {
    const pct = q({ id: "p", kind: "numeric", prompt: "In %?", answer: "2.5 %", tolerance: "0.01 %" });
    for (const given of ["2.5 %", "2.5%", "25 mm/m", "0.025 m/m"])
      expect(gradeQuestion(pct, given).passed, given).toBe(true);
    expect(gradeQuestion(pct, "2.5 mm").passed).toBe(false);
    const deg = q({ id: "d", kind: "numeric", prompt: "Angle?", answer: "1.43 deg", tolerance: "0.01 deg" });
    for (const given of ["1.43°", "1.43 deg", "1.43 degrees", "0.02496 rad"])
      expect(gradeQuestion(deg, given).passed, given).toBe(true);
    expect(gradeQuestion(deg, "1.43 %").feedback).toMatch(/an angle/);
  });

  it("reads areas and loads with their units", () => {
    const area = q({ id: "a", kind: "numeric", prompt: "Area?", answer: "40 m^2", tolerance: "0.5 m^2" });
    for (const given of ["40 m²", "40 m2", "40 m^2", "400000 cm^2"])
      expect(gradeQuestion(area, given).passed, given).toBe(true);
    const load = q({ id: "l", kind: "numeric", prompt: "Load?", answer: "0.49 kN/m^2", tolerance: "0.01 kN/m^2" });
    expect(gradeQuestion(load, "490 Pa").passed).toBe(true);
    expect(gradeQuestion(load, "0.49 kN").passed).toBe(false);
  });

  it("marks empty, malformed and absurd input as wrong without throwing", () => {
    for (const given of [undefined, "", "   ", "abc", "mm", "1e400 mm", "250 mm mm", "x".repeat(500), "NaN mm"]) {
      const r = gradeQuestion(length, given);
      expect(r.passed, String(given)).toBe(false);
      expect(r.score).toBe(0);
    }
  });
});

describe("ratio answers", () => {
  const ratio = q({ id: "r", kind: "ratio", prompt: "As 1:N?", answer: "1:40" });
  it.each(["1:40", "1 : 40", "1 in 40", "1/40", "2:80", "1:40.3"])("counts %s as 1:40", (given) => {
    expect(gradeQuestion(ratio, given).passed).toBe(true);
  });
  it("counts the US roofers' forms of the same fall: 1/4:12 and 1/4 in per ft are 1:48 (IBC 2018 1507.10.1)", () => {
    const us = q({ id: "r", kind: "ratio", prompt: "As 1:N?", answer: "1:48" });
    for (const given of ["1/4:12", "1/4 in/ft", "1/4 in per ft", '1/4" per ft'])
      expect(gradeQuestion(us, given).passed, given).toBe(true);
    expect(gradeQuestion(us, "1/8:12").passed).toBe(false); // 1:96
    expect(gradeQuestion(us, "1/4:12").measured).toBe("1:48");
  });
  it("refuses other forms and wrong ratios", () => {
    expect(gradeQuestion(ratio, "40").passed).toBe(false);
    expect(gradeQuestion(ratio, "2.5%").feedback).toMatch(/ratio/);
    expect(gradeQuestion(ratio, "1:41").passed).toBe(false);
    expect(gradeQuestion(ratio, "1:0").passed).toBe(false);
  });
  it("passes at the tolerance on N and fails beyond it", () => {
    const t = q({ id: "r", kind: "ratio", prompt: "?", answer: "1:116.7", tolerance: 1 });
    expect(gradeQuestion(t, "1:117.7").passed).toBe(true);
    expect(gradeQuestion(t, "1:115.7").passed).toBe(true);
    expect(gradeQuestion(t, "1:117.8").passed).toBe(false);
  });
});

describe("multiple choice", () => {
  const one = q({
    id: "m",
    kind: "choice",
    prompt: "?",
    options: [
      { id: "a", text: "A" },
      { id: "b", text: "B" },
    ],
    correct: "b",
  });
  const many = q({
    id: "n",
    kind: "choice",
    prompt: "?",
    options: [
      { id: "a", text: "A" },
      { id: "b", text: "B" },
      { id: "c", text: "C" },
    ],
    correct: ["a", "c"],
  });
  it("grades a single answer", () => {
    expect(gradeQuestion(one, "b").passed).toBe(true);
    expect(gradeQuestion(one, ["b"]).passed).toBe(true);
    expect(gradeQuestion(one, "a").passed).toBe(false);
    expect(gradeQuestion(one, undefined).feedback).toMatch(/No answer/);
  });
  it("needs exactly the right set when several are correct", () => {
    expect(gradeQuestion(many, ["c", "a"]).passed).toBe(true);
    expect(gradeQuestion(many, ["a"]).passed).toBe(false);
    expect(gradeQuestion(many, ["a", "b", "c"]).passed).toBe(false);
    expect(gradeQuestion(many, "zzz").passed).toBe(false);
  });
});

/** A stand-in for the engine's output with just the fields a criterion reads. */
function fakeAnalysis(over: {
  longest?: number | null;
  worst?: number | null;
  highLevel?: number;
  saved?: number | null;
  ponding?: { at: [number, number]; area: number; level: number }[];
  flat?: number;
  area?: number;
  catchments?: { kind: "outlet" | "eaves"; area: number; flow: number }[];
  edgeFalls?: number[];
  warnings?: string[];
}): Analysis {
  const line = (r: number | null | undefined) =>
    r == null ? null : { from: [0, 0], to: [1, 1], length: 10, drop: 10 / r, ratio: r, path: [], drain: "outlet-0" };
  return {
    shaped: {
      highLevel: over.highLevel ?? 0.1,
      longestFallLine: line(over.longest === undefined ? 80 : over.longest),
      worstFallRatio: over.worst === undefined ? 80 : over.worst,
      edgeFalls: (over.edgeFalls ?? [60]).map((ratio, edge) => ({ edge, from: [0, 0], to: [1, 0], ratio })),
      ponding: over.ponding ?? [],
      fallMap: { faces: 1, areaByBand: [], flatterThanMinimumArea: over.flat ?? 0, area: over.area ?? 100 },
      catchments: (over.catchments ?? []).map((x, i) => ({
        drain: `outlet-${i}`,
        kind: x.kind,
        index: i,
        label: `Outlet ${i + 1}`,
        area: x.area,
        flow: x.flow,
      })),
    },
    comparison: { heightSaved: over.saved === undefined ? 0.1 : over.saved, flattestFall: { gutter: 100, shaped: 80 } },
    gutter: {
      comparable: over.saved !== null,
      reason: over.saved === null ? "outlets on non-parallel edges" : undefined,
    },
    warnings: (over.warnings ?? []).map((code) => ({ code, message: code })),
    rainfall: { intensity: 100, assumed: false },
    area: over.area ?? 100,
  } as unknown as Analysis;
}

const spec = (outlets: number, edges?: ("parapet" | "eaves")[]): RoofSpec => ({
  outline: [
    [0, 0],
    [10, 0],
    [10, 10],
    [0, 10],
  ],
  edges,
  outlets: Array.from({ length: outlets }, (_, i) => ({ at: [i + 1, 0] as [number, number] })),
  baseFall: "1:60",
});

describe("criteria over the engine's outputs (each kind, boundaries at the limit)", () => {
  const grade = (crit: object, a: Analysis, s: RoofSpec = spec(1)) => gradeCriterion(c({ id: "c", ...crit }), a, s);

  it("longestFallRatioAtMost: no flatter than 1:N, exactly 1:N passes", () => {
    expect(grade({ kind: "longestFallRatioAtMost", value: "1:100" }, fakeAnalysis({ longest: 100 })).passed).toBe(true);
    expect(
      grade({ kind: "longestFallRatioAtMost", value: "1:100" }, fakeAnalysis({ longest: 100 + 1e-12 })).passed,
    ).toBe(true);
    expect(grade({ kind: "longestFallRatioAtMost", value: "1:100" }, fakeAnalysis({ longest: 100.01 })).passed).toBe(
      false,
    );
    expect(grade({ kind: "longestFallRatioAtMost", value: "1:100" }, fakeAnalysis({ longest: 60 })).passed).toBe(true);
    const none = grade({ kind: "longestFallRatioAtMost", value: "1:100" }, fakeAnalysis({ longest: null }));
    expect(none.passed).toBe(false);
    expect(none.feedback).toMatch(/no fall line/);
  });

  it("worstFallRatioAtMost and edgeFallRatioAtMost", () => {
    expect(grade({ kind: "worstFallRatioAtMost", value: "1:80" }, fakeAnalysis({ worst: 80 })).passed).toBe(true);
    expect(grade({ kind: "worstFallRatioAtMost", value: "1:80" }, fakeAnalysis({ worst: 80.5 })).passed).toBe(false);
    expect(grade({ kind: "edgeFallRatioAtMost", value: "1:60" }, fakeAnalysis({ edgeFalls: [30, 60] })).passed).toBe(
      true,
    );
    expect(grade({ kind: "edgeFallRatioAtMost", value: "1:60" }, fakeAnalysis({ edgeFalls: [30, 61] })).passed).toBe(
      false,
    );
  });

  it("highLevelAtMost reads the limit in any length unit; exactly at the limit passes", () => {
    for (const value of ["90 mm", "0.09 m", "9 cm", 0.09]) {
      expect(grade({ kind: "highLevelAtMost", value }, fakeAnalysis({ highLevel: 0.09 })).passed, String(value)).toBe(
        true,
      );
      expect(grade({ kind: "highLevelAtMost", value }, fakeAnalysis({ highLevel: 0.0901 })).passed, String(value)).toBe(
        false,
      );
    }
    const r = grade({ kind: "highLevelAtMost", value: "90 mm" }, fakeAnalysis({ highLevel: 0.12 }));
    expect(r.measured).toBe("120 mm");
    expect(r.feedback).toMatch(/^Measured: 120 mm\. Needed: high level \(height budget\) at most 90 mm\./);
  });

  it("heightSavedAtLeast: at least the limit; no comparison fails with the reason", () => {
    expect(grade({ kind: "heightSavedAtLeast", value: "100 mm" }, fakeAnalysis({ saved: 0.1 })).passed).toBe(true);
    expect(grade({ kind: "heightSavedAtLeast", value: "100 mm" }, fakeAnalysis({ saved: 0.0999 })).passed).toBe(false);
    const r = grade({ kind: "heightSavedAtLeast", value: "100 mm" }, fakeAnalysis({ saved: null }));
    expect(r.passed).toBe(false);
    expect(r.feedback).toMatch(/non-parallel/);
  });

  it("noPonding and noTwist", () => {
    expect(grade({ kind: "noPonding" }, fakeAnalysis({})).passed).toBe(true);
    const wet = grade({ kind: "noPonding" }, fakeAnalysis({ ponding: [{ at: [1, 1], area: 2.5, level: 0.1 }] }));
    expect(wet.passed).toBe(false);
    expect(wet.measured).toMatch(/1 ponding place, 2.50 m²/);
    expect(grade({ kind: "noTwist" }, fakeAnalysis({ warnings: ["ponding"] })).passed).toBe(true);
    expect(grade({ kind: "noTwist" }, fakeAnalysis({ warnings: ["twist"] })).passed).toBe(false);
  });

  it("maxOutlets, minOutlets and minEavesEdges count the submitted spec", () => {
    const a = fakeAnalysis({});
    expect(grade({ kind: "maxOutlets", value: 2 }, a, spec(2)).passed).toBe(true);
    expect(grade({ kind: "maxOutlets", value: 2 }, a, spec(3)).passed).toBe(false);
    expect(grade({ kind: "minOutlets", value: 2 }, a, spec(2)).passed).toBe(true);
    expect(grade({ kind: "minOutlets", value: 2 }, a, spec(1)).passed).toBe(false);
    expect(
      grade({ kind: "minEavesEdges", value: 1 }, a, spec(0, ["parapet", "eaves", "parapet", "parapet"])).passed,
    ).toBe(true);
    expect(grade({ kind: "minEavesEdges", value: 1 }, a, spec(0)).passed).toBe(false);
  });

  it("flatAreaAtMost (m²) and flatShareAtMost (%)", () => {
    expect(grade({ kind: "flatAreaAtMost", value: "10 m^2" }, fakeAnalysis({ flat: 10 })).passed).toBe(true);
    expect(grade({ kind: "flatAreaAtMost", value: 10 }, fakeAnalysis({ flat: 10.01 })).passed).toBe(false);
    expect(grade({ kind: "flatShareAtMost", value: 30 }, fakeAnalysis({ flat: 30, area: 100 })).passed).toBe(true);
    expect(grade({ kind: "flatShareAtMost", value: 30 }, fakeAnalysis({ flat: 31, area: 100 })).passed).toBe(false);
  });

  it("catchmentFlowAtMost (L/s) and catchmentAreaAtMost look at the busiest outlet only", () => {
    const a = fakeAnalysis({
      catchments: [
        { kind: "outlet", area: 60, flow: 2.5 },
        { kind: "outlet", area: 70, flow: 2.8 },
        { kind: "eaves", area: 200, flow: 9 },
      ],
    });
    expect(grade({ kind: "catchmentFlowAtMost", value: "2.8 L/s" }, a).passed).toBe(true);
    expect(grade({ kind: "catchmentFlowAtMost", value: "2.79 L/s" }, a).passed).toBe(false);
    expect(grade({ kind: "catchmentFlowAtMost", value: "0.0028 m^3/s" }, a).passed).toBe(true);
    expect(grade({ kind: "catchmentAreaAtMost", value: "70 m^2" }, a).passed).toBe(true);
    expect(grade({ kind: "catchmentAreaAtMost", value: "69 m^2" }, a).passed).toBe(false);
  });

  it("refuses limits of the wrong kind when the lesson is read", () => {
    expect(criterionSchema.safeParse({ id: "c", kind: "highLevelAtMost", value: "2 L/s" }).success).toBe(false);
    expect(criterionSchema.safeParse({ id: "c", kind: "longestFallRatioAtMost", value: 100 }).success).toBe(false);
    expect(criterionSchema.safeParse({ id: "c", kind: "maxOutlets", value: 1.5 }).success).toBe(false);
    expect(criterionSchema.safeParse({ id: "c", kind: "flatShareAtMost", value: 120 }).success).toBe(false);
  });
});

describe("roof tasks graded by running the engine again", () => {
  const task = taskSchema.parse({
    title: "Move the outlet",
    goal: "Move it.",
    start: {
      outline: [
        [0, 0],
        [18, 0],
        [18, 9],
        [0, 9],
      ],
      outlets: [{ at: [0, 0] }],
      baseFall: "1:60",
      joists: { direction: [0, 1] },
    },
    reference: {
      outline: [
        [0, 0],
        [18, 0],
        [18, 9],
        [0, 9],
      ],
      outlets: [{ at: [9, 0] }],
      baseFall: "1:60",
      joists: { direction: [0, 1] },
    },
    editable: ["outlets"],
    criteria: [
      { id: "fall", kind: "longestFallRatioAtMost", value: "1:100", weight: 3 },
      { id: "one", kind: "maxOutlets", value: 1, required: true },
    ],
    hints: ["Middle of the front edge."],
  });

  // Hand check (docs/roof-method.md §3, §7): H = 9 m / 60 = 150 mm; corner outlet → far corner 20.12 m → 1:134.2;
  // mid outlet → sqrt(9² + 9²) = 12.73 m → 1:84.9.
  it("fails the starting roof and passes the moved outlet, with measured figures", () => {
    const start = gradeTask(task, task.start);
    if (!start.ok) throw new Error(start.message);
    expect(start.items.find((i) => i.id === "fall")).toMatchObject({
      passed: false,
      measured: expect.stringMatching(/^1:134\.2 over 20\.1 m/),
    });
    const moved = gradeTask(task, task.reference);
    if (!moved.ok) throw new Error(moved.message);
    expect(moved.items.find((i) => i.id === "fall")).toMatchObject({
      passed: true,
      measured: expect.stringMatching(/^1:84\.9/),
    });
  });

  it("fails a required check when the trainee changes what the task fixes", () => {
    const cheat = { ...(task.reference as object), baseFall: "1:20" };
    const r = gradeTask(task, cheat);
    if (!r.ok) throw new Error(r.message);
    // The fixed-parts check is required and weighs 0 points (its effect on the grade: grading-rule.test.ts).
    const fixed = r.items.find((i) => i.id === "fixed");
    expect(fixed).toMatchObject({ passed: false, required: true, weight: 0 });
    expect(fixed!.feedback).toMatch(/base fall/);
  });

  it("does not count written-out defaults as changes", () => {
    const start = task.start as RoofSpec;
    const same: RoofSpec = {
      ...start,
      edges: ["parapet", "parapet", "parapet", "parapet"],
      joists: { spacing: 0.4, offset: 0, direction: [0, 2] },
      minFall: "1%",
      outline: [...start.outline, start.outline[0]],
    };
    expect(changedFixedKeys(task, start, same)).toEqual([]);
    expect(changedFixedKeys(task, start, { ...start, rainfall: { intensity: 10 } })).toEqual(["rainfall"]);
    expect(changedFixedKeys(task, start, { ...start, outlets: [{ at: [9, 0], level: -0.5 }] })).toEqual([
      "outlet levels",
    ]);
  });

  it("answers 400/422 for a spec the engine refuses, and never throws", () => {
    const bad = gradeTask(task, { outline: "nope" });
    expect(bad).toMatchObject({ ok: false, status: 400 });
    const crossing = gradeTask(task, {
      outline: [
        [0, 0],
        [10, 10],
        [10, 0],
        [0, 10],
      ],
      outlets: [],
      baseFall: "1:60",
    });
    expect(crossing).toMatchObject({ ok: false, status: 422 });
    for (const junk of [
      null,
      42,
      "x",
      [],
      {
        outline: [
          [0, 0],
          [1, 0],
          [0, 1],
        ],
        outlets: [{ at: [50, 50] }],
        baseFall: "1:60",
      },
    ]) {
      const r = gradeTask(task, junk);
      expect(r.ok).toBe(false);
    }
  });

  // What a failed required item or the pass mark does to the grade is tested once, in grading-rule.test.ts.
  it("totals quiz and task 0-100 by weight", () => {
    const lesson = {
      passMark: 70,
      quiz: [q({ id: "q1", kind: "numeric", prompt: "?", answer: "150 mm", tolerance: "1 mm" })],
      task,
    };
    const pass = gradeLesson(lesson, { q1: "0.15 m" }, task.reference);
    expect(pass).toMatchObject({ score: 100, passed: true });
    // Quiz right (1) + fall line failed (0 of 3) + one outlet (1): 2 of 5 = 40.
    const fail = gradeLesson(lesson, { q1: "150 mm" }, task.start);
    expect(fail).toMatchObject({ score: 40, passed: false });
    // Quiz wrong (0) + fall (3) + outlets (0) = 3 of 5 = 60.
    const twoOutlets = { ...(task.reference as object), outlets: [{ at: [6, 0] }, { at: [12, 0] }] };
    const req = gradeLesson(lesson, { q1: "1 m" }, twoOutlets);
    expect(req).toMatchObject({ score: 60, passed: false });
  });
});
