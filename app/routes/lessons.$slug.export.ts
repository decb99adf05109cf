import type { Route } from "./+types/lessons.$slug.export";
import { getOptionalUser } from "~/lib/auth.server";
import { db } from "~/lib/db.server";
import { exportLesson } from "~/lib/lessons/authoring.server";

/**
 * GET /lessons/:slug/export: the lesson as a lesson file (Markdown with front matter, the format
 * of `lessons/`, lessons/README.md), for anyone who may see the lesson; 404 otherwise.
 */
export async function loader({ request, params }: Route.LoaderArgs) {
  const file = await exportLesson(db(), params.slug, await getOptionalUser(request));
  if (!file)
    return new Response("No lesson with that name.", { status: 404, headers: { "Content-Type": "text/plain" } });
  return new Response(file.source, {
    headers: {
      "Content-Type": "text/markdown; charset=utf-8",
      "Content-Disposition": `attachment; filename="${file.fileName}"`,
      "Cache-Control": "private, no-store",
    },
  });
}
