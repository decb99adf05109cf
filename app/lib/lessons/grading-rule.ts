/**
 * The one grading rule, in words and in code (docs/grading.md). Every place that shows a grade
 * (result, attempts list, lesson page, gradebook, its CSV, e-mails) reads it through readGrade,
 * so a grade never contradicts itself ("100 / 100 Not passed" cannot appear).
 *
 * 1. Score: points earned over points available, 0-100, one decimal.
 * 2. A quiz left blank (no question answered) scores 0 and is Not passed, whatever the roof task
 *    earned: the task's points alone never make a grade. It shows as the failed required check
 *    BLANK_QUIZ_LABEL. Any other required check that fails means Not passed, and the score is
 *    capped just below the pass mark (pass mark − 1, never below 0), so the figure itself says
 *    "not passed".
 * 3. Otherwise a score below the pass mark is Not passed; at or above it, Passed.
 * 4. A trainer's override replaces score and result together, with a reason; its result must agree
 *    with its score and the pass mark (rule 3).
 */

export const GRADING_RULE_LINES = (passMark: number) => [
  `Your score is the points you earn out of the points available, from 0 to 100.`,
  `You pass at ${passMark} or more, if every required check is met.`,
  `A question left blank earns nothing, and a quiz left wholly blank scores 0, whatever the roof earns.`,
  `A required check that is not met means Not passed, whatever the points: the score is capped at ${cappedScore(100, passMark)}.`,
  `A trainer may change a grade with a reason; the new score and result follow the same pass mark.`,
];

/** The label of the required item a wholly blank quiz fails (grade.ts adds it; rule 2). */
export const BLANK_QUIZ_LABEL = "Answer the quiz";

/** The score that counts when a required check failed: just below the pass mark. */
export function cappedScore(raw: number, passMark: number): number {
  return Math.max(0, Math.min(raw, passMark - 1));
}

export interface GradeInput {
  /** The stored score (already capped for attempts graded since the rule). */
  score: number;
  passed: boolean;
  passMark: number;
  /** Labels of required checks that were not met. */
  failedRequired: string[];
  override?: { score: number; passed: boolean; reason?: string | null } | null;
}

export type NotPassedWhy = "required" | "below-pass-mark" | "trainer";

/** The few words a table cell shows for why an attempt did not pass. */
export const WHY_SHORT: Record<NotPassedWhy, string> = {
  required: "required check not met",
  "below-pass-mark": "below pass mark",
  trainer: "trainer's decision",
};

export interface GradeReading {
  score: number;
  passed: boolean;
  overridden: boolean;
  why: NotPassedWhy | null;
  /** Why it did not pass, said first, in words; null when it passed. */
  reason: string | null;
}

/**
 * Reads a grade by the rule. Attempts stored before the cap existed (a failed required check
 * beside a score at or above the pass mark) read capped here, so they agree with new ones.
 */
export function readGrade(g: GradeInput): GradeReading {
  if (g.override) {
    return {
      score: g.override.score,
      passed: g.override.passed,
      overridden: true,
      why: g.override.passed ? null : "trainer",
      reason: g.override.passed
        ? null
        : `Not passed by the trainer's decision${g.override.reason ? `: ${g.override.reason}` : ""}.`,
    };
  }
  if (g.failedRequired.includes(BLANK_QUIZ_LABEL)) {
    return {
      score: 0,
      passed: false,
      overridden: false,
      why: "required",
      reason: "No quiz question was answered. A blank quiz scores 0 and is Not passed, whatever the roof earns.",
    };
  }
  if (g.failedRequired.length) {
    const checks = g.failedRequired.map((l) => `“${l}”`).join(", ");
    return {
      score: cappedScore(g.score, g.passMark),
      passed: false,
      overridden: false,
      why: "required",
      reason: `A required check was not met: ${checks}. That means Not passed, and the score is capped at ${cappedScore(100, g.passMark)}.`,
    };
  }
  const passed = g.passed && g.score >= g.passMark;
  return {
    score: g.score,
    passed,
    overridden: false,
    why: passed ? null : "below-pass-mark",
    reason: passed ? null : `Below the pass mark of ${g.passMark}.`,
  };
}

/** Checks an override against the rule: the result must follow from the score and the pass mark. */
export function overrideProblem(o: { score: number; passed: boolean }, passMark: number): string | null {
  if (o.passed && o.score < passMark)
    return `A pass needs a score of at least ${passMark}, the pass mark; raise the score or choose Not passed.`;
  if (!o.passed && o.score >= passMark)
    return `A score of ${passMark} or more passes; lower it below ${passMark} or choose Passed.`;
  return null;
}

/** Labels of the required items an attempt did not meet (quiz or task). */
export function failedRequiredOf(result: {
  quiz: { required?: boolean; passed: boolean; label: string }[];
  task: { required?: boolean; passed: boolean; label: string }[];
}): string[] {
  return [...result.task, ...result.quiz].filter((i) => i.required && !i.passed).map((i) => i.label);
}
