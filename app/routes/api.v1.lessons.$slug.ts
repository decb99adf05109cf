import type { Route } from "./+types/api.v1.lessons.$slug";
import { jsonError } from "~/lib/json-api.server";
import { getOptionalUser } from "~/lib/auth.server";
import { db } from "~/lib/db.server";
import { lessonForViewer } from "~/lib/lessons/access.server";
import { lessonView } from "~/lib/lessons/view.server";

/** GET /api/v1/lessons/:slug: one lesson as the player shows it (no answers, no reference roof). */
export async function loader({ request, params }: Route.LoaderArgs) {
  const entry = await lessonForViewer(db(), params.slug, await getOptionalUser(request));
  const lesson = entry?.lesson;
  if (!lesson) return jsonError(404, `There is no lesson "${params.slug.slice(0, 100)}".`);
  const view = lessonView(lesson);
  return Response.json({
    lesson: {
      ...view,
      // Figures as their specs: clients draw them with the analysis API.
      blocks: view.blocks.map((b) =>
        b.type === "roof" ? { type: "roof", caption: b.figure.caption, view: b.figure.view, spec: b.figure.spec } : b,
      ),
      // An as-built task's design figure, likewise as its spec (the design itself is in `design`).
      task: view.task.kind === "as-built" ? (({ figure: _figure, ...rest }) => rest)(view.task) : view.task,
    },
  });
}
