import type { Route } from "./+types/api.v1.attempts";
import { db } from "~/lib/db.server";
import { jsonError, readJsonBody, requireApiPermission } from "~/lib/json-api.server";
import { listAttempts, maySeeTraineeAttempts } from "~/lib/lessons/attempts.server";
import { submitAttempt } from "~/lib/lessons/submit.server";

const BODY_LIMIT = 512 * 1024;

/**
 * GET /api/v1/attempts?mine=1 (my attempts) or ?trainee=<id> (trainers: their own classes'
 * trainees; admins: their organisation), optionally &lesson=<slug>.
 */
export async function loader({ request }: Route.LoaderArgs) {
  const user = await requireApiPermission(request, "lessons:take");
  const url = new URL(request.url);
  const trainee = url.searchParams.get("trainee");
  const lesson = url.searchParams.get("lesson") ?? undefined;
  if (trainee === null && url.searchParams.get("mine") === null) {
    return jsonError(400, "Say whose attempts: ?mine=1, or ?trainee=<id> for a trainee of your class.", [
      { path: "mine", message: "is required without trainee" },
    ]);
  }
  const who = trainee ?? user.id;
  if (!(await maySeeTraineeAttempts(db(), user, who)))
    return jsonError(403, "You may only see attempts of trainees in your own classes.");
  return Response.json({ attempts: await listAttempts(db(), who, { lesson: lesson?.slice(0, 100) }) });
}

/** POST /api/v1/attempts {lesson, version?, answers, spec, idempotencyKey, timeSpentSeconds}: graded here, 201 (or 200 for a repeated key). */
export async function action({ request }: Route.ActionArgs) {
  if (request.method !== "POST") return jsonError(405, "Use GET or POST here.", [], { Allow: "GET, POST" });
  const user = await requireApiPermission(request, "lessons:take");
  const body = await readJsonBody(request, BODY_LIMIT);
  if (!body.ok) return body.response;
  const outcome = await submitAttempt(user, body.value);
  if ("attempt" in outcome) {
    return Response.json(
      { attempt: outcome.attempt },
      { status: outcome.status, headers: { Location: `/api/v1/attempts/${outcome.attempt.id}` } },
    );
  }
  return jsonError(outcome.status, outcome.message, "issues" in outcome ? (outcome.issues ?? []) : []);
}
