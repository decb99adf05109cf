import { createRoot, events, extend, type ReconcilerRoot, type RenderProps } from "@react-three/fiber";
import { FiberProvider, useContextBridge } from "its-fine";
import {
  Component,
  useInsertionEffect,
  useLayoutEffect,
  useRef,
  useState,
  type HTMLAttributes,
  type ReactNode,
} from "react";
import { getConsoleFunction, setConsoleFunction } from "three";
import { noteRenderer } from "./cpu-drawing";
import * as SCENE_ELEMENTS from "./scene-elements";

// Only the elements the scenes use: the library's own <Canvas> registers the whole THREE
// namespace, which keeps every class of three.js in the sandbox's bundle.
extend(SCENE_ELEMENTS);

// @react-three/fiber 9 makes a THREE.Clock for every canvas, which three r183+ reports as
// deprecated on each 3D page. That one known message is dropped; every other message of three
// goes to the console as before (three's own hook for its messages).
const CLOCK_DEPRECATED = /^THREE\.Clock: This module has been deprecated/;
if (!getConsoleFunction()) {
  setConsoleFunction((level: string, message: string, ...rest: unknown[]) => {
    if (level === "warn" && CLOCK_DEPRECATED.test(message)) return;
    const log = level === "error" ? console.error : level === "warn" ? console.warn : console.log;
    log(message, ...rest);
  });
}

type SceneCanvasProps = Pick<RenderProps<HTMLCanvasElement>, "camera" | "dpr" | "frameloop" | "gl" | "onCreated"> &
  Omit<HTMLAttributes<HTMLDivElement>, "children"> & { children: ReactNode };

class Catch extends Component<{
  onError: (error: unknown) => void;
  children: ReactNode;
}> {
  componentDidCatch(error: unknown) {
    this.props.onError(error);
  }

  render() {
    return this.props.children;
  }
}

function CanvasRoot({ children, camera, dpr, frameloop, gl, onCreated, style, ...rest }: SceneCanvasProps) {
  const Bridge = useContextBridge();
  const outer = useRef<HTMLDivElement>(null);
  const box = useRef<HTMLDivElement>(null);
  const canvas = useRef<HTMLCanvasElement>(null);
  const root = useRef<ReconcilerRoot<HTMLCanvasElement> | null>(null);
  const [size, setSize] = useState({ width: 0, height: 0, top: 0, left: 0 });
  const [error, setError] = useState<unknown>(null);
  // A failure inside the scene (or no WebGL at all) surfaces to the page's error boundary.
  if (error) throw error;

  useLayoutEffect(() => {
    const element = box.current!;
    const measure = () => {
      const { width, height } = element.getBoundingClientRect();
      setSize((old) => (old.width === width && old.height === height ? old : { width, height, top: 0, left: 0 }));
    };
    measure();
    const observer = new ResizeObserver(measure);
    observer.observe(element);
    return () => observer.disconnect();
  }, []);

  useLayoutEffect(() => {
    if (!canvas.current || size.width === 0 || size.height === 0) return;
    root.current ??= createRoot(canvas.current);
    const created: typeof onCreated = (state) => {
      // Pointer events (and HTML labels) attach to the wrapper, as with the library's own canvas.
      state.events.connect?.(outer.current!);
      noteRenderer(state.gl.getContext());
      onCreated?.(state);
    };
    root.current
      .configure({
        camera,
        dpr,
        frameloop,
        gl,
        onCreated: created,
        size,
        events,
      })
      .catch(setError);
    try {
      root.current.render(
        <Bridge>
          <Catch onError={setError}>{children}</Catch>
        </Bridge>,
      );
    } catch (failure) {
      setError(failure);
    }
    // `children` is new on every render of the parent, so the scene re-renders with it, as the library's canvas does.
  }, [Bridge, camera, children, dpr, frameloop, gl, onCreated, size]);

  // Insertion-effect cleanups run once, on real removal (not on StrictMode's effect replay).
  useInsertionEffect(
    () => () => {
      root.current?.unmount();
      root.current = null;
    },
    [],
  );

  return (
    <div
      {...rest}
      ref={outer}
      style={{
        position: "relative",
        width: "100%",
        height: "100%",
        overflow: "hidden",
        ...style,
      }}
    >
      <div ref={box} style={{ width: "100%", height: "100%" }}>
        <canvas ref={canvas} style={{ display: "block" }} />
      </div>
    </div>
  );
}

/**
 * A drawing surface for three.js scenes written in JSX (react-three-fiber's root API), carrying
 * the page's React context into the scene so it reads the same sandbox store.
 */
export function SceneCanvas(props: SceneCanvasProps) {
  return (
    <FiberProvider>
      <CanvasRoot {...props} />
    </FiberProvider>
  );
}
