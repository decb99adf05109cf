/** The /courses/:id page's form handlers (one per intent): details, and adding, removing and moving lessons. */
import { data } from "react-router";
import type { SessionUser } from "~/lib/auth.server";
import { db } from "~/lib/db.server";
import { parseCourseDetails, moveItem, type CourseField, type CourseValues } from "~/lib/courses/course-form";
import {
  courseLessonChoices,
  courseLessons,
  setCourseLessons,
  updateCourse,
  type CourseRow,
} from "~/lib/courses/courses.server";

export interface CourseActionResult {
  intent: string;
  notice?: string;
  error?: string;
  errors?: Partial<Record<CourseField, string>>;
  values?: CourseValues;
  /** The add form's field error and what was chosen. */
  lessonError?: string;
  lesson?: string;
}

const reply = (result: CourseActionResult, status = 200) => data(result, { status });

export async function handleCourseAction(user: SessionUser, course: CourseRow, form: FormData) {
  const intent = String(form.get("intent") ?? "");
  const slug = String(form.get("lesson") ?? "").slice(0, 200);
  const current = (await courseLessons(course.id)).map((l) => l.slug);
  switch (intent) {
    case "details": {
      const parsed = parseCourseDetails(form);
      if (!parsed.ok) return reply({ intent, errors: parsed.errors, values: parsed.values }, 400);
      await updateCourse(course.id, parsed.value);
      return reply({ intent, notice: "Course details saved." });
    }
    case "add": {
      const choices = await courseLessonChoices(db(), user);
      const lesson = choices.find((c) => c.slug === slug);
      if (!slug) return reply({ intent, lessonError: "Choose a lesson to add.", lesson: slug }, 400);
      if (!lesson) return reply({ intent, lessonError: "That lesson is not one you can add.", lesson: slug }, 400);
      if (current.includes(slug))
        return reply({ intent, lessonError: `“${lesson.title}” is already in the course.`, lesson: slug }, 400);
      await setCourseLessons(course.id, [...current, slug]);
      return reply({ intent, notice: `“${lesson.title}” added as lesson ${current.length + 1}.` });
    }
    case "remove": {
      if (!current.includes(slug)) return reply({ intent, error: "That lesson is not in the course (any more)." }, 404);
      await setCourseLessons(
        course.id,
        current.filter((s) => s !== slug),
      );
      return reply({ intent, notice: "Lesson removed from the course." });
    }
    case "move": {
      const by = form.get("direction") === "up" ? -1 : form.get("direction") === "down" ? 1 : 0;
      if (!by) return reply({ intent, error: "Say whether to move the lesson up or down (direction)." }, 400);
      const index = current.indexOf(slug);
      if (index < 0) return reply({ intent, error: "That lesson is not in the course (any more)." }, 404);
      const next = moveItem(current, index, by);
      await setCourseLessons(course.id, next);
      return reply({ intent, notice: `Lesson moved to place ${next.indexOf(slug) + 1}.`, lesson: slug });
    }
    default:
      return reply({ intent, error: "Unknown action." }, 400);
  }
}
