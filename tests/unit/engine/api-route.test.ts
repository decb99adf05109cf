import { beforeEach, describe, expect, it, vi } from "vitest";

// The per-address limiter is counted in memory (rate-limit.server.ts); here it is replaced so the route runs alone.
const limiter = vi.hoisted(() => ({ next: null as Response | null }));
vi.mock("~/lib/rate-limit.server", () => ({
  limitApiRequest: async () => {
    return limiter.next;
  },
  // The work charged after an analysis (counted in the limiter's own tests).
  chargeApiWork: () => 0,
}));

const { action, loader } = await import("~/routes/api.v1.analyses");
const { ANALYSIS_BODY_LIMIT } = await import("~/lib/analysis-request.server");
const { checkApiResponse } = await import("../../support/openapi");

const URL_ = "http://localhost/api/v1/analyses";
const spec = {
  outline: [
    [0, 0],
    [20, 0],
    [20, 10],
    [0, 10],
  ],
  outlets: [{ at: [10, 0] }],
  baseFall: "1:40",
};

function post(
  body: BodyInit | null,
  headers: Record<string, string> = { "Content-Type": "application/json" },
  url = URL_,
) {
  return new Request(url, { method: "POST", body, headers, duplex: "half" } as RequestInit);
}
// Every answer is also held to the OpenAPI document (tests/support/openapi.ts).
async function call(request: Request): Promise<Response> {
  const res = (await action({ request, context: {}, params: {} } as never)) as Response;
  await checkApiResponse(request.method, request.url, res);
  return res;
}

beforeEach(() => {
  limiter.next = null;
});

describe("POST /api/v1/analyses", () => {
  it('accepts baseFall "1/4:12" (was 400) and reads it as 1:48', async () => {
    const res = await call(post(JSON.stringify({ ...spec, baseFall: "1/4:12" })));
    expect(res.status).toBe(200);
    const a = await res.json();
    expect(a.baseFall.ratio).toBeCloseTo(48, 9);
  });

  it("answers 200 with the contract's keys", async () => {
    const res = await call(post(JSON.stringify(spec)));
    expect(res.status).toBe(200);
    const a = await res.json();
    expect(a.shaped.highLevel).toBeCloseTo(0.25, 12);
    for (const key of [
      "joistDirection",
      "edgeFalls",
      "longestFallLine",
      "worstFallRatio",
      "joists",
      "fallMap",
      "catchments",
      "ponding",
      "probes",
    ]) {
      expect(a.shaped).toHaveProperty(key);
    }
    for (const key of ["gutter", "openEdge", "comparison", "advice", "warnings"]) expect(a).toHaveProperty(key);
    // The bulky 3D parts come only on request.
    expect(a.shaped.mesh).toBeUndefined();
    expect(a.shaped.flowTraces).toBeUndefined();
  });

  it("adds the mesh and traces on request", async () => {
    const a = await (await call(post(JSON.stringify(spec), undefined, `${URL_}?mesh=true&traces=true`))).json();
    expect(Array.isArray(a.shaped.mesh.positions)).toBe(true);
    expect(a.shaped.mesh.indices.length % 3).toBe(0);
    expect(a.shaped.flowTraces.starts.length).toBe(a.shaped.flowTraces.ends.length + 1);
  });

  it("415 unless the body is declared JSON", async () => {
    expect((await call(post(JSON.stringify(spec), { "Content-Type": "text/plain" }))).status).toBe(415);
    expect((await call(post(JSON.stringify(spec), {}))).status).toBe(415);
  });

  it("413 over 256 kB, even when the body is streamed without a length", async () => {
    const big = JSON.stringify({ ...spec, padding: "x".repeat(ANALYSIS_BODY_LIMIT) });
    expect((await call(post(big))).status).toBe(413);
    const stream = new ReadableStream<Uint8Array>({
      start(controller) {
        const chunk = new TextEncoder().encode("x".repeat(64 * 1024));
        for (let i = 0; i < 5; i++) controller.enqueue(chunk);
        controller.close();
      },
    });
    expect((await call(post(stream))).status).toBe(413);
  });

  it("400 for broken JSON and for a malformed spec, with issue paths", async () => {
    const broken = await call(post('{"outline": [[0,0],'));
    expect(broken.status).toBe(400);
    const malformed = await call(post(JSON.stringify({ ...spec, baseFall: "steep" })));
    expect(malformed.status).toBe(400);
    const body = await malformed.json();
    expect(body.error.issues.map((i: { path: string }) => i.path)).toContain("baseFall");
  });

  it("422 for a spec that cannot be built", async () => {
    const res = await call(
      post(
        JSON.stringify({
          ...spec,
          outline: [
            [0, 0],
            [10, 10],
            [10, 0],
            [0, 10],
          ],
        }),
      ),
    );
    expect(res.status).toBe(422);
    expect((await res.json()).error.message).toMatch(/cannot be built/);
  });

  it("passes on the limiter's 429, and answers again once the limiter allows", async () => {
    limiter.next = Response.json(
      { error: { message: "Too many", issues: [] } },
      { status: 429, headers: { "Retry-After": "7" } },
    );
    const limited = await call(post(JSON.stringify(spec)));
    expect(limited.status).toBe(429);
    expect(limited.headers.get("Retry-After")).toBe("7");
    limiter.next = null;
    expect((await call(post(JSON.stringify(spec)))).status).toBe(200);
  });

  it("405 for GET", async () => {
    const res = loader() as Response;
    expect(res.status).toBe(405);
    await checkApiResponse("GET", URL_, res);
    expect(res.headers.get("Allow")).toBe("POST");
  });
});
