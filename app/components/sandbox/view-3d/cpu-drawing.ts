/**
 * Whether this page's 3D views are drawn on the CPU (software WebGL: SwiftShader, llvmpipe and the
 * like, as on a laptop without a graphics driver), and when its reader last touched it. On such a
 * machine each frame of the water animation takes 70–150 ms of a core, so the animation stops
 * after WATER_IDLE_MS without input and starts again at the next (use-animation-allowed.ts).
 */

/** No pointer, key, wheel or touch input on the page for this long pauses the water on a CPU-drawn view. */
export const WATER_IDLE_MS = 30_000;

const SOFTWARE = /swiftshader|llvmpipe|softpipe|software|basic render/i;

/** The renderer's name names a software rasteriser (UNMASKED_RENDERER_WEBGL where the browser gives it). */
export function drawnOnCpu(gl: Pick<WebGLRenderingContext, "getExtension" | "getParameter" | "RENDERER">): boolean {
  const info = gl.getExtension("WEBGL_debug_renderer_info") as { UNMASKED_RENDERER_WEBGL: number } | null;
  const name: unknown = gl.getParameter(info ? info.UNMASKED_RENDERER_WEBGL : gl.RENDERER);
  return typeof name === "string" && SOFTWARE.test(name);
}

/**
 * Frames a second the moving water asks for where the 3D is drawn on the CPU. There a frame of the
 * sandbox costs SwiftShader's GPU process about 0.1 s of CPU without multisampling and 0.3 s with
 * it, so uncapped the water kept both of this machine's cores busy (README, Performance).
 */
export const WATER_CPU_FPS = 8;

/** Where this browser keeps what its last 3D view found (see rememberedOnCpu). */
export const ON_CPU_KEY = "fallwright:3d-drawn-on-cpu";

function storage(): Storage | null {
  try {
    return typeof localStorage === "undefined" ? null : localStorage;
  } catch {
    return null; // storage refused (privacy settings): every view is made as on a graphics card
  }
}

/**
 * Whether the last 3D view in this browser was drawn on the CPU. A WebGL context's antialiasing is
 * fixed when it is made, before its renderer can be asked, so the next view's context is made
 * without multisampling from what the last one found: on a CPU renderer that frame costs about a
 * third as much.
 */
export function rememberedOnCpu(): boolean {
  return remembered() === true;
}

/** What the last 3D view in this browser found: true on the CPU, false on a graphics card, null if none has said. */
function remembered(): boolean | null {
  try {
    const value = storage()?.getItem(ON_CPU_KEY);
    return value === "1" ? true : value === "0" ? false : null;
  } catch {
    return null;
  }
}

/**
 * Asks a throwaway 1 × 1 context, made and given back at once, whether this browser draws WebGL on
 * the CPU: null where there is no document or no WebGL. Only a browser that has shown no 3D view
 * yet pays for it (one context made, no shader compiled), so that its first view, too, is made
 * without multisampling on a CPU renderer, where multisampling is most of each frame's cost.
 */
export function probeOnCpu(doc: Pick<Document, "createElement"> | undefined = globalThis.document): boolean | null {
  if (!doc) return null;
  try {
    const canvas = doc.createElement("canvas");
    canvas.width = 1;
    canvas.height = 1;
    const gl = canvas.getContext("webgl2") ?? canvas.getContext("webgl");
    if (!gl) return null;
    const found = drawnOnCpu(gl);
    gl.getExtension("WEBGL_lose_context")?.loseContext();
    return found;
  } catch {
    return null;
  }
}

/**
 * The WebGL options of every 3D view: antialiased unless this browser draws 3D on the CPU, as its
 * last view found (rememberedOnCpu) or, before any view, as a throwaway context says (probeOnCpu).
 */
export function sceneGlOptions(): { preserveDrawingBuffer: true; antialias: boolean } {
  let onCpu = remembered();
  if (onCpu === null) {
    onCpu = probeOnCpu();
    if (onCpu !== null) {
      try {
        storage()?.setItem(ON_CPU_KEY, onCpu ? "1" : "0");
      } catch {
        // full or refused: the next view asks again
      }
    }
  }
  return { preserveDrawingBuffer: true, antialias: onCpu !== true };
}

let cpu = false;
const listeners = new Set<() => void>();

/** Called by each 3D view once its WebGL context exists; every view of a page shares the answer. */
export function noteRenderer(gl: Parameters<typeof drawnOnCpu>[0]): void {
  const next = drawnOnCpu(gl);
  try {
    storage()?.setItem(ON_CPU_KEY, next ? "1" : "0");
  } catch {
    // full or refused: the next view is antialiased, as the first
  }
  if (next === cpu) return;
  cpu = next;
  for (const listener of listeners) listener();
}

export const cpuDrawing = {
  get: () => cpu,
  subscribe(listener: () => void) {
    listeners.add(listener);
    return () => listeners.delete(listener);
  },
};

const INPUT = ["pointermove", "pointerdown", "keydown", "wheel", "touchstart"] as const;

/**
 * Calls `onIdle(true)` once `target` has had no input for `ms`, and `onIdle(false)` at the next
 * input after that. One timer at a time: input only notes its time, and the timer, when it fires,
 * waits out whatever is left. Returns the function that stops watching.
 */
export function watchIdle(target: EventTarget, ms: number, onIdle: (idle: boolean) => void): () => void {
  let last = Date.now();
  let idle = false;
  let timer: ReturnType<typeof setTimeout> | null = null;
  const check = () => {
    const left = last + ms - Date.now();
    if (left > 0) {
      timer = setTimeout(check, left);
      return;
    }
    timer = null;
    idle = true;
    onIdle(true);
  };
  const input = () => {
    last = Date.now();
    if (idle) {
      idle = false;
      onIdle(false);
    }
    timer ??= setTimeout(check, ms);
  };
  for (const type of INPUT) target.addEventListener(type, input, { passive: true });
  timer = setTimeout(check, ms);
  return () => {
    for (const type of INPUT) target.removeEventListener(type, input);
    if (timer) clearTimeout(timer);
  };
}
