import type { Route } from "./+types/api.v1.attempts.$id";
import { db } from "~/lib/db.server";
import { jsonError, requireApiPermission } from "~/lib/json-api.server";
import { getAttempt, maySeeTraineeAttempts } from "~/lib/lessons/attempts.server";

/** GET /api/v1/attempts/:id: one graded attempt, to its trainee, their class's trainer or an admin. */
export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requireApiPermission(request, "lessons:take");
  const attempt = await getAttempt(db(), params.id);
  if (!attempt || !(await maySeeTraineeAttempts(db(), user, attempt.traineeId)))
    return jsonError(404, "No attempt with that id that you may see.");
  return Response.json({ attempt });
}
