import Papa from "papaparse";
import { classAssignments, classRoster, type ClassRow } from "~/lib/classes.server";
import { bestGrades, cellKey } from "~/lib/grades.server";
import { cellStatus, formatScore, STATUS_LABELS, type Gradebook } from "~/lib/gradebook";

/** Trainees of the class as rows, its assigned lessons as columns, each cell the best effective grade. */
export async function classGradebook(cls: Pick<ClassRow, "id" | "trainer_id" | "organisation_id">): Promise<Gradebook> {
  const [roster, assignments] = await Promise.all([classRoster(cls.id), classAssignments(cls.id)]);
  const lessons = assignments.map((a) => ({ slug: a.lesson_slug, title: a.title, dueOn: a.due_on }));
  const grades = await bestGrades(
    roster.map((m) => m.id),
    lessons.map((l) => l.slug),
    { trainerId: cls.trainer_id, organisationId: cls.organisation_id },
  );
  return {
    lessons,
    rows: roster.map((m) => ({
      traineeId: m.id,
      name: m.name,
      email: m.email,
      cells: Object.fromEntries(lessons.map((l) => [l.slug, grades.get(cellKey(m.id, l.slug)) ?? null])),
    })),
  };
}

/**
 * The gradebook as CSV: per lesson a score column and a result column, the grade that counts
 * (an override when a trainer made one). Cells that a spreadsheet would run as a formula are escaped.
 */
export function gradebookCsv(book: Gradebook): string {
  const fields = ["Trainee", "E-mail", ...book.lessons.flatMap((l) => [`${l.title} (score)`, `${l.title} (result)`])];
  const data = book.rows.map((r) => [
    r.name,
    r.email,
    ...book.lessons.flatMap((l) => {
      const cell = r.cells[l.slug];
      const label = STATUS_LABELS[cellStatus(cell)].toLowerCase();
      // The same reading as the screen: result, then why it did not pass, in words (grading-rule.ts).
      const result = cell?.overridden ? `${label} (override)` : label;
      return [
        cell ? formatScore(cell.score) : "",
        cell && !cell.passed && cell.reason ? `${result}: ${cell.reason}` : result,
      ];
    }),
  ]);
  return Papa.unparse({ fields, data }, { escapeFormulae: true, newline: "\r\n" });
}
