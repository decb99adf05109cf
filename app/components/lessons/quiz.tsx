import type { ItemResult } from "~/lib/lessons/grade";
import type { LessonView } from "~/lib/lessons/types";
import { ItemFeedback } from "./results";

type Question = LessonView["quiz"][number];

/** One quiz question as form fields named `q:<id>`; keeps what was typed after a submit. */
export function QuizQuestion({
  q,
  index,
  result,
  disabled,
}: {
  q: Question;
  index: number;
  result?: ItemResult;
  disabled?: boolean;
}) {
  const name = `q:${q.id}`;
  const promptId = `prompt-${q.id}`;
  return (
    <li className="card" data-testid={`question-${q.id}`}>
      <fieldset disabled={disabled} aria-describedby={result ? `result-${q.id}` : undefined}>
        <legend id={promptId} className="font-medium">
          <span className="mr-2 text-ink-soft">{index + 1}.</span>
          <span
            className="[&_code]:rounded [&_code]:bg-paper-deep [&_code]:px-1"
            dangerouslySetInnerHTML={{ __html: q.promptHtml }}
          />
        </legend>
        {q.kind === "choice" ? (
          <div className="mt-3 grid gap-1.5">
            {q.multiple && <p className="text-xs text-ink-soft">Pick every answer that applies.</p>}
            {q.options!.map((o) => (
              <label key={o.id} className="flex cursor-pointer items-start gap-2 rounded px-2 py-1 hover:bg-paper-deep">
                <input
                  type={q.multiple ? "checkbox" : "radio"}
                  name={name}
                  value={o.id}
                  className="mt-1 accent-[var(--color-accent)]"
                />
                <span dangerouslySetInnerHTML={{ __html: o.html }} />
              </label>
            ))}
          </div>
        ) : (
          <div className="mt-3 max-w-xs">
            <label className="label" htmlFor={`answer-${q.id}`}>
              {q.kind === "ratio" ? "Your answer, as 1:N" : "Your answer, with its unit"}
            </label>
            <input
              id={`answer-${q.id}`}
              name={name}
              className="field"
              autoComplete="off"
              spellCheck={false}
              inputMode="text"
              maxLength={60}
              placeholder={q.placeholder}
              aria-labelledby={`${promptId} answer-label-${q.id}`}
            />
            <span id={`answer-label-${q.id}`} className="sr-only">
              {q.kind === "ratio" ? "answer as 1:N" : "answer with its unit"}
            </span>
          </div>
        )}
      </fieldset>
      {q.hintHtml && !result ? (
        <details className="mt-2 text-sm" data-testid={`hint-${q.id}`}>
          <summary className="cursor-pointer text-ink-soft">Hint</summary>
          <p
            className="mt-1 [&_code]:rounded [&_code]:bg-paper-deep [&_code]:px-1"
            dangerouslySetInnerHTML={{ __html: q.hintHtml }}
          />
        </details>
      ) : null}
      {result && (
        <div id={`result-${q.id}`}>
          <ItemFeedback item={result} />
        </div>
      )}
    </li>
  );
}
