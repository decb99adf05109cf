import type { Route } from "./+types/classes.$id.hand-ups";
import { getOptionalUser } from "~/lib/auth.server";
import { canManageClass, getClassFor, isMember } from "~/lib/classes.server";
import { handUpFigures, parseHandUp, raiseHand, readWall, sessionPhase, type Wall } from "~/lib/hand-ups.server";
import { jsonError, readJsonBody } from "~/lib/json-api.server";
import { liveHub } from "~/lib/live.server";
import { can } from "~/lib/permissions";
import { eventStreamResponse, wantsEventStream } from "~/lib/sse.server";

const wallFrame = (wall: Wall) => `id: ${wall.wallSeq}\nevent: wall\ndata: ${JSON.stringify(wall)}\n\n`;

/**
 * GET: the class's wall of hands up, for its trainer only: JSON, or server-sent events (`wall`,
 * at once and after every change) when asked with Accept: text/event-stream.
 */
export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await getOptionalUser(request);
  if (!user) return jsonError(401, "Sign in first.");
  const cls = await getClassFor(user, params.id, "follow");
  if (!cls) return jsonError(404, "No such class among yours.");
  if (!canManageClass(user, cls)) return jsonError(403, "Only the class's trainer sees the hands up.");
  if (!wantsEventStream(request)) {
    const wall = await readWall(cls.id);
    return wall ? Response.json(wall) : jsonError(404, "No such class among yours.");
  }

  const hub = liveHub();
  return eventStreamResponse(
    request,
    (end) => hub.trackStream(end),
    async (stream) => {
      let sent = -1;
      let reading: Promise<void> | null = null;
      let again = false;
      // One read at a time; a notice during a read reads once more afterwards.
      const refresh = () => {
        if (reading) {
          again = true;
          return;
        }
        reading = (async () => {
          do {
            again = false;
            try {
              const wall = await readWall(cls.id);
              if (!wall) return stream.close();
              if (wall.wallSeq !== sent) {
                sent = wall.wallSeq;
                stream.send(wallFrame(wall));
              }
            } catch {
              return stream.close();
            }
          } while (again && stream.isOpen);
        })().finally(() => {
          reading = null;
        });
      };
      const sub = hub.subscribeWall(cls.id, refresh);
      stream.onClose(sub.unsubscribe);
      await sub.ready;
      refresh();
    },
  );
}

/** POST {spec, title}: a trainee of the class hands up a roof while the trainer presents. */
export async function action({ request, params }: Route.ActionArgs) {
  if (request.method !== "POST") return jsonError(405, "Use POST here.", [], { Allow: "GET, POST" });
  const user = await getOptionalUser(request);
  if (!user) return jsonError(401, "Sign in first.");
  const cls = await getClassFor(user, params.id, "follow");
  if (!cls) return jsonError(404, "No such class among yours.");
  if (!can(user.role, "classes:hand-up") || !(await isMember(cls.id, user.id)))
    return jsonError(403, "Only trainees of this class hand up a roof.");
  const body = await readJsonBody(request, 512 * 1024);
  if (!body.ok) return body.response;
  const input = parseHandUp(body.value);
  if (!input.ok) return input.response;
  const phase = await sessionPhase(cls.id);
  if (phase !== "live" && phase !== "paused")
    return jsonError(409, "Hands go up while the trainer presents; the class is not being presented now.", [
      { path: "(session)", message: phase === "ended" ? "the trainer stopped presenting" : "not started" },
    ]);
  const figures = await handUpFigures(input.spec);
  if (figures instanceof Response) return figures;
  const raised = await raiseHand(cls.id, user.id, { title: input.title, spec: input.spec, figures });
  return Response.json(raised, { status: 201 });
}
