import { afterEach, describe, expect, it, vi } from "vitest";
import { eventStreamResponse, SSE_HEARTBEAT_MS, wantsEventStream } from "~/lib/sse.server";

const decoder = new TextDecoder();

function setUp() {
  const abort = new AbortController();
  const request = new Request("http://localhost/classes/x/live", { signal: abort.signal });
  const tracked = new Set<() => void>();
  const track = (end: () => void) => {
    tracked.add(end);
    return () => tracked.delete(end);
  };
  return { abort, request, tracked, track };
}

async function readAll(res: Response): Promise<string> {
  return decoder.decode(await new Response(res.body).arrayBuffer());
}

afterEach(() => {
  vi.useRealTimers();
});

describe("eventStreamResponse", () => {
  it("answers as an event stream: retry hint first, then the route's frames, ended by the route", async () => {
    const { request, tracked, track } = setUp();
    const teardown = vi.fn();
    const res = eventStreamResponse(request, track, async (stream) => {
      stream.onClose(teardown);
      stream.send("event: state\ndata: 1\n\n");
      stream.send(new TextEncoder().encode("event: state\ndata: 2\n\n"));
      stream.close();
      stream.send("event: state\ndata: late\n\n");
    });
    expect(res.headers.get("content-type")).toBe("text/event-stream; charset=utf-8");
    expect(res.headers.get("cache-control")).toBe("no-cache, no-transform");
    expect(await readAll(res)).toBe("retry: 1000\n\nevent: state\ndata: 1\n\nevent: state\ndata: 2\n\n");
    expect(teardown).toHaveBeenCalledTimes(1);
    expect(tracked.size).toBe(0);
  });

  it("ends on the client's abort and on shutdown, running each teardown once", async () => {
    for (const how of ["abort", "shutdown"] as const) {
      const { abort, request, tracked, track } = setUp();
      const teardown = vi.fn();
      let open: () => boolean = () => true;
      const res = eventStreamResponse(request, track, (stream) => {
        stream.onClose(teardown);
        open = () => stream.isOpen;
      });
      const text = readAll(res);
      await vi.waitFor(() => expect(tracked.size).toBe(1));
      if (how === "abort") abort.abort();
      else for (const end of [...tracked]) end();
      expect(await text).toBe("retry: 1000\n\n");
      expect(open()).toBe(false);
      expect(teardown).toHaveBeenCalledTimes(1);
      expect(tracked.size).toBe(0);
    }
  });

  it("runs a teardown registered after the stream closed at once", async () => {
    const { request, track } = setUp();
    const late = vi.fn();
    const res = eventStreamResponse(request, track, (stream) => {
      stream.close();
      stream.onClose(late);
    });
    await readAll(res);
    expect(late).toHaveBeenCalledTimes(1);
  });

  it("sends a ping event every heartbeat period while open", async () => {
    vi.useFakeTimers();
    const { request, track } = setUp();
    let close = () => {};
    const res = eventStreamResponse(request, track, (stream) => {
      close = () => stream.close();
    });
    const text = readAll(res);
    await vi.advanceTimersByTimeAsync(SSE_HEARTBEAT_MS * 2 + 10);
    close();
    expect(await text).toBe("retry: 1000\n\n" + "event: ping\ndata: {}\n\n".repeat(2));
  });
});

describe("wantsEventStream", () => {
  it("reads the Accept header", () => {
    expect(wantsEventStream(new Request("http://x/", { headers: { accept: "text/event-stream" } }))).toBe(true);
    expect(wantsEventStream(new Request("http://x/", { headers: { accept: "application/json" } }))).toBe(false);
    expect(wantsEventStream(new Request("http://x/"))).toBe(false);
  });
});
