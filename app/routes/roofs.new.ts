/**
 * POST /roofs/new (form fields `name`, `spec` as JSON text, optional `idempotencyKey` so a double
 * click saves once): saves the sandbox's roof to my library
 * and goes to it. Failures answer 400/422 with {error: {message, issues}} and what was typed, so
 * a fetcher on the sandbox can show them. A GET here just goes back to the sandbox.
 */
import { data, redirect } from "react-router";
import type { Route } from "./+types/roofs.new";
import { requirePermission } from "~/lib/auth.server";
import { readFormCapped } from "~/lib/json-api.server";
import { ROOF_BODY_LIMIT, parseRoofWrite } from "~/lib/roofs-api.server";
import { createRoof, idempotencyKeySchema } from "~/lib/roofs.server";
import { keyReusedMessage } from "~/lib/idempotency.server";

export function loader() {
  return redirect("/sandbox");
}

export async function action({ request }: Route.ActionArgs) {
  const user = await requirePermission(request, "roofs:own");
  const read = await readFormCapped(request, ROOF_BODY_LIMIT);
  if (!read.ok) {
    const message =
      read.status === 413 ? "This roof is too large to save (over 256 kB)." : "The save request could not be read.";
    return data({ error: { message, issues: [] }, name: "" }, { status: read.status });
  }
  const name = String(read.form.get("name") ?? "").trim() || "Untitled roof";
  let spec: unknown;
  try {
    spec = JSON.parse(String(read.form.get("spec") ?? ""));
  } catch {
    return data(
      {
        error: {
          message: "The roof could not be read (spec is not JSON).",
          issues: [{ path: "spec", message: "is not JSON" }],
        },
        name,
      },
      { status: 400 },
    );
  }
  const input = parseRoofWrite({ name, spec }, "create");
  if (!input.ok)
    return data({ error: { message: input.message, issues: input.issues }, name }, { status: input.status });
  const key = idempotencyKeySchema.safeParse(read.form.get("idempotencyKey"));
  const created = await createRoof(user, {
    name: input.name,
    spec: input.spec,
    idempotencyKey: key.success ? key.data : null,
  });
  if ("keyReused" in created) {
    return data(
      {
        error: {
          message: keyReusedMessage(created.keyReused),
          issues: [{ path: "idempotencyKey", message: "was already used for a different roof" }],
        },
        name,
      },
      { status: 422 },
    );
  }
  return redirect(`/roofs/${created.id}?saved=1`);
}
