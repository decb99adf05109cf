import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import {
  drawnOnCpu,
  noteRenderer,
  ON_CPU_KEY,
  probeOnCpu,
  rememberedOnCpu,
  sceneGlOptions,
  watchIdle,
} from "~/components/sandbox/view-3d/cpu-drawing";

/** A WebGL context that answers only what drawnOnCpu asks. */
function gl(renderer: string, masked = true) {
  const UNMASKED_RENDERER_WEBGL = 0x9246;
  const RENDERER = 0x1f01;
  return {
    RENDERER,
    getExtension: (name: string) =>
      masked && name === "WEBGL_debug_renderer_info" ? { UNMASKED_RENDERER_WEBGL } : null,
    getParameter: (p: number) =>
      p === UNMASKED_RENDERER_WEBGL || (!masked && p === RENDERER) ? renderer : "WebKit WebGL",
  } as unknown as WebGLRenderingContext;
}

describe("drawnOnCpu", () => {
  it("knows software rasterisers by the renderer's name", () => {
    // Names as chromium and Firefox report them (from memory of their about:gpu pages).
    expect(
      drawnOnCpu(gl("ANGLE (Google, Vulkan 1.3.0 (SwiftShader Device (Subzero) (0x0000C0DE)), SwiftShader driver)")),
    ).toBe(true);
    expect(drawnOnCpu(gl("llvmpipe (LLVM 15.0.6, 256 bits)"))).toBe(true);
    expect(drawnOnCpu(gl("ANGLE (Microsoft, Microsoft Basic Render Driver Direct3D11 vs_5_0 ps_5_0)"))).toBe(true);
    expect(drawnOnCpu(gl("ANGLE (Intel, Mesa Intel(R) UHD Graphics 620 (KBL GT2), OpenGL 4.6)"))).toBe(false);
    expect(drawnOnCpu(gl("Apple M2"))).toBe(false);
  });

  it("falls back to RENDERER where the unmasked name is withheld", () => {
    expect(drawnOnCpu(gl("llvmpipe", false))).toBe(true);
    expect(drawnOnCpu(gl("Mali-G78", false))).toBe(false);
  });
});

describe("watchIdle", () => {
  beforeEach(() => vi.useFakeTimers());
  afterEach(() => vi.useRealTimers());

  it("reports idle after the quiet time, and not idle at the next input", () => {
    const target = new EventTarget();
    const seen: boolean[] = [];
    const stop = watchIdle(target, 1000, (idle) => seen.push(idle));
    vi.advanceTimersByTime(999);
    expect(seen).toEqual([]);
    vi.advanceTimersByTime(1);
    expect(seen).toEqual([true]);
    target.dispatchEvent(new Event("pointermove"));
    expect(seen).toEqual([true, false]);
    vi.advanceTimersByTime(1000);
    expect(seen).toEqual([true, false, true]);
    stop();
  });

  it("counts the quiet time from the last input, whatever kind", () => {
    const target = new EventTarget();
    const seen: boolean[] = [];
    const stop = watchIdle(target, 1000, (idle) => seen.push(idle));
    for (const type of ["pointermove", "pointerdown", "keydown", "wheel", "touchstart"]) {
      vi.advanceTimersByTime(800);
      target.dispatchEvent(new Event(type));
    }
    vi.advanceTimersByTime(999);
    expect(seen).toEqual([]);
    vi.advanceTimersByTime(1);
    expect(seen).toEqual([true]);
    stop();
  });

  it("stops watching when asked", () => {
    const target = new EventTarget();
    const seen: boolean[] = [];
    watchIdle(target, 1000, (idle) => seen.push(idle))();
    vi.advanceTimersByTime(5000);
    target.dispatchEvent(new Event("keydown"));
    expect(seen).toEqual([]);
  });
});

describe("the next view's WebGL options, from what the last view found", () => {
  /** A localStorage of its own for each test. */
  function stubStorage(refuse = false) {
    const kept = new Map<string, string>();
    vi.stubGlobal("localStorage", {
      getItem: (k: string) => kept.get(k) ?? null,
      setItem: (k: string, v: string) => {
        if (refuse) throw new DOMException("refused", "SecurityError");
        kept.set(k, v);
      },
    });
    return kept;
  }
  afterEach(() => vi.unstubAllGlobals());

  /** A document whose canvases give `context` (a 1 × 1 probe's), noting what was asked and whether it was given back. */
  function stubDocument(context: ReturnType<typeof gl> | null) {
    const asked: string[] = [];
    let lost = 0;
    const canvas = {
      width: 300,
      height: 150,
      getContext: (kind: string) => {
        asked.push(kind);
        return (
          context && {
            ...context,
            getExtension: (name: string) =>
              name === "WEBGL_lose_context" ? { loseContext: () => lost++ } : context.getExtension(name),
          }
        );
      },
    };
    vi.stubGlobal("document", { createElement: (tag: string) => (tag === "canvas" ? canvas : null) });
    return { asked, canvas, lost: () => lost };
  }

  it("a browser that has shown no 3D yet asks a throwaway context: on the CPU its first view is made without multisampling", () => {
    const kept = stubStorage();
    const probe = stubDocument(gl("ANGLE (Google, Vulkan 1.3.0 (SwiftShader Device (Subzero)), SwiftShader driver)"));
    expect(rememberedOnCpu()).toBe(false);
    expect(sceneGlOptions()).toEqual({ preserveDrawingBuffer: true, antialias: false });
    expect(probe.asked).toEqual(["webgl2"]);
    expect([probe.canvas.width, probe.canvas.height]).toEqual([1, 1]);
    expect(probe.lost()).toBe(1);
    // Remembered: the next view asks no context of its own.
    expect(kept.get(ON_CPU_KEY)).toBe("1");
    expect(sceneGlOptions().antialias).toBe(false);
    expect(probe.asked).toHaveLength(1);
  });

  it("on a graphics card the first view is antialiased; with no WebGL or no document, too", () => {
    const kept = stubStorage();
    stubDocument(gl("ANGLE (Intel, Mesa Intel(R) UHD Graphics 620 (KBL GT2), OpenGL 4.6)"));
    expect(sceneGlOptions().antialias).toBe(true);
    expect(kept.get(ON_CPU_KEY)).toBe("0");

    const none = stubStorage();
    const probe = stubDocument(null);
    expect(sceneGlOptions().antialias).toBe(true);
    expect(probe.asked).toEqual(["webgl2", "webgl"]);
    expect(none.has(ON_CPU_KEY)).toBe(false); // nothing learnt, nothing kept
    expect(probeOnCpu(undefined)).toBeNull();
  });

  it("after a view drawn on the CPU, the next is made without multisampling; after a graphics card, with it", () => {
    const kept = stubStorage();
    noteRenderer(gl("ANGLE (Google, Vulkan 1.3.0 (SwiftShader Device (Subzero)), SwiftShader driver)"));
    expect(kept.get(ON_CPU_KEY)).toBe("1");
    expect(sceneGlOptions().antialias).toBe(false);
    noteRenderer(gl("ANGLE (Intel, Mesa Intel(R) UHD Graphics 620 (KBL GT2), OpenGL 4.6)"));
    expect(kept.get(ON_CPU_KEY)).toBe("0");
    expect(sceneGlOptions().antialias).toBe(true);
  });

  it("storage that refuses or is missing leaves every view antialiased, without an error", () => {
    stubStorage(true);
    expect(() => noteRenderer(gl("llvmpipe (LLVM 15.0.6, 256 bits)"))).not.toThrow();
    expect(sceneGlOptions().antialias).toBe(true);
    vi.stubGlobal("localStorage", undefined);
    expect(rememberedOnCpu()).toBe(false);
  });
});
