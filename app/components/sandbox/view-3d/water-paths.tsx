import { useFrame } from "@react-three/fiber";
import { useEffect, useMemo, useRef, useSyncExternalStore } from "react";
import * as THREE from "three";
import { mergeGeometries } from "three/examples/jsm/utils/BufferGeometryUtils.js";
import type { FlowTraces } from "~/engine";
import { WATER_DARK, WATER_LIGHT } from "~/lib/fall-colour";
import { cpuDrawing, WATER_CPU_FPS } from "./cpu-drawing";
import type { SceneFrame } from "./scene-frame";

const MAX_PARTICLES = 600;
/** Enough paths to read the flow without hiding the fall colours. */
const MAX_TRACKS = 90;

interface Track {
  /** Scene x, level, scene z per point (level unscaled). */
  xyz: Float32Array;
  /** Arc length in plan at each point. */
  s: Float32Array;
  /** Plan speed on each segment, m/s of animation: steeper runs faster. */
  speed: Float32Array;
}

function buildTracks(traces: FlowTraces, frame: SceneFrame): Track[] {
  const tracks: Track[] = [];
  const count = traces.starts.length - 1;
  const stride = Math.max(1, Math.ceil(count / MAX_TRACKS));
  for (let t = 0; t < count; t += stride) {
    const a = traces.starts[t];
    const b = traces.starts[t + 1];
    if (b - a < 2) continue;
    const n = b - a;
    const xyz = new Float32Array(n * 3);
    const s = new Float32Array(n);
    const speed = new Float32Array(n);
    for (let i = 0; i < n; i++) {
      const p = (a + i) * 3;
      xyz[3 * i] = traces.points[p] - frame.cx;
      xyz[3 * i + 1] = traces.points[p + 2];
      xyz[3 * i + 2] = -(traces.points[p + 1] - frame.cy);
      if (i > 0) {
        const dx = xyz[3 * i] - xyz[3 * i - 3];
        const dz = xyz[3 * i + 2] - xyz[3 * i - 1];
        const run = Math.hypot(dx, dz);
        s[i] = s[i - 1] + run;
        const slope = run > 1e-9 ? Math.abs(xyz[3 * i + 1] - xyz[3 * i - 2]) / run : 0;
        speed[i - 1] = Math.min(3, 0.35 + 45 * slope) * Math.max(0.4, frame.radius / 8);
      }
    }
    if (s[n - 1] > 1e-6) tracks.push({ xyz, s, speed });
  }
  return tracks;
}

const LIFT = 0.006;

/** Puts drop `i` at its distance along its track (the segment index only moves forward). */
interface Drops {
  track: Int32Array;
  s: Float32Array;
  segment: Int32Array;
}

function placeDrop(m: THREE.InstancedMesh, tracks: Track[], drops: Drops, i: number, exaggeration: number) {
  const t = tracks[drops.track[i]];
  let seg = drops.segment[i];
  const s = drops.s[i];
  while (seg < t.s.length - 2 && t.s[seg + 1] < s) seg++;
  drops.segment[i] = seg;
  const s0 = t.s[seg];
  const s1 = t.s[seg + 1];
  const f = s1 > s0 ? (s - s0) / (s1 - s0) : 0;
  const e = m.instanceMatrix.array as Float32Array;
  const o = i * 16;
  e[o + 12] = t.xyz[3 * seg] + f * (t.xyz[3 * seg + 3] - t.xyz[3 * seg]);
  e[o + 13] = (t.xyz[3 * seg + 1] + f * (t.xyz[3 * seg + 4] - t.xyz[3 * seg + 1]) + LIFT) * exaggeration + LIFT;
  e[o + 14] = t.xyz[3 * seg + 2] + f * (t.xyz[3 * seg + 5] - t.xyz[3 * seg + 2]);
}

/**
 * Water paths: the engine's flow traces drawn as two-tone dashed lines, and (when animating) instanced drops
 * running down them. Per-frame work writes straight into the instance matrix array, no allocation.
 */
export function WaterPaths({
  traces,
  frame,
  exaggeration,
  animate,
}: {
  traces: FlowTraces;
  frame: SceneFrame;
  exaggeration: number;
  animate: boolean;
}) {
  const tracks = useMemo(() => buildTracks(traces, frame), [traces, frame]);
  const lines = useMemo(() => {
    const pairs: number[] = [];
    // Distance along the path at each end, so the light dashes run on along a path.
    const along: number[] = [];
    for (const t of tracks) {
      for (let i = 0; i + 1 < t.s.length; i++) {
        pairs.push(
          t.xyz[3 * i],
          t.xyz[3 * i + 1],
          t.xyz[3 * i + 2],
          t.xyz[3 * i + 3],
          t.xyz[3 * i + 4],
          t.xyz[3 * i + 5],
        );
        along.push(t.s[i], t.s[i + 1]);
      }
    }
    const g = new THREE.BufferGeometry();
    g.setAttribute("position", new THREE.Float32BufferAttribute(pairs, 3));
    g.setAttribute("lineDistance", new THREE.Float32BufferAttribute(along, 1));
    return g;
  }, [tracks]);
  useEffect(() => () => lines.dispose(), [lines]);

  // Drops: spread along each track, fewer per track when there are many tracks.
  const drops = useMemo(() => {
    const total = tracks.reduce((sum, t) => sum + t.s[t.s.length - 1], 0);
    const spacing = Math.max(total / MAX_PARTICLES, frame.radius / 12);
    const track: number[] = [];
    const pos: number[] = [];
    tracks.forEach((t, k) => {
      const len = t.s[t.s.length - 1];
      const count = Math.max(1, Math.floor(len / spacing));
      for (let i = 0; i < count && track.length < MAX_PARTICLES; i++) {
        track.push(k);
        pos.push(((i + ((k * 0.618) % 1)) / count) * len);
      }
    });
    return { track: Int32Array.from(track), s: Float32Array.from(pos), segment: new Int32Array(track.length) };
  }, [tracks, frame]);

  const mesh = useRef<THREE.InstancedMesh>(null);
  // A light drop inside a dark ring (the larger sphere's back faces): one of the two stands out
  // at 3:1 or more on every face colour, hatched or not (WCAG 1.4.11; tests/unit/sandbox/palette.test.ts).
  const sphere = useMemo(() => {
    const r = Math.max(0.03, frame.radius * 0.007);
    const core = new THREE.IcosahedronGeometry(r, 1);
    const ring = new THREE.IcosahedronGeometry(r * 1.6, 1);
    const merged = mergeGeometries([core, ring], true)!;
    core.dispose();
    ring.dispose();
    return merged;
  }, [frame]);
  useEffect(() => () => sphere.dispose(), [sphere]);
  const materials = useMemo(
    () => [
      new THREE.MeshBasicMaterial({ color: WATER_LIGHT }),
      new THREE.MeshBasicMaterial({ color: WATER_DARK, side: THREE.BackSide }),
    ],
    [],
  );
  useEffect(() => () => materials.forEach((m) => m.dispose()), [materials]);
  const dash = Math.max(0.05, frame.radius * 0.02);
  const lift = LIFT;

  useEffect(() => {
    const m = mesh.current;
    if (!m) return;
    const identity = new THREE.Matrix4();
    for (let i = 0; i < drops.track.length; i++) {
      m.setMatrixAt(i, identity);
      drops.segment[i] = 0;
      placeDrop(m, tracks, drops, i, exaggeration);
    }
    m.count = drops.track.length;
    m.instanceMatrix.needsUpdate = true;
  }, [drops, exaggeration, tracks]);

  // Drawn on the CPU, the water asks for WATER_CPU_FPS frames a second, not every display frame.
  const onCpu = useSyncExternalStore(cpuDrawing.subscribe, cpuDrawing.get, () => false);
  const nextFrame = useRef<ReturnType<typeof setTimeout> | null>(null);
  useEffect(
    () => () => {
      if (nextFrame.current) clearTimeout(nextFrame.current);
      nextFrame.current = null;
    },
    [],
  );

  useFrame((state, delta) => {
    const m = mesh.current;
    if (!animate || !m || drops.track.length === 0) return;
    // A long gap (a busy machine, a hidden tab) moves the drops at most this far at once.
    const dt = Math.min(delta, onCpu ? 2 / WATER_CPU_FPS : 0.05);
    for (let i = 0; i < drops.track.length; i++) {
      const t = tracks[drops.track[i]];
      const seg = drops.segment[i];
      drops.s[i] += t.speed[seg] * dt;
      if (drops.s[i] >= t.s[t.s.length - 1]) {
        drops.s[i] = 0;
        drops.segment[i] = 0;
      }
      placeDrop(m, tracks, drops, i, exaggeration);
    }
    m.instanceMatrix.needsUpdate = true;
    if (!onCpu) state.invalidate();
    else
      nextFrame.current ??= setTimeout(() => {
        nextFrame.current = null;
        state.invalidate();
      }, 1000 / WATER_CPU_FPS);
  });

  return (
    <group name="water">
      {/* Dark and light dashes along each path: readable on the dark and the light end of the scale. */}
      <lineSegments geometry={lines} scale={[1, exaggeration, 1]} position={[0, lift * exaggeration, 0]}>
        <lineBasicMaterial color={WATER_DARK} />
      </lineSegments>
      <lineSegments
        geometry={lines}
        scale={[1, exaggeration, 1]}
        position={[0, lift * exaggeration, 0]}
        renderOrder={1}
      >
        <lineDashedMaterial color={WATER_LIGHT} dashSize={dash} gapSize={dash} />
      </lineSegments>
      <instancedMesh ref={mesh} args={[sphere, materials, Math.max(1, drops.track.length)]} frustumCulled={false} />
    </group>
  );
}
