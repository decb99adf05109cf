import type { Route } from "./+types/api.v1.lessons";
import { getOptionalUser } from "~/lib/auth.server";
import { db } from "~/lib/db.server";
import { progressOf } from "~/lib/lessons/attempts.server";
import { visibleLessons } from "~/lib/lessons/access.server";
import { lessonSummary } from "~/lib/lessons/view.server";

/**
 * GET /api/v1/lessons: the course, open to everyone; with my progress when signed in, and my
 * organisation's own lessons (drafts too for its trainers and admins, marked by `status`).
 */
export async function loader({ request }: Route.LoaderArgs) {
  const user = await getOptionalUser(request);
  const progress = user ? await progressOf(db(), user.id) : null;
  return Response.json({
    lessons: (await visibleLessons(db(), user)).map(({ lesson: l, builtIn, status, versionNumber }) => ({
      ...lessonSummary(l),
      builtIn,
      status,
      versionNumber,
      progress: progress ? (progress[l.slug] ?? null) : undefined,
    })),
  });
}
