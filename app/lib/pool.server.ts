/**
 * The worker-thread pools (piscina) that keep CPU-heavy work off the event loop: `engine` for roof
 * analyses, `password` for bcrypt, so sign-ins never wait behind a large roof. Made on first use
 * and kept on globalThis so the host's /metrics can read their queues. Sizes: WORKER_THREADS
 * threads per pool (default: the machine's cores), at most POOL_MAX_QUEUE tasks waiting each.
 */
import { availableParallelism } from "node:os";
import path from "node:path";
import { Piscina } from "piscina";
import type { PoolResult, PoolTask } from "~/lib/pool-tasks";

export type PoolName = "engine" | "password";

declare global {
  var __fallwrightPools: Partial<Record<PoolName, Piscina<PoolTask, PoolResult>>> | undefined;
}

/** Tasks waiting per pool before new ones are refused (503, Retry-After). */
export const POOL_MAX_QUEUE = Number(process.env.POOL_MAX_QUEUE) || 64;

function workerFile(): string {
  // The host sets FALLWRIGHT_ROOT; tests and tools run from the checkout's root.
  return path.resolve(process.env.FALLWRIGHT_ROOT ?? process.cwd(), "app/server/workers/worker.mjs");
}

export function pool(name: PoolName): Piscina<PoolTask, PoolResult> {
  globalThis.__fallwrightPools ??= {};
  let p = globalThis.__fallwrightPools[name];
  if (!p) {
    const threads = Number(process.env.WORKER_THREADS) || Math.max(2, availableParallelism());
    p = new Piscina<PoolTask, PoolResult>({
      filename: workerFile(),
      minThreads: 1,
      maxThreads: threads,
      maxQueue: POOL_MAX_QUEUE,
      idleTimeout: 60_000,
      // The worker registers tsx itself; inheriting the parent's flags (vitest's, --inspect) is not wanted.
      execArgv: [],
      workerData: { tasks: name },
    });
    globalThis.__fallwrightPools[name] = p;
  }
  return p;
}

/** Tasks waiting for a thread, across pools (for /metrics). */
export function poolQueueLength(): Record<PoolName, number> {
  const pools = globalThis.__fallwrightPools ?? {};
  return { engine: pools.engine?.queueSize ?? 0, password: pools.password?.queueSize ?? 0 };
}

/** Tasks handed to the pools since start, by kind (tests check that sign-in ran exactly one compare). */
export const tasksRun: Partial<Record<PoolTask["kind"], number>> = {};

/** Runs a task; a full queue or a task past `timeoutMs` throws PoolBusy / PoolTimeout. */
export async function runInPool(name: PoolName, task: PoolTask, timeoutMs?: number): Promise<PoolResult> {
  const p = pool(name);
  if (p.queueSize >= POOL_MAX_QUEUE) throw new PoolBusy();
  tasksRun[task.kind] = (tasksRun[task.kind] ?? 0) + 1;
  try {
    return await p.run(task, timeoutMs ? { signal: AbortSignal.timeout(timeoutMs) } : undefined);
  } catch (error) {
    if ((error as Error)?.name === "AbortError" || /aborted/i.test(String((error as Error)?.message)))
      throw new PoolTimeout(timeoutMs ?? 0);
    if (/queue is at limit/i.test(String((error as Error)?.message))) throw new PoolBusy();
    throw error;
  }
}

export class PoolBusy extends Error {
  constructor() {
    super("the worker pool's queue is full");
  }
}

export class PoolTimeout extends Error {
  constructor(readonly ms: number) {
    super(`the task took longer than ${ms} ms`);
  }
}

export async function closePools(): Promise<void> {
  const pools = globalThis.__fallwrightPools;
  globalThis.__fallwrightPools = undefined;
  await Promise.all(Object.values(pools ?? {}).map((p) => p?.destroy()));
}
