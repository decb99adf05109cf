import { Caution } from "~/components/caution";
import { PROSE } from "~/components/lessons/prose";
import { ResultsTable, ScoreSummary } from "~/components/lessons/results";
import { RoofFigure } from "~/components/lessons/roof-figure";
import type { GradeResult } from "~/lib/lessons/grade";
import type { LessonView } from "~/lib/lessons/types";

type Trial = GradeResult | { error: string };

function TrialResult({ title, trial, testId }: { title: string; trial: Trial; testId: string }) {
  return (
    <section className="card grid gap-2 overflow-x-auto" data-testid={testId}>
      {"error" in trial ? (
        <p className="field-error">
          {title}: {trial.error}
        </p>
      ) : (
        <>
          <ScoreSummary result={trial} heading={title} />
          <ResultsTable result={trial} />
        </>
      )}
    </section>
  );
}

/** The editor's preview: the lesson as trainees will read it, and trial attempts graded on the server (not saved). */
export function LessonPreview({ view, reference, start }: { view: LessonView; reference: Trial; start: Trial }) {
  return (
    <section className="grid gap-4 rounded border-2 border-accent p-4" aria-labelledby="preview-heading">
      <h2 id="preview-heading" className="text-xl font-bold">
        Preview (nothing saved)
      </h2>
      <TrialResult
        title="Trial attempt: the reference roof with the quiz's own answers"
        trial={reference}
        testId="preview-reference"
      />
      <TrialResult
        title="Trial attempt: the starting roof with the quiz's own answers"
        trial={start}
        testId="preview-start"
      />
      <article className={PROSE}>
        <h3>{view.title}</h3>
        {view.blocks.map((b, i) =>
          b.type === "roof" ? (
            <RoofFigure key={i} f={b.figure} />
          ) : b.type === "caution" ? (
            <aside key={i} role="note" className="my-4 rounded border-l-4 border-warn bg-accent-wash px-4 py-3">
              <div dangerouslySetInnerHTML={{ __html: b.html }} />
            </aside>
          ) : (
            <div key={i} dangerouslySetInnerHTML={{ __html: b.html }} />
          ),
        )}
      </article>
      <Caution />
    </section>
  );
}
