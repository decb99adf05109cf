import { useCallback, useEffect, useRef, useState } from "react";

export interface LiveUpdateBody {
  spec: unknown;
  title: string;
  source: string;
  deck: string;
  step: { index: number; count: number } | null;
}

export interface PublishStatus {
  state: "idle" | "sending" | "sent" | "error";
  seq: number | null;
  message: string | null;
}

// At most this often while the trainer drags: followers still see motion, the database is spared.
const MIN_INTERVAL_MS = 100;

/**
 * Sends the presenter's roof to /classes/:id/live. One request at a time; while one is on the
 * way only the newest update waits, so followers never see an older roof after a newer one.
 * `liveSeq`: what is already live when the page opens (a presenter who reloaded).
 */
export function useLivePublisher(classId: string, liveSeq: number | null = null) {
  const [status, setStatus] = useState<PublishStatus>({
    state: liveSeq === null ? "idle" : "sent",
    seq: liveSeq,
    message: null,
  });
  const pending = useRef<LiveUpdateBody | null>(null);
  const busy = useRef(false);
  const lastSent = useRef(0);
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);

  const flush = useCallback(async () => {
    if (busy.current || !pending.current) return;
    const wait = lastSent.current + MIN_INTERVAL_MS - Date.now();
    if (wait > 0) {
      timer.current ??= setTimeout(() => {
        timer.current = null;
        void flush();
      }, wait);
      return;
    }
    const body = pending.current;
    pending.current = null;
    busy.current = true;
    lastSent.current = Date.now();
    setStatus((s) => ({ ...s, state: "sending" }));
    try {
      const res = await fetch(`/classes/${classId}/live`, {
        method: "POST",
        headers: { "Content-Type": "application/json", Accept: "application/json" },
        body: JSON.stringify(body),
      });
      const json = (await res.json().catch(() => null)) as { seq?: number; error?: { message?: string } } | null;
      if (res.ok && typeof json?.seq === "number") setStatus({ state: "sent", seq: json.seq, message: null });
      else
        setStatus((s) => ({
          ...s,
          state: "error",
          message: json?.error?.message ?? `The server answered ${res.status}.`,
        }));
    } catch {
      setStatus((s) => ({
        ...s,
        state: "error",
        message: "No connection to the server. Changes are sent again when it is back.",
      }));
      pending.current ??= body;
      timer.current ??= setTimeout(() => {
        timer.current = null;
        void flush();
      }, 2000);
    } finally {
      busy.current = false;
    }
    if (pending.current) void flush();
  }, [classId]);

  const publish = useCallback(
    (body: LiveUpdateBody) => {
      pending.current = body;
      void flush();
    },
    [flush],
  );

  useEffect(
    () => () => {
      if (timer.current) clearTimeout(timer.current);
    },
    [],
  );

  return { publish, status };
}
