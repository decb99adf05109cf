import { Download } from "lucide-react";
import type { Gradebook } from "~/lib/gradebook";
import { GradebookTable } from "~/components/classes/gradebook-table";

/** The gradebook panel both /gradebook and /classes/:id/gradebook show. */
export function GradebookView({ book, classId, className }: { book: Gradebook; classId: string; className: string }) {
  return (
    <section aria-label={`Gradebook of ${className}`} className="grid gap-3">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <p className="max-w-3xl text-sm text-ink-soft">
          Each cell is the trainee's best attempt at an assigned lesson: a pass beats a fail, then the higher score. A
          grade a trainer changed is marked <em>override</em> and counts instead of the automatic one. Open a cell to
          review the attempt.
        </p>
        <a className="btn" href={`/classes/${classId}/gradebook.csv`} download>
          <Download aria-hidden="true" className="h-4 w-4" /> Download CSV
        </a>
      </div>
      {book.lessons.length === 0 ? (
        <p className="card text-ink-soft">
          No lessons are assigned to this class yet.{" "}
          <a className="underline" href={`/classes/${classId}#assignments`}>
            Assign lessons
          </a>{" "}
          and they appear here as columns.
        </p>
      ) : (
        <GradebookTable book={book} classId={classId} />
      )}
    </section>
  );
}
