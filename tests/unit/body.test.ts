import { describe, expect, it } from "vitest";
import { parseJsonBytes, readStreamCapped } from "~/lib/body";

/** A stream of the given chunks that records how many were pulled and whether it was cancelled. */
function chunked(sizes: number[]) {
  const seen = { pulled: 0, cancelled: false };
  let i = 0;
  const stream = new ReadableStream<Uint8Array>(
    {
      pull(controller) {
        if (i === sizes.length) return controller.close();
        seen.pulled++;
        controller.enqueue(new Uint8Array(sizes[i]).fill(65 + i));
        i++;
      },
      cancel() {
        seen.cancelled = true;
      },
    },
    { highWaterMark: 0 }, // pull only when read, so `pulled` counts reads
  );
  return { stream, seen };
}

describe("readStreamCapped", () => {
  it("returns every byte, in order, up to the limit", async () => {
    const { stream } = chunked([3, 2]);
    expect(Array.from((await readStreamCapped(stream, 5))!)).toEqual([65, 65, 65, 66, 66]);
  });

  it("stops at the first chunk past the limit and cancels the rest", async () => {
    const { stream, seen } = chunked([3, 3, 3, 3]);
    expect(await readStreamCapped(stream, 5)).toBeNull();
    expect(seen.pulled).toBe(2);
    expect(seen.cancelled).toBe(true);
  });

  it("reads on and drops bytes up to drainTo before giving up", async () => {
    const { stream, seen } = chunked([3, 3, 3, 3, 3]);
    expect(await readStreamCapped(stream, 5, 12)).toBeNull();
    expect(seen.pulled).toBe(4);
    expect(seen.cancelled).toBe(true);
  });
});

describe("parseJsonBytes", () => {
  const enc = new TextEncoder();
  it("parses UTF-8 JSON", () => {
    expect(parseJsonBytes(enc.encode('{"name":"Annexe ü"}'))).toEqual({ ok: true, value: { name: "Annexe ü" } });
  });

  it("refuses what is not JSON", () => {
    expect(parseJsonBytes(enc.encode("{name:"))).toEqual({ ok: false });
  });

  it("refuses bytes that are not UTF-8 when strict, reads them with U+FFFD when lenient", () => {
    const bad = new Uint8Array([0x22, 0xff, 0x22]); // "\xff"
    expect(parseJsonBytes(bad)).toEqual({ ok: false });
    expect(parseJsonBytes(bad, "lenient")).toEqual({ ok: true, value: "\ufffd" });
  });
});
