import { data, redirect } from "react-router";
import type { Route } from "./+types/roofs.$id";
import { GeneralErrorBoundary } from "~/components/error-boundary";
import { RoofEditor } from "~/components/roofs/roof-editor";
import { listChecks } from "~/lib/as-built-checks.server";
import { requirePermission } from "~/lib/auth.server";
import { underlaySettingsSchema, type UnderlaySettings } from "~/lib/roof-file";
import { roofIntentSchema } from "~/lib/roof-page";
import { duplicateRoof, getRoofFor, listVersions, restoreVersion, setShared, setUnderlay } from "~/lib/roofs.server";
import { createShareLink, listShareLinks, MAX_LINKS_PER_ROOF, revokeShareLink } from "~/lib/share-links.server";
import { underlayUrl } from "~/lib/underlay";

export const meta: Route.MetaFunction = ({ data }) => [{ title: `${data?.roof.name ?? "Roof"} · Fallwright` }];

export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await requirePermission(request, "roofs:own");
  const roof = await getRoofFor(user, params.id);
  if (!roof) throw data("No roof with that id in your library.", { status: 404 });
  // The three lists are independent: asked for together, not one after another.
  const [versions, shareLinks, checks] = await Promise.all([
    roof.canEdit ? listVersions(roof.id) : [],
    roof.canEdit ? listShareLinks(roof.id) : [],
    listChecks(roof.id),
  ]);
  return {
    roof: {
      id: roof.id,
      name: roof.name,
      version: roof.version,
      shared: roof.shared,
      canEdit: roof.canEdit,
      ownerName: roof.ownerName,
      spec: roof.spec,
    },
    underlay: roof.underlay,
    underlayUrl: roof.underlayId ? underlayUrl(roof.id, roof.underlayId) : null,
    versions,
    shareLinks,
    checks,
  };
}

export async function action({ request, params }: Route.ActionArgs) {
  const user = await requirePermission(request, "roofs:own");
  const parsed = roofIntentSchema.safeParse(Object.fromEntries(await request.formData()));
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    return data(
      { error: `That request was malformed: the field "${String(issue.path[0] ?? "intent")}" ${issue.message}.` },
      { status: 400 },
    );
  }
  const input = parsed.data;
  const notFound = () => data("No roof with that id in your library.", { status: 404 });
  switch (input.intent) {
    case "share": {
      const result = await setShared(user, params.id, input.shared === "true");
      if (result !== "ok")
        throw result === "forbidden" ? data("Only the owner can share this roof.", { status: 403 }) : notFound();
      return { shared: input.shared === "true" };
    }
    case "underlay": {
      let settings: UnderlaySettings;
      try {
        settings = underlaySettingsSchema.parse(JSON.parse(input.settings));
      } catch {
        return data({ error: "The underlay placement was not valid." }, { status: 400 });
      }
      const result = await setUnderlay(user, params.id, { settings });
      if (result !== "ok")
        throw result === "forbidden" ? data("Only the owner can move the underlay.", { status: 403 }) : notFound();
      return { underlay: settings };
    }
    case "restore-version": {
      const result = await restoreVersion(user, params.id, input.version, input.expected);
      if (result.status === "not-found") throw notFound();
      if (result.status === "forbidden") throw data("Only the owner can restore versions.", { status: 403 });
      if (result.status === "conflict") return data({ conflict: result.current }, { status: 409 });
      const roof = await getRoofFor(user, params.id);
      return { restored: { version: result.version, spec: roof!.spec, name: roof!.name, from: input.version } };
    }
    case "share-link-create": {
      const made = await createShareLink(user, params.id);
      if (made.status === "forbidden") throw data("Only the owner can share this roof by link.", { status: 403 });
      if (made.status === "not-found") throw notFound();
      if (made.status !== "ok")
        return data(
          { error: `A roof can have at most ${MAX_LINKS_PER_ROOF} links at once: revoke one first.` },
          { status: 409 },
        );
      return { shareLink: { id: made.id, path: `/s/${made.token}` } };
    }
    case "share-link-revoke": {
      const result = await revokeShareLink(user, params.id, input.linkId);
      if (result === "forbidden") throw data("Only the owner can revoke this roof's links.", { status: 403 });
      if (result === "not-found")
        return data({ error: "That link was not found; it may have been revoked already." }, { status: 404 });
      return { revoked: input.linkId };
    }
    case "duplicate": {
      const copy = await duplicateRoof(user, params.id, input.name);
      if (!copy) throw notFound();
      return redirect(`/roofs/${copy.id}?copied=1`);
    }
  }
}

export default function RoofPage({ loaderData }: Route.ComponentProps) {
  // A different roof is a different editor: never carry drafts across.
  return <RoofEditor key={loaderData.roof.id} {...loaderData} />;
}

export function ErrorBoundary() {
  return <GeneralErrorBoundary />;
}
