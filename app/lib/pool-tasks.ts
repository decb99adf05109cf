import type { Analysis, AsBuiltResult } from "../engine";

/** The messages between the app and its worker threads (app/server/workers/tasks.ts). */
export type PoolTask =
  | { kind: "analyse"; spec: unknown; mesh: boolean; traces: boolean; maxBytes: number }
  | { kind: "shape"; spec: unknown; mesh: boolean }
  | {
      kind: "as-built";
      spec: unknown;
      points: { at: [number, number]; level: number; label?: string }[];
      tolerance: { deviation?: number; minFall?: number; pondDepth?: number };
    }
  | { kind: "hash"; password: string; cost: number }
  | { kind: "compare"; password: string; hash: string };

export type PoolResult =
  | { kind: "bytes"; bytes: Uint8Array; ms: number }
  | { kind: "text"; text: string; ms: number }
  | { kind: "analysis"; analysis: Analysis; ms: number }
  | { kind: "as-built"; result: AsBuiltResult; ms: number }
  | { kind: "boolean"; value: boolean; ms: number }
  | { kind: "too-large"; bytes: number; ms: number }
  | {
      kind: "refused";
      status: number;
      error: { message: string; issues: { path: string; message: string }[] };
      ms: number;
    }
  | { kind: "failed"; message: string; ms: number };
