/**
 * Server-sent events: the stream set-up the live routes share (a `retry` hint, a ping event every
 * 15 s, ending on the client's abort, on a failed write or at shutdown). The route says what to
 * follow and what to send; see docs/decisions/0006-live-feed-over-listen-notify.md.
 */

const encoder = new TextEncoder();
export const SSE_HEARTBEAT_MS = 15_000;
// An event (not a comment) so the page can tell a stalled stream from a quiet one.
const HEARTBEAT = encoder.encode("event: ping\ndata: {}\n\n");
// Reconnect quickly after a drop (browsers wait about 3 s by default).
const RETRY = encoder.encode("retry: 1000\n\n");

export const SSE_HEADERS = {
  "Content-Type": "text/event-stream; charset=utf-8",
  "Cache-Control": "no-cache, no-transform",
  "X-Accel-Buffering": "no",
} as const;

export interface SseStream {
  /** Sends a frame (text or the bytes of an encoded frame); nothing once the stream is closed. */
  send(frame: string | Uint8Array): void;
  /** Ends the stream; runs the registered teardowns once. */
  close(): void;
  /** Registers a teardown (an unsubscribe); runs at once if the stream is already closed. */
  onClose(teardown: () => void): void;
  readonly isOpen: boolean;
}

/** Whether the request asks for an event stream (Accept: text/event-stream). */
export function wantsEventStream(request: Request): boolean {
  return (request.headers.get("accept") ?? "").includes("text/event-stream");
}

/**
 * A `text/event-stream` response. `start` subscribes (registering its unsubscribe with
 * `stream.onClose`) and sends the first frames; `track` registers the stream's end with whoever
 * must close it at shutdown and returns how to unregister.
 */
export function eventStreamResponse(
  request: Request,
  track: (end: () => void) => () => void,
  start: (stream: SseStream) => Promise<void> | void,
): Response {
  let close = () => {};
  const body = new ReadableStream<Uint8Array>({
    async start(controller) {
      let open = true;
      const teardowns: (() => void)[] = [];
      const stream: SseStream = {
        send(frame) {
          if (!open) return;
          try {
            // A frame's bytes may be shared by every follower (nothing downstream writes to them).
            controller.enqueue(typeof frame === "string" ? encoder.encode(frame) : frame);
          } catch {
            close();
          }
        },
        close: () => close(),
        onClose(teardown) {
          if (open) teardowns.push(teardown);
          else teardown();
        },
        get isOpen() {
          return open;
        },
      };
      const heartbeat = setInterval(() => stream.send(HEARTBEAT), SSE_HEARTBEAT_MS);
      const untrack = track(() => close());
      close = () => {
        if (!open) return;
        open = false;
        clearInterval(heartbeat);
        for (const teardown of teardowns.splice(0)) teardown();
        untrack();
        request.signal.removeEventListener("abort", close);
        try {
          controller.close();
        } catch {
          /* already closed */
        }
      };
      request.signal.addEventListener("abort", close);
      stream.send(RETRY);
      await start(stream);
    },
    cancel() {
      close();
    },
  });
  return new Response(body, { headers: SSE_HEADERS });
}
