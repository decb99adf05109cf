/**
 * The input guard reads and parses a request body once, and the route's readers take what it read
 * (rememberBody in app/lib/body.ts) instead of reading the stream and parsing the bytes again.
 */
import type { ServerBuild } from "react-router";
import { afterEach, describe, expect, it, vi } from "vitest";
import { readFormCapped, readJsonBody, type CappedForm, type JsonBody } from "~/lib/json-api.server";
import { guardInput } from "../../app/server/input-guard";

type Reader = (request: Request) => Promise<unknown>;

/** A build of one resource route whose action hands its request to `read`, guarded as the host guards it. */
async function throughGuard(request: Request, read: Reader): Promise<unknown> {
  let seen: unknown;
  const build = {
    routes: {
      only: {
        id: "only",
        path: "x",
        module: {
          action: async ({ request }: { request: Request }) => {
            seen = await read(request);
            return null;
          },
        },
      },
    },
  } as unknown as ServerBuild;
  const action = guardInput(build, 1024 * 1024).routes.only!.module.action as (args: unknown) => Promise<unknown>;
  await action({ request, params: {}, context: {} });
  return seen;
}

const post = (type: string, body: BodyInit) =>
  new Request("http://127.0.0.1/api/v1/x", { method: "POST", headers: { "Content-Type": type }, body });

afterEach(() => vi.restoreAllMocks());

describe("a JSON body through the input guard", () => {
  it("is parsed once: the route's readJsonBody takes the guard's result", async () => {
    const parse = vi.spyOn(JSON, "parse");
    const body = JSON.stringify({
      outline: [
        [0, 0],
        [15, 0],
        [15, 10],
      ],
      note: "café",
    });
    const seen = (await throughGuard(post("application/json", body), (r) => readJsonBody(r, 4096))) as JsonBody;
    expect(seen).toEqual({
      ok: true,
      value: {
        outline: [
          [0, 0],
          [15, 0],
          [15, 10],
        ],
        note: "café",
      },
      bytes: new TextEncoder().encode(body).byteLength,
    });
    expect(parse).toHaveBeenCalledTimes(1);
  });

  it("is still held to the route's own, smaller limit", async () => {
    const seen = (await throughGuard(post("application/json", JSON.stringify({ a: "x".repeat(100) })), (r) =>
      readJsonBody(r, 50),
    )) as JsonBody;
    expect(seen.ok).toBe(false);
    if (!seen.ok) expect(seen.response.status).toBe(413);
  });

  it("that is not UTF-8 still reaches the route, which refuses it as not JSON", async () => {
    const bytes = new Uint8Array([0x7b, 0x22, 0x61, 0x22, 0x3a, 0x22, 0xff, 0x22, 0x7d]); // {"a":"\xff"}
    const seen = (await throughGuard(post("application/json", bytes), (r) => readJsonBody(r, 4096))) as JsonBody;
    expect(seen.ok).toBe(false);
    if (!seen.ok) expect(seen.response.status).toBe(400);
  });

  it("that is not JSON reaches the route, which says so", async () => {
    const seen = (await throughGuard(post("application/json", "{not json"), (r) => readJsonBody(r, 4096))) as JsonBody;
    expect(seen.ok).toBe(false);
    if (!seen.ok)
      expect(await seen.response.json()).toMatchObject({ error: { message: "The body is not valid JSON." } });
  });
});

describe("a form body through the input guard", () => {
  it("reaches readFormCapped whole, from the bytes the guard read", async () => {
    const seen = (await throughGuard(post("application/x-www-form-urlencoded", "name=Flat+roof&spacing=0.4"), (r) =>
      readFormCapped(r, 4096),
    )) as CappedForm;
    expect(seen.ok).toBe(true);
    if (seen.ok) expect(Object.fromEntries(seen.form)).toEqual({ name: "Flat roof", spacing: "0.4" });
  });

  it("and request.formData() still reads it, for routes that read the request themselves", async () => {
    const seen = (await throughGuard(post("application/x-www-form-urlencoded", "a=1"), (r) =>
      r.formData(),
    )) as FormData;
    expect(seen.get("a")).toBe("1");
  });
});
