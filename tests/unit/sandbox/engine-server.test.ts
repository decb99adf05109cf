import { describe, expect, it } from "vitest";
import { DEMO_ROOF } from "~/components/sandbox/state/demo-roof";
import type { EngineRequest } from "~/components/sandbox/engine-bridge/engine-protocol";
import type { EngineOutcome } from "~/components/sandbox/engine-bridge/analysis-outcome";
import { handleEngineRequest, transferablesOf } from "~/components/sandbox/engine-bridge/engine-handlers";
import { createEngineServer, isSuperseded, type EngineReply } from "~/components/sandbox/engine-bridge/engine-server";
import { MessageChannel } from "node:worker_threads";
import { analyse, parseSpec, PREVIEW_MESH_VERTICES } from "~/engine";
import { BENCH_ROOFS } from "../../bench/bench";

const spec = (k: number) => ({ ...DEMO_ROOF, baseFall: `1:${40 + k}` });

/** A server whose runner records what it computed; turns are released by hand (as the event loop would). */
function harness() {
  const computed: EngineRequest[] = [];
  const replies: EngineReply[] = [];
  let release: (() => void) | null = null;
  const turn = () => new Promise<void>((resolve) => (release = resolve));
  const server = createEngineServer(
    {
      prepare: () => undefined,
      run: (request) => {
        computed.push(request);
        return request.kind === "analyse" ? { ok: true, baseFall: request.spec.baseFall } : { ok: true };
      },
    },
    (reply) => replies.push(reply),
    turn,
  );
  const step = async () => {
    const r = release;
    release = null;
    r?.();
    // Let the server's awaits settle.
    for (let i = 0; i < 5; i++) await Promise.resolve();
  };
  return { server, computed, replies, step };
}

describe("engine server (the worker's queue)", () => {
  it("drops analyses a newer one made stale before they started, answers them superseded, computes only the newest", async () => {
    const { server, computed, replies, step } = harness();
    for (let k = 1; k <= 4; k++) server.receive({ id: k, request: { kind: "analyse", spec: spec(k) } });
    for (let i = 0; i < 6; i++) await step();
    expect(computed.map((r) => r.kind === "analyse" && r.spec.baseFall)).toEqual(["1:44"]);
    expect(replies.map((r) => r.id)).toEqual([1, 2, 3, 4]);
    expect(replies.slice(0, 3).every((r) => isSuperseded(r.answer))).toBe(true);
    expect(replies[3].answer).toEqual({ ok: true, baseFall: "1:44" });
  });

  it("never drops other requests, and drops an analysis that arrives stale while another runs", async () => {
    const { server, computed, replies, step } = harness();
    server.receive({ id: 1, request: { kind: "analyse", spec: spec(1) } });
    await step(); // analysis 1 is taken and computed
    server.receive({ id: 2, request: { kind: "analyse", spec: spec(2) } });
    server.receive({ id: 3, request: { kind: "parseFall", text: "1:40" } });
    server.receive({ id: 4, request: { kind: "analyse", spec: spec(4) } });
    server.receive({ id: 5, request: { kind: "ruleSets" } });
    for (let i = 0; i < 8; i++) await step();
    expect(computed.map((r) => (r.kind === "analyse" ? r.spec.baseFall : r.kind))).toEqual([
      "1:41",
      "parseFall",
      "1:44",
      "ruleSets",
    ]);
    expect(replies.map((r) => [r.id, isSuperseded(r.answer)])).toEqual([
      [1, false],
      [2, true],
      [3, false],
      [4, false],
      [5, false],
    ]);
  });

  it("answers an engine fault as an error, and keeps serving", async () => {
    const replies: EngineReply[] = [];
    let calls = 0;
    const server = createEngineServer(
      {
        prepare: () => undefined,
        run: () => {
          if (++calls === 1) throw new Error("boom");
          return { ok: true };
        },
      },
      (reply) => replies.push(reply),
    );
    server.receive({ id: 1, request: { kind: "ruleSets" } });
    server.receive({ id: 2, request: { kind: "ruleSets" } });
    await expect.poll(() => replies.length).toBe(2);
    expect(replies[0].answer).toMatchObject({ ok: false, error: { status: 500, message: "boom" } });
    expect(replies[1].answer).toEqual({ ok: true });
  });
});

describe("engine handlers: the drag preview", () => {
  it("answers the analysis on a mesh of about PREVIEW_MESH_VERTICES, marked preview, with the full high level", () => {
    const spec = BENCH_ROOFS[BENCH_ROOFS.length - 1].spec;
    const full = handleEngineRequest({ kind: "analyse", spec }) as EngineOutcome;
    const preview = handleEngineRequest({ kind: "analyse", spec, preview: true }) as EngineOutcome;
    if (!full.ok || !preview.ok) throw new Error("not analysed");
    expect(preview.preview).toBe(true);
    expect("preview" in full).toBe(false);
    expect(preview.analysis.shaped.highLevel).toBe(full.analysis.shaped.highLevel);
    const vertices = (a: typeof full.analysis) => (a.shaped.meshBuffers?.positions.length ?? 0) / 3;
    expect(vertices(preview.analysis)).toBeLessThanOrEqual(1.5 * PREVIEW_MESH_VERTICES);
    expect(vertices(full.analysis)).toBeGreaterThan(4 * vertices(preview.analysis));
    // Its coarse mesh is chosen: no warning says so.
    expect(preview.analysis.warnings.map((w) => w.code)).not.toContain("mesh-coarsened");
  });
});

describe("engine handlers: the mesh is handed over, not copied", () => {
  it("answers typed arrays equal to the JSON mesh, and transfers their buffers through a message port", async () => {
    const spec = BENCH_ROOFS[2].spec; // the medium roof with openings and ridges: merged areas
    const answer = handleEngineRequest({ kind: "analyse", spec }) as EngineOutcome;
    if (!answer.ok) throw new Error("not analysed");
    const buffers = answer.analysis.shaped.meshBuffers!;
    expect(answer.analysis.shaped.mesh).toBeUndefined();
    const parsed = parseSpec(spec);
    if (!parsed.ok) throw new Error(parsed.error.message);
    const plain = analyse(parsed.spec).shaped.mesh!;
    expect(Array.from(buffers.positions)).toEqual(plain.positions);
    expect(Array.from(buffers.indices)).toEqual(plain.indices);
    expect(Array.from(buffers.faceDrain)).toEqual(plain.faceDrain);
    expect(Array.from(buffers.faceRatio)).toEqual(plain.faceRatio);

    const transfer = transferablesOf(answer);
    expect(transfer).toHaveLength(4);
    const count = buffers.positions.length;
    const { port1, port2 } = new MessageChannel();
    const received = new Promise<EngineOutcome>((resolve) => port2.once("message", resolve));
    port1.postMessage(answer, transfer);
    const got = await received;
    port1.close();
    port2.close();
    if (!got.ok) throw new Error("not analysed");
    expect(got.analysis.shaped.meshBuffers!.positions.length).toBe(count);
    // Handed over: the sender's arrays are now empty (detached), nothing was copied.
    expect(buffers.positions.length).toBe(0);
    // Other answers (a refusal, a parsed spec, rule sets) hand over nothing and do not throw.
    expect(transferablesOf({ ok: false, error: { status: 422, message: "", issues: [] } })).toEqual([]);
    expect(transferablesOf(handleEngineRequest({ kind: "parseSpec", input: spec }))).toEqual([]);
    expect(transferablesOf(handleEngineRequest({ kind: "ruleSets" }))).toEqual([]);
    expect(transferablesOf(null)).toEqual([]);
  });
});
