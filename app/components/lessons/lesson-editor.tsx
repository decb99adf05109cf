import { useId, useRef, useState, type ReactNode, type RefObject } from "react";
import { Form, useNavigation } from "react-router";
import { Plus, Trash2 } from "lucide-react";
import { FieldRow } from "~/components/field-row";
import { FormError } from "~/components/form-field";
import type { LessonPreview } from "~/components/lessons/lesson-preview";
import {
  blankCriterion,
  blankQuestion,
  LOCKABLE,
  MAX_CRITERIA,
  MAX_QUESTIONS,
  QUESTION_KINDS,
  roofFigureBlock,
  type CatalogueEntry,
  type CriterionForm,
  type LessonForm,
  type QuestionForm,
} from "~/lib/lessons/lesson-form";

/** A labelled input or text area with its error or hint (the name is the lesson file's field). */
function Input(p: {
  label: string;
  name: string;
  value: string;
  errors: Record<string, string>;
  hint?: ReactNode;
  rows?: number;
  inputMode?: "numeric" | "decimal" | "text";
  mono?: boolean;
  textareaRef?: RefObject<HTMLTextAreaElement | null>;
}) {
  const className = `field ${p.mono ? "font-mono text-sm" : ""}`;
  return (
    <FieldRow label={p.label} error={p.errors[p.name]} hint={p.hint}>
      {(control) =>
        p.rows ? (
          <textarea
            ref={p.textareaRef}
            rows={p.rows}
            name={p.name}
            defaultValue={p.value}
            className={className}
            {...control}
          />
        ) : (
          <input inputMode={p.inputMode} name={p.name} defaultValue={p.value} className={className} {...control} />
        )
      }
    </FieldRow>
  );
}

/** The select that picks a question's or a criterion's kind; the rest of its fieldset follows the choice. */
function KindSelect<K extends string>(p: {
  label: string;
  name: string;
  value: K;
  options: readonly { id: string; label: string }[];
  errors: Record<string, string>;
  onChange: (kind: K) => void;
}) {
  return (
    <FieldRow label={p.label} error={p.errors[p.name]}>
      {(control) => (
        <select
          name={p.name}
          className="field"
          value={p.value}
          onChange={(e) => p.onChange(e.target.value as K)}
          {...control}
        >
          {p.options.map((k) => (
            <option key={k.id} value={k.id}>
              {k.label}
            </option>
          ))}
        </select>
      )}
    </FieldRow>
  );
}

function Question({
  q,
  i,
  errors,
  onRemove,
}: {
  q: QuestionForm;
  i: number;
  errors: Record<string, string>;
  onRemove: () => void;
}) {
  const [kind, setKind] = useState(q.kind);
  const p = `quiz.${i}.`;
  const choice = kind === "single" || kind === "multiple";
  return (
    <fieldset className="card grid gap-3" data-testid={`question-${i}`}>
      <legend className="font-bold">Question {i + 1}</legend>
      <input type="hidden" name={`${p}id`} value={q.id} />
      <KindSelect
        label="Kind"
        name={`${p}kind`}
        value={kind}
        options={QUESTION_KINDS}
        errors={errors}
        onChange={setKind}
      />
      <Input label="Question" name={`${p}prompt`} value={q.prompt} errors={errors} rows={2} />
      {choice ? (
        <Input
          label="Options, one a line; start the right one(s) with *"
          name={`${p}options`}
          value={q.options}
          errors={errors}
          rows={4}
          hint={kind === "single" ? "Exactly one line starts with *." : "Every right line starts with *."}
        />
      ) : (
        <div className="grid gap-3 sm:grid-cols-2">
          <Input
            label={kind === "ratio" ? "Answer (1:N)" : "Answer with its unit"}
            name={`${p}answer`}
            value={q.answer}
            errors={errors}
            hint={kind === "ratio" ? "e.g. 1:80" : "e.g. 150 mm, 2.5 %, 3 L/s"}
          />
          <Input
            label={kind === "ratio" ? "Tolerance on N (optional)" : "Tolerance (optional)"}
            name={`${p}tolerance`}
            value={q.tolerance}
            errors={errors}
            hint={kind === "ratio" ? "e.g. 2; default 1 % of N" : "same kind of unit, e.g. 2 mm; default 1 %"}
          />
        </div>
      )}
      <Input
        label="Hint (teaches the way, never the answer)"
        name={`${p}hint`}
        value={q.hint}
        errors={errors}
        rows={2}
      />
      <Input
        label="Explanation (shown after grading)"
        name={`${p}explanation`}
        value={q.explanation}
        errors={errors}
        rows={2}
      />
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div className="w-28">
          <Input label="Weight" name={`${p}weight`} value={q.weight} errors={errors} inputMode="decimal" />
        </div>
        <button type="button" className="btn" onClick={onRemove}>
          <Trash2 aria-hidden="true" className="h-4 w-4" /> Remove question {i + 1}
        </button>
      </div>
    </fieldset>
  );
}

function Criterion({
  c,
  i,
  errors,
  catalogue,
  onRemove,
}: {
  c: CriterionForm;
  i: number;
  errors: Record<string, string>;
  catalogue: CatalogueEntry[];
  onRemove: () => void;
}) {
  const [kind, setKind] = useState(c.kind);
  const entry = catalogue.find((k) => k.id === kind);
  const p = `task.criteria.${i}.`;
  return (
    <fieldset className="grid gap-2 rounded border border-rule p-3" data-testid={`criterion-${i}`}>
      <legend className="px-1 text-sm font-bold">Criterion {i + 1}</legend>
      <KindSelect label="Check" name={`${p}kind`} value={kind} options={catalogue} errors={errors} onChange={setKind} />
      <div className="grid gap-2 sm:grid-cols-3">
        {entry?.limit !== "none" && (
          <Input
            label="Limit"
            name={`${p}value`}
            value={c.value}
            errors={errors}
            hint={entry ? `e.g. ${entry.example}` : undefined}
          />
        )}
        <Input label="Weight" name={`${p}weight`} value={c.weight} errors={errors} inputMode="decimal" />
        <label className="mt-6 flex items-center gap-2 text-sm">
          <input type="checkbox" name={`${p}required`} defaultChecked={c.required} /> Must pass (required)
        </label>
      </div>
      <Input label="Said when it fails (optional)" name={`${p}hint`} value={c.hint} errors={errors} />
      <button type="button" className="btn justify-self-start" onClick={onRemove}>
        <Trash2 aria-hidden="true" className="h-4 w-4" /> Remove criterion {i + 1}
      </button>
    </fieldset>
  );
}

/** Lists that grow and shrink in the browser; each row keeps a stable key so typed values stay. */
function useRows<T>(initial: T[]) {
  const [rows, setRows] = useState(() => initial.map((value, n) => ({ key: n, value })));
  const [next, setNext] = useState(initial.length);
  return {
    rows,
    add: (value: T) => {
      setRows((r) => [...r, { key: next, value }]);
      setNext(next + 1);
    },
    remove: (key: number) => setRows((r) => r.filter((x) => x.key !== key)),
  };
}

interface SavedRoof {
  id: string;
  name: string;
  spec: unknown;
}

/**
 * Adds a figure of one of the author's saved roofs at the end of the body (a ```roof block the
 * app draws), so a figure need not be typed by hand. Says what it did in a live region.
 */
function RoofFigurePicker({ roofs, body }: { roofs: SavedRoof[]; body: RefObject<HTMLTextAreaElement | null> }) {
  const id = useId();
  const [chosen, setChosen] = useState(roofs[0]?.id ?? "");
  const [said, setSaid] = useState("");
  if (!roofs.length) {
    return (
      <p className="text-sm text-ink-soft">
        Save a roof in your library to add figures of it here; or write a <code>```roof</code> block by hand.
      </p>
    );
  }
  const add = () => {
    const roof = roofs.find((r) => r.id === chosen);
    const area = body.current;
    if (!roof || !area) return;
    const text = area.value.replace(/\s*$/, "");
    area.value = `${text}${text ? "\n\n" : ""}${roofFigureBlock(roof.name, roof.spec)}\n`;
    setSaid(`A figure of “${roof.name}” is at the end of the body.`);
  };
  return (
    <div className="flex flex-wrap items-end gap-2">
      <div>
        <label className="label" htmlFor={id}>
          Figure from a saved roof
        </label>
        <select id={id} className="field" value={chosen} onChange={(e) => setChosen(e.target.value)}>
          {roofs.map((r) => (
            <option key={r.id} value={r.id}>
              {r.name}
            </option>
          ))}
        </select>
      </div>
      <button type="button" className="btn" onClick={add}>
        <Plus aria-hidden="true" className="h-4 w-4" /> Add the figure to the body
      </button>
      <p role="status" className="text-sm text-ink-soft">
        {said}
      </p>
    </div>
  );
}

/** What the editor's action answers (app/lib/lessons/editor-action.server.ts). */
export interface EditorOutcome {
  /** The posted form when the action read it (kept, so nothing typed is lost), else null. */
  form?: LessonForm | null;
  fieldErrors: Record<string, string>;
  formError?: string | null;
  preview?: Parameters<typeof LessonPreview>[0] | null;
  issues?: { path: string; message: string }[];
  source?: string;
}

interface EditorProps {
  form: LessonForm;
  catalogue: CatalogueEntry[];
  /** The author's saved roofs, any of which can become a figure in the body. */
  roofs?: SavedRoof[];
  actions: { intent: string; label: string; primary?: boolean }[];
}

/**
 * The lesson editor: every field of a lesson file as a form. The server writes the lesson file
 * and checks it with the start-up loader; its errors come back by field name and the form keeps
 * what was typed: after a post it shows the posted form (`outcome.form`), re-mounted so the
 * fields take the posted values.
 */
export function LessonEditor({ outcome, ...p }: EditorProps & { outcome?: EditorOutcome }) {
  const posted = outcome?.form ? outcome : undefined;
  const form = posted?.form ?? p.form;
  return (
    <EditorForm
      key={JSON.stringify(form).length + (posted ? "a" : "l")}
      {...p}
      form={form}
      errors={posted?.fieldErrors ?? {}}
      formError={posted?.formError ?? null}
    />
  );
}

function EditorForm({
  form,
  errors,
  formError,
  catalogue,
  roofs = [],
  actions,
}: EditorProps & { errors: Record<string, string>; formError: string | null }) {
  const quiz = useRows(form.quiz);
  const criteria = useRows(form.task.criteria);
  const navigation = useNavigation();
  const busy = navigation.state === "submitting";
  const bodyRef = useRef<HTMLTextAreaElement>(null);
  return (
    <Form method="post" className="grid gap-6" data-testid="lesson-editor">
      <FormError message={formError} />
      <section className="card grid gap-3" aria-labelledby="about-heading">
        <h2 id="about-heading" className="text-lg font-bold">
          The lesson
        </h2>
        <Input label="Title" name="title" value={form.title} errors={errors} />
        <Input label="Summary (one line for the course list)" name="summary" value={form.summary} errors={errors} />
        <div className="grid gap-3 sm:grid-cols-2">
          <Input label="Minutes" name="minutes" value={form.minutes} errors={errors} inputMode="numeric" />
          <Input label="Pass mark (0-100)" name="passMark" value={form.passMark} errors={errors} inputMode="decimal" />
        </div>
        <Input label="Objectives, one a line" name="objectives" value={form.objectives} errors={errors} rows={3} />
        <Input
          label="Body (Markdown)"
          name="body"
          value={form.body}
          errors={errors}
          rows={14}
          mono
          textareaRef={bodyRef}
          hint={
            <>
              Plain Markdown. A <code>```roof</code> block (caption, view, spec) draws a figure; one is needed. A{" "}
              <code>```caution</code> block is a safety box. HTML is not allowed.
            </>
          }
        />
        <RoofFigurePicker roofs={roofs} body={bodyRef} />
      </section>

      <section className="grid gap-3" aria-labelledby="quiz-heading">
        <h2 id="quiz-heading" className="text-lg font-bold">
          Quiz
        </h2>
        {errors.quiz && <p className="field-error">{errors.quiz}</p>}
        {quiz.rows.map((r, i) => (
          <Question key={r.key} q={r.value} i={i} errors={errors} onRemove={() => quiz.remove(r.key)} />
        ))}
        <button
          type="button"
          className="btn justify-self-start"
          disabled={quiz.rows.length >= MAX_QUESTIONS}
          onClick={() => quiz.add({ ...blankQuestion(quiz.rows.length), id: `q${Date.now().toString(36)}` })}
        >
          <Plus aria-hidden="true" className="h-4 w-4" /> Add a question
        </button>
      </section>

      <section className="card grid gap-3" aria-labelledby="task-heading">
        <h2 id="task-heading" className="text-lg font-bold">
          Roof task
        </h2>
        <Input label="Task title" name="task.title" value={form.task.title} errors={errors} />
        <Input
          label="Goal stated to the trainee (Markdown)"
          name="task.goal"
          value={form.task.goal}
          errors={errors}
          rows={3}
        />
        <fieldset>
          <legend className="label">What the trainee may change (the rest is locked)</legend>
          <div className="flex flex-wrap gap-x-4 gap-y-1">
            {LOCKABLE.map((l) => (
              <label key={l.id} className="flex items-center gap-1.5 text-sm">
                <input
                  type="checkbox"
                  name="task.editable"
                  value={l.id}
                  defaultChecked={form.task.editable.includes(l.id)}
                />
                {l.label}
              </label>
            ))}
          </div>
          {errors["task.editable"] && <p className="field-error">{errors["task.editable"]}</p>}
        </fieldset>
        <h3 className="font-bold">Criteria</h3>
        {errors["task.criteria"] && <p className="field-error">{errors["task.criteria"]}</p>}
        {criteria.rows.map((r, i) => (
          <Criterion
            key={r.key}
            c={r.value}
            i={i}
            errors={errors}
            catalogue={catalogue}
            onRemove={() => criteria.remove(r.key)}
          />
        ))}
        <button
          type="button"
          className="btn justify-self-start"
          disabled={criteria.rows.length >= MAX_CRITERIA}
          onClick={() => criteria.add(blankCriterion())}
        >
          <Plus aria-hidden="true" className="h-4 w-4" /> Add a criterion
        </button>
        <Input label="Hints, one a line" name="task.hints" value={form.task.hints} errors={errors} rows={3} />
        <details>
          <summary className="cursor-pointer text-sm font-medium">
            Roofs (JSON): the starting roof and one that passes
          </summary>
          <div className="mt-2 grid gap-3">
            <Input label="Starting roof" name="task.start" value={form.task.start} errors={errors} rows={8} mono />
            <Input
              label="Reference roof (passes every criterion; never shown to trainees)"
              name="task.reference"
              value={form.task.reference}
              errors={errors}
              rows={8}
              mono
            />
          </div>
        </details>
        {(errors["task.start"] || errors["task.reference"]) && (
          <p className="field-error">{errors["task.start"] ?? errors["task.reference"]}</p>
        )}
      </section>

      <div className="sticky bottom-0 flex flex-wrap gap-3 border-t border-rule bg-paper py-3">
        {actions.map((a) => (
          <button
            key={a.intent}
            type="submit"
            name="intent"
            value={a.intent}
            className={a.primary ? "btn-primary" : "btn"}
            disabled={busy}
          >
            {a.label}
          </button>
        ))}
      </div>
    </Form>
  );
}
