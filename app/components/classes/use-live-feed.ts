import { useEffect, useRef, useState } from "react";

/** What the presenter sends (app/lib/live.server.ts LiveContent). */
export interface LiveContentView {
  spec: unknown;
  title: string;
  source: string;
  deck?: string;
  step: { index: number; count: number } | null;
  presenter: string;
  at: string;
}

/** Where the session stands (app/lib/live.server.ts LivePhase). */
export type LivePhaseView = "idle" | "live" | "paused" | "ended";

export interface LiveFeed {
  status: "connecting" | "connected" | "reconnecting";
  seq: number | null;
  state: LiveContentView | null;
  phase: LivePhaseView | null;
  /** Times the stream was (re)opened; shown to nobody, read by tests. */
  opens: number;
}

// Heartbeats come every 15 s; nothing for this long means the connection died silently.
const STALL_MS = 40_000;
const REOPEN_MS = 1_500;

/**
 * Follows /classes/:id/live with EventSource, which reconnects by itself and sends the last
 * event id so the server catches us up. When the browser gives up (an error page, a server
 * restart answering 503) or the stream stalls, a fresh EventSource is opened with the last id.
 */
export function useLiveFeed(classId: string): LiveFeed {
  const [feed, setFeed] = useState<LiveFeed>({
    status: "connecting",
    seq: null,
    state: null,
    phase: null,
    opens: 0,
  });
  const lastSeq = useRef<number | null>(null);

  useEffect(() => {
    let source: EventSource | null = null;
    let stopped = false;
    let reopen: ReturnType<typeof setTimeout> | null = null;
    let stall: ReturnType<typeof setTimeout> | null = null;

    const armStallTimer = () => {
      if (stall) clearTimeout(stall);
      stall = setTimeout(() => restart(), STALL_MS);
    };
    const restart = () => {
      source?.close();
      source = null;
      if (stopped) return;
      setFeed((f) => ({ ...f, status: "reconnecting" }));
      if (reopen) clearTimeout(reopen);
      reopen = setTimeout(open, REOPEN_MS);
    };
    function open() {
      if (stopped) return;
      const q = lastSeq.current !== null ? `?lastEventId=${lastSeq.current}` : "";
      const es = new EventSource(`/classes/${classId}/live${q}`);
      source = es;
      es.onopen = () => {
        armStallTimer();
        setFeed((f) => ({ ...f, status: "connected", opens: f.opens + 1 }));
      };
      es.onerror = () => {
        if (es.readyState === EventSource.CLOSED) restart();
        else setFeed((f) => ({ ...f, status: "reconnecting" }));
      };
      es.addEventListener("ping", armStallTimer);
      es.addEventListener("state", (e) => {
        armStallTimer();
        let msg: { seq: number; state: LiveContentView | null; phase?: LivePhaseView };
        try {
          msg = JSON.parse((e as MessageEvent<string>).data);
        } catch {
          return;
        }
        lastSeq.current = msg.seq;
        setFeed((f) => ({
          ...f,
          status: "connected",
          seq: msg.seq,
          state: msg.state,
          phase: msg.phase ?? (msg.state ? "live" : "idle"),
        }));
      });
    }
    // The browser knows the network went away before the stream notices: say so at once, and come
    // back (with the last id, so the server catches us up) as soon as it returns.
    const offline = () => {
      if (stall) clearTimeout(stall);
      restart();
    };
    const online = () => {
      if (reopen) clearTimeout(reopen);
      source?.close();
      open();
    };
    window.addEventListener("offline", offline);
    window.addEventListener("online", online);
    open();
    return () => {
      window.removeEventListener("offline", offline);
      window.removeEventListener("online", online);
      stopped = true;
      if (reopen) clearTimeout(reopen);
      if (stall) clearTimeout(stall);
      source?.close();
    };
  }, [classId]);

  return feed;
}
