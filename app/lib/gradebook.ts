/** Gradebook shapes shared by the server (loaders, CSV) and the table in the browser. */
import type { NotPassedWhy } from "~/lib/lessons/grading-rule";

export type CellStatus = "passed" | "failed" | "not-attempted";

export interface GradeCell {
  /** The attempt the cell stands for: the best one by effective grade. */
  attemptId: string;
  score: number;
  passed: boolean;
  /** Why it did not pass, in words and as a kind (grading-rule.ts); null when passed. */
  reason?: string | null;
  why?: NotPassedWhy | null;
  /** The effective grade comes from a trainer's override, not the automatic grading. */
  overridden: boolean;
  attempts: number;
  submittedAt: string;
  /** The readable lesson version the cell's attempt was graded on (v1 is 1), when known. */
  versionNumber?: number | null;
}

export interface GradebookLesson {
  slug: string;
  title: string;
  dueOn: string | null;
}

export interface GradebookRow {
  traineeId: string;
  name: string;
  email: string;
  cells: Record<string, GradeCell | null>;
}

export interface Gradebook {
  lessons: GradebookLesson[];
  rows: GradebookRow[];
}

export function cellStatus(cell: GradeCell | null | undefined): CellStatus {
  if (!cell) return "not-attempted";
  return cell.passed ? "passed" : "failed";
}

export const STATUS_LABELS: Record<CellStatus, string> = {
  passed: "Passed",
  failed: "Not passed",
  "not-attempted": "Not attempted",
};

/** Scores are kept as floats; people read whole numbers (one decimal only when it matters). */
export function formatScore(score: number): string {
  const r = Math.round(score * 10) / 10;
  return Number.isInteger(r) ? String(r) : r.toFixed(1);
}

/** A trainer's review of an attempt, as reviewsForAttempt() gives it (newest first). */
export interface AttemptReview {
  id: string;
  reviewerName: string;
  comment: string;
  overrideScore: number | null;
  overridePassed: boolean | null;
  reason: string | null;
  at: string;
}
