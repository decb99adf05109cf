import { useCallback, useEffect, useRef } from "react";
import { data, Form, Link, useNavigation } from "react-router";
import { Clock, Send } from "lucide-react";
import type { Route } from "./+types/lessons.$slug";
import type { RoofSpec } from "~/engine";
import { getOptionalUser, requirePermission } from "~/lib/auth.server";
import { db } from "~/lib/db.server";
import { readFormCapped } from "~/lib/json-api.server";
import { progressOf } from "~/lib/lessons/attempts.server";
import { GRADING_RULE_LINES } from "~/lib/lessons/grading-rule";
import { lessonForViewer, mayAuthor } from "~/lib/lessons/access.server";
import { submissionFromForm, submitAttempt } from "~/lib/lessons/submit.server";
import { lessonView } from "~/lib/lessons/view.server";
import { Caution } from "~/components/caution";
import { GeneralErrorBoundary } from "~/components/error-boundary";
import { FormError } from "~/components/form-field";
import { PROSE } from "~/components/lessons/prose";
import { QuizQuestion } from "~/components/lessons/quiz";
import { ScoreSummary } from "~/components/lessons/results";
import { RoofFigure } from "~/components/lessons/roof-figure";
import { TaskPanel } from "~/components/lessons/task-panel";
import { AsBuiltTaskPanel } from "~/components/lessons/as-built-task-panel";

export const meta: Route.MetaFunction = ({ data }) => [
  { title: `${data?.lesson.title ?? "Lesson"} · Fallwright` },
  { name: "description", content: data?.lesson.summary ?? "" },
];

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await getOptionalUser(request);
  const entry = await lessonForViewer(db(), params.slug, user);
  if (!entry) throw data("No lesson with that name.", { status: 404 });
  const lesson = entry.lesson;
  const progress = user ? ((await progressOf(db(), user.id))[lesson.slug] ?? null) : null;
  // A fresh key per page view: a double click or a retry of this submit makes one attempt.
  return {
    lesson: lessonView(lesson),
    signedIn: !!user,
    progress,
    idempotencyKey: crypto.randomUUID(),
    authoring: mayAuthor(user)
      ? { editable: entry.editable, builtIn: entry.builtIn, status: entry.status, versionNumber: entry.versionNumber }
      : null,
  };
}

export async function action({ request, params }: Route.ActionArgs) {
  const user = await requirePermission(request, "lessons:take");
  if (!(await lessonForViewer(db(), params.slug, user))) throw data("No lesson with that name.", { status: 404 });
  const read = await readFormCapped(request, 512 * 1024);
  if (!read.ok)
    return data({ attempt: null, error: "The submission could not be read. Try again." }, { status: read.status });
  const outcome = await submitAttempt(user, submissionFromForm(params.slug, read.form));
  // The next submit is a new attempt: its key comes with this answer, since the page's own data
  // (and the key it carries) may reload only after the trainee has already changed the roof.
  if ("attempt" in outcome) return { attempt: outcome.attempt, error: null, nextKey: crypto.randomUUID() };
  const detail =
    "issues" in outcome && outcome.issues?.length
      ? ` (${outcome.issues
          .slice(0, 2)
          .map((i) => `${i.path}: ${i.message}`)
          .join("; ")})`
      : "";
  const roofProblem = outcome.issues?.some((i) => i.path.startsWith("spec"));
  const message = roofProblem
    ? `Your roof could not be checked: ${outcome.message} Use "Starting roof" to go back to the task's roof.`
    : outcome.status === 400
      ? `The submission was incomplete${detail}. Reload the page and try again; your answers stay in the form.`
      : outcome.message;
  return data({ attempt: null, error: message }, { status: outcome.status });
}

const FORM_ID = "attempt-form";

/** For trainers and admins: this lesson's status and what they may do with it. */
function AuthoringBar(p: {
  slug: string;
  editable: boolean;
  builtIn: boolean;
  status: "draft" | "published";
  versionNumber: number | null;
}) {
  return (
    <div className="flex flex-wrap items-center gap-3 text-sm" data-testid="authoring-bar">
      <span className="font-medium">
        {p.builtIn
          ? "Built-in lesson (read-only)"
          : p.status === "draft"
            ? "Draft: not shown to trainees"
            : `Published, v${p.versionNumber}`}
      </span>
      {p.editable && (
        <Link className="btn" to={`/lessons/${p.slug}/edit`}>
          Edit
        </Link>
      )}
      <Form method="post" action={`/lessons/${p.slug}/edit`}>
        <button className="btn" type="submit" name="intent" value="duplicate">
          Duplicate to my organisation
        </button>
      </Form>
      <a className="underline" href={`/lessons/${p.slug}/export`} download>
        Export as a lesson file
      </a>
    </div>
  );
}

function useTimeSpent() {
  const started = useRef(0);
  useEffect(() => {
    started.current = Date.now();
  }, []);
  return () => (started.current ? Math.round((Date.now() - started.current) / 1000) : 0);
}

export default function LessonPlayer({ loaderData, actionData }: Route.ComponentProps) {
  const { lesson, signedIn, progress, idempotencyKey, authoring } = loaderData;
  const result = actionData;
  const navigation = useNavigation();
  const submitting = navigation.state === "submitting";
  const specInput = useRef<HTMLInputElement>(null);
  const timeInput = useRef<HTMLInputElement>(null);
  const timeSpent = useTimeSpent();
  // The roof as edited, written into the form as it submits: React may set the hidden input
  // back to its default whenever this page re-renders (a revalidation landing after an edit).
  const latestSpec = useRef<RoofSpec | null>(null);
  const onSpecChange = useCallback((spec: RoofSpec) => {
    latestSpec.current = spec;
  }, []);
  const graded = result?.attempt?.results ?? null;
  const quizResults = new Map((graded?.quiz ?? []).map((r) => [r.id, r]));
  const summaryRef = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (result) summaryRef.current?.scrollIntoView({ behavior: "smooth", block: "center" });
  }, [result]);

  const asBuiltTask = lesson.task.kind === "as-built";
  const submitBar = (
    <section className="card grid gap-3 border-2 border-ink" aria-label="Submit">
      <div ref={summaryRef}>
        {graded && <ScoreSummary result={graded} heading="Attempt graded on the server" />}
        <FormError message={result?.error} />
      </div>
      <div className="flex flex-wrap items-center gap-3">
        {signedIn ? (
          <button
            type="submit"
            form={FORM_ID}
            className="btn-primary"
            disabled={submitting}
            aria-busy={submitting || undefined}
          >
            <Send aria-hidden="true" className="h-4 w-4" />
            {submitting
              ? "Checking your answers…"
              : graded
                ? "Submit again"
                : asBuiltTask
                  ? "Submit answers and findings"
                  : "Submit answers and roof"}
          </button>
        ) : (
          <Link className="btn-primary" to={`/login?${new URLSearchParams({ redirectTo: `/lessons/${lesson.slug}` })}`}>
            Sign in to submit
          </Link>
        )}
        {result?.attempt && (
          <Link className="text-sm underline" to={`/attempts/${result.attempt.id}`}>
            Open this attempt
          </Link>
        )}
        <Link className="text-sm underline" to="/attempts">
          My attempts
        </Link>
        <p className="text-xs text-ink-soft">
          Sends your quiz answers above and the roof below. The server runs the roof engine again and marks everything;
          nothing is marked in the browser.
        </p>
      </div>
    </section>
  );

  return (
    <div className="grid gap-8">
      <header className="grid gap-2">
        <p className="text-sm">
          <Link to="/lessons" className="underline">
            Lessons
          </Link>{" "}
          <span className="text-ink-soft">/ lesson {lesson.position}</span>
        </p>
        <h1 className="text-display font-bold tracking-tight">{lesson.title}</h1>
        {authoring && <AuthoringBar slug={lesson.slug} {...authoring} />}
        <p className="max-w-prose text-lg text-ink-soft">{lesson.summary}</p>
        <p className="flex flex-wrap items-center gap-x-4 gap-y-1 text-sm text-ink-soft">
          <span className="inline-flex items-center gap-1">
            <Clock aria-hidden="true" className="h-4 w-4" />
            about {lesson.minutes} min
          </span>
          <span>
            {lesson.quiz.length} questions and {asBuiltTask ? "a survey to check" : "a roof task"}
          </span>
          <span>pass mark {lesson.passMark} of 100</span>
          {progress && (
            <span data-testid="lesson-progress">
              your best {Math.round(progress.bestScore * 10) / 10} · {progress.passed ? "passed" : "not passed yet"} ·{" "}
              {progress.attempts} {progress.attempts === 1 ? "attempt" : "attempts"}
            </span>
          )}
        </p>
      </header>

      <section className="card" aria-labelledby="objectives-heading">
        <h2 id="objectives-heading" className="font-bold">
          After this lesson you can
        </h2>
        <ul className="mt-2 list-disc space-y-1 pl-6">
          {lesson.objectives.map((o) => (
            <li key={o}>{o}</li>
          ))}
        </ul>
      </section>

      <section className="card" aria-labelledby="grading-heading" data-testid="grading-rule">
        <h2 id="grading-heading" className="font-bold">
          How this lesson is graded
        </h2>
        <ul className="mt-2 list-disc space-y-1 pl-6 text-sm">
          {GRADING_RULE_LINES(lesson.passMark).map((line) => (
            <li key={line}>{line}</li>
          ))}
        </ul>
      </section>

      <article className={PROSE}>
        {lesson.blocks.map((b, i) =>
          b.type === "roof" ? (
            <RoofFigure key={i} f={b.figure} />
          ) : b.type === "caution" ? (
            <aside key={i} role="note" className="my-4 rounded border-l-4 border-warn bg-accent-wash px-4 py-3">
              <p className="!mt-0 text-xs font-bold uppercase tracking-wide text-warn">
                Caution: this work can hurt people
              </p>
              <div dangerouslySetInnerHTML={{ __html: b.html }} />
            </aside>
          ) : (
            <div key={i} dangerouslySetInnerHTML={{ __html: b.html }} />
          ),
        )}
      </article>

      {/* The sandbox holds forms of its own, so it sits outside this one; the submit button joins it by id. */}
      <Form
        id={FORM_ID}
        method="post"
        className="grid gap-8"
        onSubmit={() => {
          if (timeInput.current) timeInput.current.value = String(timeSpent());
          if (specInput.current && latestSpec.current) specInput.current.value = JSON.stringify(latestSpec.current);
        }}
      >
        <input
          type="hidden"
          name="idempotencyKey"
          value={(result && "nextKey" in result ? result.nextKey : null) ?? idempotencyKey}
        />
        <input type="hidden" name="version" value={lesson.version} />
        <input type="hidden" name="timeSpentSeconds" ref={timeInput} defaultValue="0" />
        <input
          type="hidden"
          name="spec"
          ref={specInput}
          defaultValue={JSON.stringify(lesson.task.kind === "roof" ? lesson.task.start : lesson.task.design)}
        />

        <section aria-labelledby="quiz-heading" className="grid gap-3">
          <div>
            <p className="text-xs font-medium uppercase tracking-widest text-accent">Quiz</p>
            <h2 id="quiz-heading" className="text-2xl font-bold tracking-tight">
              Check your understanding
            </h2>
            <p className="text-sm text-ink-soft">
              Give numbers with their unit (150 mm, 0.15 m and 15 cm all count); write ratios as 1:N.
            </p>
          </div>
          <ol className="grid gap-3">
            {lesson.quiz.map((q, i) => (
              <QuizQuestion key={q.id} q={q} index={i} result={quizResults.get(q.id)} />
            ))}
          </ol>
        </section>
      </Form>

      {lesson.task.kind === "as-built" ? (
        <>
          <AsBuiltTaskPanel task={lesson.task} results={graded?.task ?? null} />
          {submitBar}
        </>
      ) : (
        <TaskPanel
          slug={lesson.slug}
          version={lesson.version}
          task={lesson.task}
          results={graded?.task ?? null}
          onSpecChange={onSpecChange}
          submitBar={submitBar}
        />
      )}
      <Caution />
    </div>
  );
}

export function ErrorBoundary() {
  return <GeneralErrorBoundary />;
}
