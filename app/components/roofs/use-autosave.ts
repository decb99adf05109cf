import { useCallback, useEffect, useRef, useState } from "react";
import type { RoofSpec } from "~/engine";
import type { RoofSnapshot } from "~/lib/roof-page";

export type { RoofSnapshot };

export type SaveState =
  | { kind: "saved"; version: number }
  | { kind: "pending" }
  | { kind: "saving" }
  | { kind: "offline"; retryAt: number }
  | { kind: "invalid"; message: string }
  | { kind: "conflict"; current: RoofSnapshot }
  | { kind: "error"; message: string };

interface Draft {
  spec?: RoofSpec;
  name?: string;
}

const RETRY_MS = [2_000, 5_000, 10_000, 30_000];

/**
 * Saves edits through PUT /api/v1/roofs/:id after a pause in typing or dragging, always naming
 * the version they started from. A 409 stops saving and hands back the winner; a lost
 * connection keeps the draft and retries; nothing typed is dropped on any path.
 */
export function useAutosave(roofId: string, initialVersion: number, { delayMs = 800, enabled = true } = {}) {
  const [state, setState] = useState<SaveState>({ kind: "saved", version: initialVersion });
  const version = useRef(initialVersion);
  const draft = useRef<Draft | null>(null);
  const inFlight = useRef(false);
  const blocked = useRef(false);
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const attempt = useRef(0);

  const saveRef = useRef<() => Promise<void>>(async () => {});
  const schedule = useCallback((ms: number) => {
    if (timer.current) clearTimeout(timer.current);
    timer.current = setTimeout(() => void saveRef.current(), ms);
  }, []);

  const save = useCallback(async () => {
    timer.current = null;
    if (inFlight.current || blocked.current || !draft.current) return;
    const sending = draft.current;
    draft.current = null;
    inFlight.current = true;
    setState({ kind: "saving" });
    const putBack = () => {
      draft.current = { ...sending, ...draft.current };
    };
    let res: Response;
    try {
      res = await fetch(`/api/v1/roofs/${roofId}`, {
        method: "PUT",
        headers: { "Content-Type": "application/json", Accept: "application/json" },
        body: JSON.stringify({ ...sending, version: version.current }),
      });
    } catch {
      res = new Response(null, { status: 599 });
    }
    inFlight.current = false;
    const body = await res.json().catch(() => null);
    if (res.ok) {
      version.current = body.version;
      attempt.current = 0;
      if (draft.current) {
        setState({ kind: "pending" });
        schedule(50);
      } else {
        setState({ kind: "saved", version: body.version });
      }
      return;
    }
    putBack();
    if (res.status === 409 && body?.current) {
      blocked.current = true;
      setState({ kind: "conflict", current: body.current });
    } else if (res.status === 400 || res.status === 422) {
      setState({ kind: "invalid", message: body?.error?.message ?? "The roof cannot be saved as it is." });
    } else if (res.status === 401 || res.status === 403 || res.status === 404) {
      setState({ kind: "error", message: body?.error?.message ?? "You can no longer save this roof." });
    } else {
      const wait = RETRY_MS[Math.min(attempt.current, RETRY_MS.length - 1)];
      attempt.current++;
      setState({ kind: "offline", retryAt: Date.now() + wait });
      schedule(wait);
    }
  }, [roofId, schedule]);
  saveRef.current = save;

  /** Records an edit; it is sent after `delayMs` without further edits. */
  const queue = useCallback(
    (change: Draft) => {
      if (!enabled) return;
      draft.current = { ...draft.current, ...change };
      if (blocked.current) return;
      setState((s) => (s.kind === "saving" ? s : { kind: "pending" }));
      schedule(delayMs);
    },
    [delayMs, enabled, schedule],
  );

  /** After "reload theirs" (or a restore done on the server): start again from that version. */
  const adopt = useCallback((v: number) => {
    if (timer.current) clearTimeout(timer.current);
    version.current = v;
    draft.current = null;
    blocked.current = false;
    attempt.current = 0;
    setState({ kind: "saved", version: v });
  }, []);

  useEffect(() => {
    const retryNow = () => {
      if (draft.current && !blocked.current) schedule(0);
    };
    const warn = (e: BeforeUnloadEvent) => {
      if (draft.current || inFlight.current) e.preventDefault();
    };
    window.addEventListener("online", retryNow);
    window.addEventListener("beforeunload", warn);
    return () => {
      window.removeEventListener("online", retryNow);
      window.removeEventListener("beforeunload", warn);
      if (timer.current) clearTimeout(timer.current);
    };
  }, [schedule]);

  return { state, queue, adopt, saveNow: () => schedule(0), currentVersion: () => version.current };
}
