import type { Route } from "./+types/classes.$id.live";
import { getOptionalUser } from "~/lib/auth.server";
import { getClassFor } from "~/lib/classes.server";
import { jsonError, readJsonBody } from "~/lib/json-api.server";
import { parseLiveUpdate, parsePhaseChange } from "~/lib/live-update.server";
import {
  liveFrame,
  liveHub,
  publishLiveState,
  readLiveState,
  setLivePhase,
  type LiveSnapshot,
} from "~/lib/live.server";
import { eventStreamResponse } from "~/lib/sse.server";

/**
 * GET: the class's live roof as server-sent events (`id: <seq>`, event `state`). The current
 * state goes out at once unless the client's Last-Event-ID says it already has it; then every
 * change; a ping event every 15 s keeps proxies from closing the stream.
 */
export async function loader({ request, params }: Route.LoaderArgs) {
  const user = await getOptionalUser(request);
  if (!user) return new Response("Sign in first.", { status: 401 });
  const cls = await getClassFor(user, params.id, "follow");
  if (!cls) return new Response("No such class among yours.", { status: 404 });
  // The header on EventSource's own reconnects; the query when the page opens a fresh EventSource.
  const lastHeader = request.headers.get("last-event-id") ?? new URL(request.url).searchParams.get("lastEventId");
  const last = lastHeader && /^\d{1,12}$/.test(lastHeader) ? Number(lastHeader) : -1;
  const hub = liveHub();

  return eventStreamResponse(
    request,
    (end) => hub.trackStream(end),
    async (stream) => {
      let sent = last;
      const deliver = (snap: LiveSnapshot) => {
        if (snap.seq <= sent) return;
        sent = snap.seq;
        stream.send(liveFrame(snap));
      };
      const sub = hub.subscribe(cls.id, deliver);
      stream.onClose(sub.unsubscribe);
      await sub.ready;
      try {
        const snap = await readLiveState(cls.id);
        if (!snap) return stream.close();
        // A Last-Event-ID from the future (the database was restored): start over from what is there.
        if (snap.seq < last) sent = Math.min(sent, snap.seq - 1);
        if (snap.seq > sent) deliver(snap);
        else stream.send(": up to date\n\n");
      } catch {
        // The database is away: end the stream; EventSource comes back and catches up.
        stream.close();
      }
    },
  );
}

/**
 * POST {spec, title, source, deck, step}: the presenting trainer changes the live roof (and the
 * session is live). POST {phase: "paused" | "live" | "ended"}: pauses, resumes or ends the session.
 */
export async function action({ request, params }: Route.ActionArgs) {
  if (request.method !== "POST") return jsonError(405, "Use POST here.", [], { Allow: "GET, POST" });
  const user = await getOptionalUser(request);
  if (!user) return jsonError(401, "Sign in first.");
  const cls = await getClassFor(user, params.id, "manage");
  if (!cls) return jsonError(404, "No such class among yours.");
  const body = await readJsonBody(request, 512 * 1024);
  if (!body.ok) return body.response;
  const phase = parsePhaseChange(body.value);
  if (phase) {
    if (!phase.ok) return phase.response;
    const changed = await setLivePhase(cls.id, phase.phase);
    if (changed.ok) return Response.json({ seq: changed.seq, phase: phase.phase });
    if (changed.reason === "missing") return jsonError(404, "No such class among yours.");
    return jsonError(
      409,
      `Nothing to ${phase.phase === "live" ? "resume" : "pause"}: the class is not being presented.`,
      [{ path: "phase", message: `the session is ${changed.phase === "idle" ? "not started" : changed.phase}` }],
    );
  }
  const update = parseLiveUpdate(body.value);
  if (!update.ok) return update.response;
  const seq = await publishLiveState(cls.id, {
    ...update.value,
    presenter: user.name || user.email,
    at: new Date().toISOString(),
  });
  if (seq === null) return jsonError(404, "No such class among yours.");
  return Response.json({ seq });
}
