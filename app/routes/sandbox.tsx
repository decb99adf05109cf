/**
 * /sandbox: shape a roof without an account (nothing is saved on the server).
 *
 * Interface for other pages (saved roofs /roofs/:id, the lesson player, classroom follow):
 *   import { SandboxWorkspace } from "~/components/sandbox/workspace";
 *   <SandboxWorkspace
 *     initialSpec={spec}          // RoofSpec, read once on mount (remount with a new `key` to load another roof)
 *     onSpecChange={(spec) => …}  // after every change: edits, undo/redo, replaceSpec
 *     readOnly={false}            // view only: no handles, inputs or apply buttons (may change while mounted)
 *     underlay={{ url, opacity, originX, originY, metresPerPixel, widthPx, heightPx }}
 *                                 // optional plan image under the outline; pixel (0,0) = image top-left at plan
 *                                 // point (originX, originY) m; plan y points up (see components/sandbox/plan/underlay.ts)
 *     toolbarExtra={<MyButtons />}// rendered in the toolbar, inside the store's provider
 *     initialView={{ mode: "side-by-side" }} // optional opening view settings
 *   />
 * Inside toolbarExtra (or any child of the provider), `useSandboxStore()` from
 * ~/components/sandbox/store gives the store: `getState().spec`, `getState().replaceSpec(spec,
 * { resetHistory? })` (undoable unless resetHistory), `getState().analysis`; `useSandbox(selector)`
 * subscribes (select primitives or use useShallow).
 *
 * This page opens the demo roof, or the roof in `?spec=` (base64url JSON, as the classroom's
 * "copy to my sandbox" link sends it), and keeps unsaved edits in this tab's sessionStorage.
 */
import { data, useRouteLoaderData } from "react-router";
import type { Route } from "./+types/sandbox";
import { GeneralErrorBoundary } from "~/components/error-boundary";
import { DEMO_ROOF } from "~/components/sandbox/state/demo-roof";
import { readLinkedSpec } from "~/lib/linked-spec.server";
import { ResetRoofButton } from "~/components/sandbox/inputs/reset-roof-button";
import { SandboxWorkspace } from "~/components/sandbox/workspace";
import { SaveToLibrary } from "~/components/roofs/save-to-library";
import { can } from "~/lib/permissions";
import { MakeTaskLink } from "~/components/lessons/make-task-link";
import type { loader as shellLoader } from "./_shell";

export const meta: Route.MetaFunction = () => [
  { title: "Sandbox · Fallwright" },
  {
    name: "description",
    content: "Draw a parapet roof, place its outlets and see the warped surface, its falls and its water in 3D.",
  },
];

export async function loader({ request }: Route.LoaderArgs) {
  const linked = readLinkedSpec(new URL(request.url));
  if (linked.error) return data({ linked: null, linkError: linked.error.message }, { status: linked.error.status });
  return { linked: linked.spec, linkError: null };
}

/** "Make this roof a task", for those who write lessons. */
function AuthorTask() {
  const shell = useRouteLoaderData<typeof shellLoader>("routes/_shell");
  return can(shell?.user?.role, "lessons:author") ? <MakeTaskLink /> : null;
}

function StartOver() {
  return (
    <ResetRoofButton spec={DEMO_ROOF} notice="Back to the demo roof (Undo returns yours).">
      Start over
    </ResetRoofButton>
  );
}

/** What happens to the roof on screen, for who is looking. */
function SavedNote() {
  const shell = useRouteLoaderData<typeof shellLoader>("routes/_shell");
  const user = shell?.user;
  let text = "Nothing here is saved on the server. Sign in to keep roofs in your library.";
  if (user && can(user.role, "roofs:own"))
    text = "This roof is kept in this browser tab only until you press “Save to my roofs”.";
  else if (user) text = "This roof is kept in this browser tab only; your role has no roof library.";
  return (
    <p className="text-sm text-ink-soft" data-testid="sandbox-saved-note">
      {text}
    </p>
  );
}

export default function Sandbox({ loaderData }: Route.ComponentProps) {
  const { linked, linkError } = loaderData;
  return (
    <div className="grid gap-3">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h1 className="text-2xl font-bold tracking-tight">Sandbox</h1>
        <SavedNote />
      </div>
      {linkError && (
        <p role="alert" className="rounded border border-bad/50 bg-accent-wash px-3 py-2 text-sm">
          {linkError} The demo roof is open instead.
        </p>
      )}
      <SandboxWorkspace
        initialSpec={linked ?? DEMO_ROOF}
        restoreKey="fallwright:sandbox"
        restore={!linked}
        toolbarExtra={
          <>
            <StartOver />
            <SaveToLibrary />
            <AuthorTask />
          </>
        }
      />
    </div>
  );
}

export function ErrorBoundary() {
  return <GeneralErrorBoundary />;
}
