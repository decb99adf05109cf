/**
 * `npm run load`: a mixed workload (sign-in, sandbox analyses, saving roofs, gradebook) from 50
 * concurrent clients for 60 s against the production build on loopback. Prints requests/s, p50
 * and p99, and exits non-zero on any error or non-2xx/3xx answer.
 * The per-IP limit on the analysis API is raised for this run: all clients share one address
 * here, and the run measures throughput, not the limiter (which has its own tests).
 */
import autocannon from "autocannon";
import { benchServer, signIn, SMALL_ROOF } from "./harness.ts";

const seconds = Number(process.env.LOAD_SECONDS ?? 60);
const connections = Number(process.env.LOAD_CONNECTIONS ?? 50);

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
  const result = await autocannon({
    url: base,
    connections,
    duration: seconds,
    timeout: 20,
    // One pass of a client: mostly sandbox analyses and library reads, a save, a gradebook view
    // and one sign-in (bcrypt at cost 12 is meant to be slow, so it is a small share, as in use).
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
      {
        method: "POST",
        path: "/login",
        headers: { "Content-Type": "application/x-www-form-urlencoded", Origin: base },
        body: signInBody,
      },
    ],
  });
  const errors = result.errors + result.timeouts + result.non2xx - (result["3xx"] ?? 0);
  console.log(`\nload: ${connections} clients for ${seconds} s, mixed workload (analyses, gradebook, roofs, sign-in)`);
  console.log(`requests: ${result.requests.total}, ${result.requests.average.toFixed(0)} req/s`);
  console.log(`latency: p50 ${result.latency.p50} ms, p99 ${result.latency.p99} ms, max ${result.latency.max} ms`);
  console.log(
    `errors: ${result.errors}, timeouts: ${result.timeouts}, non-2xx/3xx: ${result.non2xx - (result["3xx"] ?? 0)}`,
  );
  console.log(`status codes: ${JSON.stringify(result.statusCodeStats)}`);
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
