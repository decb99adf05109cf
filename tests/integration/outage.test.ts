import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { spawnSync } from "node:child_process";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import {
  clusterUrl,
  ensureCluster,
  ensureDatabase,
  startCluster,
  stopCluster,
  type ClusterInfo,
} from "../../app/dev/cluster";
import { ROOT } from "../support/build";
import { freePort, startServer, type RunningServer } from "../support/server";

// docs/quality.md, Reliability → Database down: 503 with Retry-After, then recovery without a restart.
// This file stops PostgreSQL, so it gets a cluster of its own and never touches the shared one;
// that cluster keeps fsync on, since an immediate stop is a crash and must not lose commits.
let info: ClusterInfo;
let server: RunningServer;
let dir: string;

beforeAll(async () => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), "fw-outage-"));
  fs.chmodSync(dir, 0o755);
  info = await ensureCluster("outage", await freePort(), { fast: false, dataDir: path.join(dir, "pg") });
  await ensureDatabase(info, "fallwright");
  // Knex imports .ts migrations natively, which vitest's workers cannot: migrate in a tsx child.
  const r = spawnSync(process.execPath, ["--import", "tsx", path.join(ROOT, "app/dev/migrate.ts")], {
    cwd: ROOT,
    encoding: "utf8",
    env: { ...process.env, DATABASE_URL: clusterUrl(info, "fallwright") },
  });
  if (r.status !== 0) throw new Error(`migrate failed: ${r.stderr}`);
  server = await startServer(clusterUrl(info, "fallwright"));
}, 180_000);

afterAll(async () => {
  await server?.stop();
  if (info) stopCluster(info, "immediate");
  if (dir) fs.rmSync(dir, { recursive: true, force: true });
});

async function signIn(): Promise<string> {
  const res = await fetch(`${server.url}/login`, {
    method: "POST",
    redirect: "manual",
    headers: { "Content-Type": "application/x-www-form-urlencoded", Origin: server.url },
    body: new URLSearchParams({ email: "trainer@tidemark.example", password: "fallwright-demo" }),
  });
  expect(res.status).toBe(302);
  const cookie = res.headers
    .getSetCookie()
    .map((c) => c.split(";")[0])
    .join("; ");
  expect(cookie).not.toBe("");
  return cookie;
}

describe("PostgreSQL stops and comes back", () => {
  it("answers 503 while it is down and recovers without restarting the app", async () => {
    const cookie = await signIn();
    const before = await fetch(`${server.url}/`, { headers: { cookie } });
    expect(before.status).toBe(200);
    expect(await before.text()).toContain("Sign out");

    stopCluster(info, "immediate");

    const health = await fetch(`${server.url}/healthz`);
    expect(health.status).toBe(503);
    expect(health.headers.get("retry-after")).toBeTruthy();
    expect(await health.json()).toMatchObject({ ok: false });

    const page = await fetch(`${server.url}/`, { headers: { cookie } });
    expect(page.status).toBe(503);
    expect(page.headers.get("retry-after")).toBeTruthy();
    const html = await page.text();
    expect(html).toContain("Back in a moment");
    expect(html).not.toMatch(/at .+\.(js|ts):\d+/); // no stack trace
    // The page names its request id, which the operator finds in the log (issue 13, "what an
    // operator sees"): a user can quote it.
    const id = page.headers.get("x-request-id");
    expect(id).toMatch(/^[0-9a-f-]{36}$/);
    expect(html).toContain(`reference ${id}`);
    // The log line is written when the answer has gone out: wait for it.
    let line: { msg?: string; status?: number } | undefined;
    for (let tries = 0; tries < 50 && !line; tries++) {
      line = server
        .output()
        .split("\n")
        .filter((l) => l.includes(id!))
        .map((l) => JSON.parse(l) as { msg?: string; status?: number })
        .find((l) => l.msg === "request");
      if (!line) await new Promise((r) => setTimeout(r, 100));
    }
    expect(line?.status).toBe(503);

    startCluster(info, false);
    let status = 0;
    const end = Date.now() + 20_000;
    while (Date.now() < end) {
      status = (await fetch(`${server.url}/healthz`)).status;
      if (status === 200) break;
      await new Promise((r) => setTimeout(r, 200));
    }
    expect(status).toBe(200);
    const after = await fetch(`${server.url}/`, { headers: { cookie } });
    expect(after.status).toBe(200);
    expect(await after.text()).toContain("Sign out");
    expect(server.proc.exitCode).toBeNull(); // same process throughout
  }, 90_000);

  it("closes cleanly on SIGTERM", async () => {
    await server.stop();
    expect(server.proc.exitCode).toBe(0);
    expect(server.output()).toContain("SIGTERM: closing");
  });
});
