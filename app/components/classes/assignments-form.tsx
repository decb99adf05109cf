import { useState } from "react";
import { Form } from "react-router";
import { SubmitButton } from "~/components/form-field";

interface Lesson {
  slug: string;
  title: string;
  position: number;
}

/** Every lesson of the course with a tick and a due date; saving replaces the class's assignments. */
export function AssignmentsForm({
  lessons,
  assigned,
  errors,
}: {
  lessons: Lesson[];
  assigned: { lesson_slug: string; due_on: string | null }[];
  errors?: Record<string, string>;
}) {
  const initial = new Map(assigned.map((a) => [a.lesson_slug, a.due_on ?? ""]));
  const [ticked, setTicked] = useState(() => new Set(initial.keys()));
  if (!lessons.length) {
    return (
      <p className="text-sm text-ink-soft">
        No lessons are loaded yet. They appear here once the course files are synced at start-up.
      </p>
    );
  }
  const toggle = (slug: string, on: boolean) =>
    setTicked((prev) => {
      const next = new Set(prev);
      if (on) next.add(slug);
      else next.delete(slug);
      return next;
    });
  return (
    <Form method="post" className="grid gap-3">
      <input type="hidden" name="intent" value="assignments" />
      <div className="overflow-x-auto">
        <table className="data-table w-full">
          <caption className="sr-only">Lessons to assign</caption>
          <thead>
            <tr>
              <th scope="col" className="w-16">
                Assign
              </th>
              <th scope="col">Lesson</th>
              <th scope="col" className="w-48">
                Due on
              </th>
            </tr>
          </thead>
          <tbody>
            {lessons.map((l) => {
              const on = ticked.has(l.slug);
              const id = `assign-${l.slug}`;
              return (
                <tr key={l.slug} className={on ? "bg-accent-wash/40" : undefined}>
                  <td>
                    <input
                      id={id}
                      type="checkbox"
                      name="assign"
                      value={l.slug}
                      checked={on}
                      onChange={(e) => toggle(l.slug, e.target.checked)}
                      className="h-4 w-4"
                    />
                  </td>
                  <td>
                    <label htmlFor={id}>
                      <span className="text-ink-soft">{l.position}.</span> {l.title}
                    </label>
                  </td>
                  <td>
                    <input
                      type="date"
                      name={`due:${l.slug}`}
                      aria-label={`Due date for ${l.title}`}
                      className="field"
                      defaultValue={initial.get(l.slug) ?? ""}
                      disabled={!on}
                      aria-invalid={errors?.[l.slug] ? true : undefined}
                    />
                    {errors?.[l.slug] ? <p className="field-error">{errors[l.slug]}</p> : null}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <div className="flex items-center gap-3">
        <SubmitButton intent="assignments" pendingText="Saving…">
          Save assignments
        </SubmitButton>
        <span className="text-sm text-ink-soft">
          {ticked.size} of {lessons.length} ticked
        </span>
      </div>
    </Form>
  );
}
