/**
 * Prometheus metrics (prom-client), served by the host at `/metrics` (loopback or METRICS_TOKEN
 * only, see app/server/metrics-route.ts). Kept on globalThis so the host and the built app
 * record into one registry.
 */
import client from "prom-client";
import "~/lib/pool.server";

export interface AppMetrics {
  registry: client.Registry;
  httpDuration: client.Histogram<"method" | "route" | "status">;
  analysisDuration: client.Histogram<"kind" | "outcome" | "thread">;
}

declare global {
  var __fallwrightMetrics: AppMetrics | undefined;
}

interface PoolLike {
  numUsed(): number;
  numFree(): number;
  numPendingAcquires(): number;
}

function create(): AppMetrics {
  const registry = new client.Registry();
  client.collectDefaultMetrics({ register: registry, prefix: "fallwright_" });
  const httpDuration = new client.Histogram({
    name: "fallwright_http_request_duration_seconds",
    help: "Time from request to the end of the response, by route pattern, method and status",
    labelNames: ["method", "route", "status"] as const,
    buckets: [0.005, 0.01, 0.025, 0.05, 0.1, 0.25, 0.5, 1, 2.5, 5, 10],
    registers: [registry],
  });
  const analysisDuration = new client.Histogram({
    name: "fallwright_analysis_duration_seconds",
    help: "Time a roof analysis took (kind: api or csv; outcome: ok, refused, too_large, failed, busy, timeout; thread: pool, or request for a small roof analysed on the request's thread)",
    labelNames: ["kind", "outcome", "thread"] as const,
    buckets: [0.001, 0.005, 0.01, 0.025, 0.05, 0.1, 0.25, 0.5, 1, 2.5, 5],
    registers: [registry],
  });
  new client.Gauge({
    name: "fallwright_worker_pool_queue_length",
    help: "Tasks waiting for a free worker thread, by pool (engine: analyses; password: bcrypt)",
    labelNames: ["pool"] as const,
    registers: [registry],
    collect() {
      const pools = globalThis.__fallwrightPools ?? {};
      this.set({ pool: "engine" }, pools.engine?.queueSize ?? 0);
      this.set({ pool: "password" }, pools.password?.queueSize ?? 0);
    },
  });
  new client.Gauge({
    name: "fallwright_worker_pool_utilisation",
    help: "Share of the worker threads' time spent on tasks since start (0-1), by pool",
    labelNames: ["pool"] as const,
    registers: [registry],
    collect() {
      const pools = globalThis.__fallwrightPools ?? {};
      this.set({ pool: "engine" }, pools.engine?.utilization ?? 0);
      this.set({ pool: "password" }, pools.password?.utilization ?? 0);
    },
  });
  new client.Gauge({
    name: "fallwright_db_pool_connections",
    help: "Database pool connections by state (used, free, pending = requests waiting for one)",
    labelNames: ["state"] as const,
    registers: [registry],
    collect() {
      const pool = (globalThis.__fallwrightDb?.client as { pool?: PoolLike } | undefined)?.pool;
      this.set({ state: "used" }, pool?.numUsed() ?? 0);
      this.set({ state: "free" }, pool?.numFree() ?? 0);
      this.set({ state: "pending" }, pool?.numPendingAcquires() ?? 0);
    },
  });
  new client.Gauge({
    name: "fallwright_live_subscribers",
    help: "Open live-feed streams (followers of a class) in this process",
    registers: [registry],
    collect() {
      this.set(globalThis.__fallwrightLiveHub?.subscriberCount ?? 0);
    },
  });
  return { registry, httpDuration, analysisDuration };
}

export function metrics(): AppMetrics {
  globalThis.__fallwrightMetrics ??= create();
  return globalThis.__fallwrightMetrics;
}
