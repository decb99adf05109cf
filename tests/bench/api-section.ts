/**
 * API throughput: POST /api/v1/analyses on a small roof against GET /api/v1 (a trivial JSON
 * answer) on the same production server in the same run. The server is pinned to one core and
 * the load generator to the other where `taskset` allows (docs/quality.md, Performance: ratio ≥ 0.5). The routes
 * take turns in half-second windows (BENCH_API_ROUNDS of them, BENCH_API_SECONDS in all), so
 * other work on a shared machine slows each about equally; the ratio reported is the median of
 * the rounds' ratios, with the middle half of them beside it to show the spread.
 */
import { spawnSync } from "node:child_process";
import autocannon from "autocannon";
import type { BenchRow, Section } from "./bench.ts";
import { median } from "./stats.ts";
import { benchServer, SMALL_ROOF } from "./harness.ts";

const SECONDS = Number(process.env.BENCH_API_SECONDS ?? 15);
const ROUNDS = Math.max(1, Math.floor(Number(process.env.BENCH_API_ROUNDS ?? 30)));

function pin(pid: number, core: number): boolean {
  return spawnSync("taskset", ["-a", "-p", "-c", String(core), String(pid)], { stdio: "ignore" }).status === 0;
}

async function rps(url: string, init: { method: "GET" | "POST"; headers?: Record<string, string>; body?: string }) {
  const r = await autocannon({ url, connections: 10, duration: Math.max(1, SECONDS / ROUNDS), ...init });
  if (r.errors || r.timeouts || r.non2xx)
    throw new Error(`${init.method} ${url}: ${r.errors} errors, ${r.timeouts} timeouts, ${r.non2xx} non-2xx`);
  return { rps: r.requests.average, p99: r.latency.p99 };
}

async function warmUp(url: string, init: { method: "GET" | "POST"; headers?: Record<string, string>; body?: string }) {
  await autocannon({ url, connections: 10, amount: 500, ...init });
}

export const apiSection: Section = {
  title: "API: analyses on a small roof vs a trivial JSON route (requests/s, same server, same run)",
  async run(): Promise<BenchRow[]> {
    const { server, stop } = await benchServer("fallwright_bench", { API_RATE_LIMIT_PER_MINUTE: "100000000" });
    try {
      const pinned = pin(server.proc.pid!, 0) && pin(process.pid, 1);
      const json = { "Content-Type": "application/json" };
      // Warm up both routes first, as the engine section does, so neither figure includes the
      // JIT compiling its code.
      await warmUp(`${server.url}/api/v1`, { method: "GET" });
      await warmUp(`${server.url}/api/v1/analyses`, {
        method: "POST",
        headers: json,
        body: JSON.stringify(SMALL_ROOF),
      });
      const trivials: Awaited<ReturnType<typeof rps>>[] = [];
      const leans: typeof trivials = [];
      const fulls: typeof trivials = [];
      for (let round = 0; round < ROUNDS; round++) {
        trivials.push(await rps(`${server.url}/api/v1`, { method: "GET" }));
        leans.push(
          await rps(`${server.url}/api/v1/analyses`, {
            method: "POST",
            headers: json,
            body: JSON.stringify(SMALL_ROOF),
          }),
        );
        fulls.push(
          await rps(`${server.url}/api/v1/analyses?mesh=true&traces=true`, {
            method: "POST",
            headers: json,
            body: JSON.stringify(SMALL_ROOF),
          }),
        );
      }
      const mid = (xs: Awaited<ReturnType<typeof rps>>[]) => ({
        rps: median(xs.map((x) => x.rps)),
        p99: median(xs.map((x) => x.p99)),
      });
      const trivial = mid(trivials);
      const lean = mid(leans);
      const full = mid(fulls);
      const leanRatio = median(leans.map((l, k) => l.rps / trivials[k].rps));
      const fullRatio = median(fulls.map((f, k) => f.rps / trivials[k].rps));
      const ratios = leans.map((l, k) => l.rps / trivials[k].rps).sort((a, b) => a - b);
      const quartile = (q: number) => ratios[Math.min(ratios.length - 1, Math.floor(q * ratios.length))].toFixed(2);
      const spread = `${ROUNDS} rounds, middle half ${quartile(0.25)}–${quartile(0.75)}, all ${ratios[0].toFixed(2)}–${ratios[ratios.length - 1].toFixed(2)}`;
      const note = pinned ? "server on core 0, load on core 1" : "not pinned (taskset unavailable)";
      return [
        {
          name: "GET /api/v1 (trivial JSON)",
          value: trivial.rps,
          unit: "req/s",
          score: 1,
          target: "baseline",
          pass: true,
          note: `p99 ${trivial.p99} ms; ${note}`,
        },
        {
          name: "POST /api/v1/analyses",
          value: lean.rps,
          unit: "req/s",
          score: leanRatio,
          target: "≥ 0.5 of baseline",
          pass: leanRatio >= 0.5,
          note: `p99 ${lean.p99} ms; the default answer (figures, no mesh); ${spread}`,
        },
        {
          name: "…?mesh=true&traces=true",
          value: full.rps,
          unit: "req/s",
          score: fullRatio,
          target: "reported",
          pass: true,
          note: `p99 ${full.p99} ms; with the 3D mesh and flow traces`,
        },
      ];
    } finally {
      await stop();
    }
  },
};
