import type { Route } from "./+types/api.v1.lessons";
import { getOptionalUser } from "~/lib/auth.server";
import { db } from "~/lib/db.server";
import { progressOf } from "~/lib/lessons/attempts.server";
import { allLessons } from "~/lib/lessons/catalogue.server";
import { lessonSummary } from "~/lib/lessons/view.server";

/** GET /api/v1/lessons: the course, open to everyone; with my progress when signed in. */
export async function loader({ request }: Route.LoaderArgs) {
  const user = await getOptionalUser(request);
  const progress = user ? await progressOf(db(), user.id) : null;
  return Response.json({
    lessons: allLessons().map((l) => ({
      ...lessonSummary(l),
      progress: progress ? (progress[l.slug] ?? null) : undefined,
    })),
  });
}
