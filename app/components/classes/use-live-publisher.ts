import { useCallback, useEffect, useRef, useState } from "react";

export interface LiveUpdateBody {
  spec: unknown;
  title: string;
  source: string;
  deck: string;
  step: { index: number; count: number } | null;
}

/** Pause, resume or end the session (POST /classes/:id/live with only a phase). */
export interface PhaseBody {
  phase: "live" | "paused" | "ended";
}

type Body = LiveUpdateBody | PhaseBody;

export interface PublishStatus {
  state: "idle" | "sending" | "sent" | "error";
  seq: number | null;
  message: string | null;
}

// At most this often while the trainer drags: followers still see motion, the database is spared.
const MIN_INTERVAL_MS = 100;

const isPhase = (b: Body): b is PhaseBody => "phase" in b;

/**
 * The one request every message of this hook makes: POST /classes/:id/live with a JSON body.
 * `keepalive` lets it outlive the page (a tab closing). Rejects only when nothing reached the server.
 */
function postLive(classId: string, body: Body, { keepalive = false }: { keepalive?: boolean } = {}) {
  return fetch(`/classes/${classId}/live`, {
    method: "POST",
    keepalive,
    headers: { "Content-Type": "application/json", Accept: "application/json" },
    body: JSON.stringify(body),
  });
}

/**
 * Sends the presenter's roof to /classes/:id/live. One request at a time, in order; roof updates
 * waiting behind a request collapse into the newest, so followers never see an older roof after a
 * newer one, while a pause or an end is never dropped. `liveSeq`: what is already live when the
 * page opens (a presenter who reloaded). `end()` stops sending and ends the session.
 */
export function useLivePublisher(classId: string, liveSeq: number | null = null) {
  const [status, setStatus] = useState<PublishStatus>({
    state: liveSeq === null ? "idle" : "sent",
    seq: liveSeq,
    message: null,
  });
  const pending = useRef<Body[]>([]);
  const busy = useRef<Promise<void> | null>(null);
  const ended = useRef(false);
  const lastSent = useRef(0);
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);

  const send = useCallback(
    async (body: Body): Promise<boolean> => {
      setStatus((s) => ({ ...s, state: "sending" }));
      try {
        const res = await postLive(classId, body);
        const json = (await res.json().catch(() => null)) as { seq?: number; error?: { message?: string } } | null;
        if (res.ok && typeof json?.seq === "number") {
          setStatus({ state: "sent", seq: json.seq, message: null });
          return true;
        }
        setStatus((s) => ({
          ...s,
          state: "error",
          message: json?.error?.message ?? `The server answered ${res.status}.`,
        }));
        return true;
      } catch {
        setStatus((s) => ({
          ...s,
          state: "error",
          message: "No connection to the server. Changes are sent again when it is back.",
        }));
        return false;
      }
    },
    [classId],
  );

  const flush = useCallback(async () => {
    if (busy.current || !pending.current.length) return;
    const wait = lastSent.current + MIN_INTERVAL_MS - Date.now();
    if (wait > 0) {
      timer.current ??= setTimeout(() => {
        timer.current = null;
        void flush();
      }, wait);
      return;
    }
    const body = pending.current.shift()!;
    lastSent.current = Date.now();
    let delivered = true;
    busy.current = (async () => {
      delivered = await send(body);
    })();
    await busy.current;
    busy.current = null;
    if (!delivered && !ended.current) {
      // Offline: try again; a newer roof update waiting meanwhile replaces this one.
      if (!pending.current.length || isPhase(body)) pending.current.unshift(body);
      timer.current ??= setTimeout(() => {
        timer.current = null;
        void flush();
      }, 2000);
      return;
    }
    if (pending.current.length) void flush();
  }, [send]);

  const enqueue = useCallback(
    (body: Body) => {
      if (ended.current) return;
      const q = pending.current;
      const last = q[q.length - 1];
      if (last && !isPhase(last) && !isPhase(body)) q[q.length - 1] = body;
      else q.push(body);
      void flush();
    },
    [flush],
  );

  const publish = useCallback((body: LiveUpdateBody) => enqueue(body), [enqueue]);
  const setPhase = useCallback((phase: "live" | "paused") => enqueue({ phase }), [enqueue]);

  /** Ends the session: nothing more goes out from this page. Resolves true once the server has it. */
  const end = useCallback(async (): Promise<boolean> => {
    ended.current = true;
    pending.current = [];
    if (timer.current) clearTimeout(timer.current);
    timer.current = null;
    while (busy.current) await busy.current;
    const res = await postLive(classId, { phase: "ended" }).catch(() => null);
    if (res?.ok) return true;
    ended.current = false;
    setStatus((s) => ({
      ...s,
      state: "error",
      message: res ? `Could not end the session (the server answered ${res.status}).` : "No connection to the server.",
    }));
    return false;
  }, [classId]);

  useEffect(
    () => () => {
      if (timer.current) clearTimeout(timer.current);
    },
    [],
  );

  // The presenter's tab closes or goes elsewhere without "Stop presenting": the session is paused,
  // so followers are not left reading "live" under a screen nobody drives. `keepalive` lets the
  // request outlive the page. Coming back (or reloading) finds it paused, ready to resume.
  useEffect(() => {
    const onHide = () => {
      if (ended.current || (lastSent.current === 0 && liveSeq === null)) return;
      void postLive(classId, { phase: "paused" }, { keepalive: true }).catch(() => undefined);
    };
    window.addEventListener("pagehide", onHide);
    return () => window.removeEventListener("pagehide", onHide);
  }, [classId, liveSeq]);

  return { publish, setPhase, end, status };
}
