import { Link } from "react-router";
import { BookOpen, CalendarDays, Check, Clock, ListChecks, Minus, X } from "lucide-react";
import type { Route } from "./+types/lessons._index";
import { getOptionalUser } from "~/lib/auth.server";
import { dueDatesForTrainee, type LessonDue } from "~/lib/classes.server";
import { db } from "~/lib/db.server";
import { progressOf, type Progress } from "~/lib/lessons/attempts.server";
import { mayAuthor, visibleLessons } from "~/lib/lessons/access.server";
import { lessonSummary } from "~/lib/lessons/view.server";
import { Day } from "~/components/dates";
import { GeneralErrorBoundary } from "~/components/error-boundary";

export const meta: Route.MetaFunction = () => [
  { title: "Lessons · Fallwright" },
  {
    name: "description",
    content:
      "A course on shaping parapet roofs to their outlets: falls, ponding, outlets, gutters, fall lines, drop schedules and the height budget.",
  },
];

export async function loader({ request }: Route.LoaderArgs) {
  const user = await getOptionalUser(request);
  // Progress, and due dates from the classes the user belongs to (a trainer's own classes have no
  // members' dates here): independent, so asked for together.
  const [progress, due]: [Record<string, Progress>, Record<string, LessonDue>] = user
    ? await Promise.all([progressOf(db(), user.id), dueDatesForTrainee(user.id)])
    : [{}, {}];
  return {
    signedIn: !!user,
    today: new Date().toISOString().slice(0, 10),
    mayAuthor: mayAuthor(user),
    lessons: (await visibleLessons(db(), user)).map(({ lesson: l, builtIn, status, versionNumber, editable }) => ({
      ...lessonSummary(l),
      builtIn,
      status,
      versionNumber,
      editable,
      progress: progress[l.slug] ?? null,
      due: due[l.slug] ?? null,
    })),
  };
}

function Status({ p }: { p: Progress | null }) {
  if (!p)
    return (
      <span className="inline-flex items-center gap-1 text-ink-soft">
        <Minus aria-hidden="true" className="h-4 w-4" />
        Not started
      </span>
    );
  if (p.passed)
    return (
      <span className="inline-flex items-center gap-1 font-medium text-ok">
        <Check aria-hidden="true" className="h-4 w-4" strokeWidth={3} />
        Passed
      </span>
    );
  return (
    <span className="inline-flex items-center gap-1 font-medium text-bad">
      <X aria-hidden="true" className="h-4 w-4" strokeWidth={3} />
      Not passed yet
    </span>
  );
}

/** When the trainee's class wants the lesson done: the soonest due date, the class, and "late". */
function DueLine({ due, late }: { due: LessonDue; late: boolean }) {
  const others = due.classes > 1 ? ` and ${due.classes - 1} more ${due.classes === 2 ? "class" : "classes"}` : "";
  return (
    <p
      className={`mt-1 inline-flex items-center gap-1 text-sm ${late ? "font-medium text-bad" : "text-ink"}`}
      data-testid="lesson-due"
    >
      <CalendarDays aria-hidden="true" className="h-4 w-4" />
      {due.dueOn ? (
        <>
          {late ? "Overdue: was due" : "Due"} <Day iso={due.dueOn} />
        </>
      ) : (
        "Assigned, no due date"
      )}{" "}
      · {due.className}
      {others}
    </p>
  );
}

export default function Lessons({ loaderData }: Route.ComponentProps) {
  const { lessons, signedIn, today, mayAuthor } = loaderData;
  const passed = lessons.filter((l) => l.progress?.passed).length;
  const next = lessons.find((l) => !l.progress?.passed);
  return (
    <div className="grid gap-6">
      <header className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <h1 className="text-display font-bold tracking-tight">Lessons</h1>
          <p className="mt-2 max-w-prose text-ink-soft">
            {lessons.length} short lessons on getting the water off a roof inside parapets. Each one explains, asks a
            few questions, and gives you a roof to shape in the sandbox; the server checks your roof and marks it.
          </p>
        </div>
        {signedIn ? (
          <div className="text-right">
            <p className="text-sm text-ink-soft">Your progress</p>
            <p className="text-2xl font-bold tabular-nums" data-testid="course-progress">
              {passed} of {lessons.length} passed
            </p>
            <p className="mt-1 flex flex-wrap justify-end gap-3 text-sm">
              {next && (
                <Link to={`/lessons/${next.slug}`} className="btn-primary">
                  Next: lesson {next.position}
                </Link>
              )}
              <Link to="/attempts" className="btn">
                My attempts
              </Link>
              {mayAuthor && (
                <Link to="/lessons/new" className="btn" data-testid="new-lesson">
                  Write a lesson
                </Link>
              )}
            </p>
          </div>
        ) : (
          <p className="card max-w-sm text-sm">
            You can read every lesson and try every roof.{" "}
            <Link className="font-medium underline" to="/login?redirectTo=%2Flessons">
              Sign in
            </Link>{" "}
            to submit your answers and keep your progress.
          </p>
        )}
      </header>
      <ol className="grid gap-3">
        {lessons.map((l) => (
          <li
            key={l.slug}
            className="card grid gap-3 sm:grid-cols-[auto_1fr_auto] sm:items-center"
            data-testid={`lesson-${l.slug}`}
          >
            <span
              className="flex h-10 w-10 items-center justify-center rounded-full border-2 border-ink text-lg font-bold tabular-nums"
              aria-hidden="true"
            >
              {l.position}
            </span>
            <div className="min-w-0">
              <h2 className="text-lg font-bold">
                <Link to={`/lessons/${l.slug}`} className="hover:underline">
                  <span className="sr-only">Lesson {l.position}: </span>
                  {l.title}
                </Link>
              </h2>
              <p className="text-sm text-ink-soft">{l.summary}</p>
              <p className="mt-1 flex flex-wrap gap-x-4 gap-y-1 text-xs text-ink-soft">
                <span className="inline-flex items-center gap-1">
                  <Clock aria-hidden="true" className="h-3.5 w-3.5" />
                  about {l.minutes} min
                </span>
                <span className="inline-flex items-center gap-1">
                  <BookOpen aria-hidden="true" className="h-3.5 w-3.5" />
                  {l.questions} questions
                </span>
                <span className="inline-flex items-center gap-1">
                  <ListChecks aria-hidden="true" className="h-3.5 w-3.5" />
                  roof task, {l.criteria} checks
                </span>
                <span>pass mark {l.passMark}</span>
                {!l.builtIn && (
                  <span data-testid={`status-${l.slug}`}>
                    {l.status === "draft" ? "draft, not shown to trainees" : `your organisation · v${l.versionNumber}`}
                  </span>
                )}
                {l.editable && (
                  <Link to={`/lessons/${l.slug}/edit`} className="underline">
                    Edit
                  </Link>
                )}
              </p>
              {l.due && <DueLine due={l.due} late={!!l.due.dueOn && l.due.dueOn < today && !l.progress?.passed} />}
            </div>
            {signedIn && (
              <div className="text-sm sm:text-right" data-testid={`progress-${l.slug}`}>
                <Status p={l.progress} />
                {l.progress && (
                  <p className="text-xs text-ink-soft tabular-nums">
                    best {Math.round(l.progress.bestScore * 10) / 10} · {l.progress.attempts}{" "}
                    {l.progress.attempts === 1 ? "attempt" : "attempts"}
                  </p>
                )}
              </div>
            )}
          </li>
        ))}
      </ol>
    </div>
  );
}

export function ErrorBoundary() {
  return <GeneralErrorBoundary />;
}
