import type { Route } from "./+types/classes.$id.gradebook-csv";
import { getOptionalUser } from "~/lib/auth.server";
import { getClassFor } from "~/lib/classes.server";
import { classGradebook, gradebookCsv } from "~/lib/gradebook.server";
import { can } from "~/lib/permissions";

function fileName(name: string) {
  const slug =
    name
      .toLowerCase()
      .normalize("NFKD")
      .replace(/[^a-z0-9]+/g, "-")
      .replace(/^-|-$/g, "")
      .slice(0, 60) || "class";
  return `${slug}-gradebook.csv`;
}

/** GET /classes/:id/gradebook.csv: the class's gradebook with the grades that count (overrides included). */
export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await getOptionalUser(request);
  if (!user)
    return new Response("Sign in first.", { status: 401, headers: { "Content-Type": "text/plain; charset=utf-8" } });
  if (!can(user.role, "gradebook:view"))
    return new Response("Your account cannot see gradebooks.", {
      status: 403,
      headers: { "Content-Type": "text/plain; charset=utf-8" },
    });
  const cls = await getClassFor(user, params.id, "manage");
  if (!cls)
    return new Response("No such class among yours.", {
      status: 404,
      headers: { "Content-Type": "text/plain; charset=utf-8" },
    });
  const csv = gradebookCsv(await classGradebook(cls));
  // A byte-order mark so spreadsheet programs read names with accents as UTF-8.
  return new Response(`\uFEFF${csv}\r\n`, {
    headers: {
      "Content-Type": "text/csv; charset=utf-8",
      "Content-Disposition": `attachment; filename="${fileName(cls.name)}"`,
      "Cache-Control": "private, no-store",
    },
  });
}
