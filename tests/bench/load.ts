/**
 * `npm run load`: a mixed workload (sandbox analyses, library reads, saving roofs, gradebook) from
 * 50 concurrent clients for 60 s against the production build on loopback, and beside it a stream
 * of sign-ins at a steady rate (LOAD_SIGNINS_PER_S, default 2: a class of 60 signing in within
 * half a minute). Prints requests/s, p50 and p99 of each, the server's own timings by route, and
 * exits non-zero on any error or non-2xx/3xx answer.
 * Sign-ins are open-loop on purpose: bcrypt at cost 12 is meant to take about 300 ms of CPU, so
 * when each of 50 closed-loop clients also signed in every 17 requests, every client ended up
 * queued at sign-in and the run measured the length of that queue (50), not the app.
 * The per-IP limit on the analysis API is raised for this run: all clients share one address
 * here, and the run measures throughput, not the limiter (which has its own tests).
 */
import autocannon from "autocannon";
import { benchServer, signIn, SMALL_ROOF } from "./harness.ts";

const seconds = Number(process.env.LOAD_SECONDS ?? 60);
const connections = Number(process.env.LOAD_CONNECTIONS ?? 50);
const signInsPerSecond = Number(process.env.LOAD_SIGNINS_PER_S ?? 2);

const { server, stop } = await benchServer("fallwright_load", { API_RATE_LIMIT_PER_MINUTE: "10000000" });
const base = server.url;
try {
  const trainer = await signIn(base, "trainer@tidemark.example");
  const designer = await signIn(base, "designer@tidemark.example");
  const json = { "Content-Type": "application/json", Origin: base };
  const created = await fetch(`${base}/api/v1/roofs`, {
    method: "POST",
    headers: { ...json, cookie: designer },
    body: JSON.stringify({ name: "Load roof", spec: SMALL_ROOF }),
  });
  if (created.status !== 201) throw new Error(`could not create a roof: ${created.status}`);
  const roof = (await created.json()) as { id: string };

  const signInBody = new URLSearchParams({ email: "trainee@tidemark.example", password: "fallwright-demo" }).toString();
  const signIns = autocannon({
    url: base,
    connections: 10,
    duration: seconds,
    timeout: 20,
    overallRate: signInsPerSecond,
    requests: [
      {
        method: "POST",
        path: "/login",
        headers: { "Content-Type": "application/x-www-form-urlencoded", Origin: base },
        body: signInBody,
      },
    ],
  });
  const mixed = autocannon({
    url: base,
    connections,
    duration: seconds,
    timeout: 20,
    // One pass of a client: mostly sandbox analyses and library reads, a save and a gradebook view.
    requests: [
      ...Array.from({ length: 3 }, () => [
        { method: "POST" as const, path: "/api/v1/analyses", headers: json, body: JSON.stringify(SMALL_ROOF) },
        { method: "GET" as const, path: `/api/v1/roofs/${roof.id}`, headers: { cookie: designer } },
        {
          method: "POST" as const,
          path: "/api/v1/analyses",
          headers: json,
          body: JSON.stringify({ ...SMALL_ROOF, baseFall: "1:40" }),
        },
        { method: "GET" as const, path: "/api/v1/roofs", headers: { cookie: designer } },
        { method: "GET" as const, path: "/gradebook", headers: { cookie: trainer } },
      ]).flat(),
      {
        method: "POST",
        path: "/api/v1/roofs",
        headers: { ...json, cookie: designer },
        body: JSON.stringify({ name: "Load save", spec: SMALL_ROOF }),
      },
    ],
  });
  const [result, signInResult] = await Promise.all([mixed, signIns]);
  let errors = 0;
  for (const [label, r] of [
    [`${connections} clients, mixed workload (analyses, gradebook, roofs)`, result],
    [`sign-ins at ${signInsPerSecond} a second`, signInResult],
  ] as const) {
    const failed = r.errors + r.timeouts + r.non2xx - (r["3xx"] ?? 0);
    errors += failed;
    console.log(`\nload: ${label}, ${seconds} s`);
    console.log(`requests: ${r.requests.total}, ${r.requests.average.toFixed(0)} req/s`);
    console.log(`latency: p50 ${r.latency.p50} ms, p99 ${r.latency.p99} ms, max ${r.latency.max} ms`);
    console.log(`errors: ${r.errors}, timeouts: ${r.timeouts}, non-2xx/3xx: ${r.non2xx - (r["3xx"] ?? 0)}`);
    console.log(`status codes: ${JSON.stringify(r.statusCodeStats)}`);
  }
  // The server's own timings by route (its log line per request), so a slow tail can be placed.
  const byRoute = new Map<string, number[]>();
  for (const line of server.output().split("\n")) {
    const m = /"method":"(\w+)","route":"([^"]+)".*"ms":([\d.]+)/.exec(line);
    if (!m) continue;
    const key = `${m[1]} ${m[2]}`;
    if (!byRoute.has(key)) byRoute.set(key, []);
    byRoute.get(key)!.push(Number(m[3]));
  }
  const pct = (xs: number[], q: number) => xs[Math.min(xs.length - 1, Math.floor(q * xs.length))];
  console.log("server time by route (ms):");
  for (const [route, xs] of [...byRoute].sort((a, b) => b[1].length - a[1].length)) {
    xs.sort((a, b) => a - b);
    if (xs.length < 20) continue;
    console.log(`  ${route.padEnd(34)} n ${String(xs.length).padStart(5)}  p50 ${pct(xs, 0.5)}  p99 ${pct(xs, 0.99)}`);
  }
  if (errors > 0) {
    // The server's own account of what failed: its error lines and the routes that answered 5xx.
    const lines = server.output().split("\n");
    const failed = lines.filter((l) => /"level":(50|60)/.test(l) || /"status":5\d\d/.test(l));
    const byRoute = new Map<string, number>();
    for (const l of failed) {
      const m = /"route":"([^"]+)".*"status":(\d+)/.exec(l);
      if (m) byRoute.set(`${m[2]} ${m[1]}`, (byRoute.get(`${m[2]} ${m[1]}`) ?? 0) + 1);
    }
    console.log(`server 5xx by route: ${JSON.stringify(Object.fromEntries(byRoute))}`);
    for (const l of failed.filter((l) => /"level":(50|60)/.test(l)).slice(0, 3)) console.log(l.slice(0, 1500));
    console.log("FAIL: the load run saw errors");
    process.exitCode = 1;
  } else {
    console.log("PASS: zero errors");
  }
} finally {
  await stop();
}
