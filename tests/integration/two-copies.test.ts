import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { spawnSync } from "node:child_process";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { clusterUrl, ensureCluster, ensureDatabase, stopCluster, type ClusterInfo } from "../../app/dev/cluster";
import { ROOT } from "../support/build";
import { freePort, startServer, type RunningServer } from "../support/server";

// Issue 19, "two copies on one machine": a second checkout's database once failed to start because
// the first held the fixed port. Here two checkouts' clusters are made side by side, each in its
// own folder and both asking for the same port: the second takes a free one and keeps it in its
// settings, and an app served from each answers its pages from its own database.
const dirs: string[] = [];
const clusters: ClusterInfo[] = [];
const servers: RunningServer[] = [];

async function checkout(name: string, preferredPort: number) {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), `fw-${name}-`));
  fs.chmodSync(dir, 0o755);
  dirs.push(dir);
  const info = await ensureCluster(name, preferredPort, { fast: true, dataDir: path.join(dir, "pg") });
  clusters.push(info);
  await ensureDatabase(info, "fallwright");
  // Knex imports .ts migrations natively, which vitest's workers cannot: migrate in a tsx child.
  const r = spawnSync(process.execPath, ["--import", "tsx", path.join(ROOT, "app/dev/migrate.ts")], {
    cwd: ROOT,
    encoding: "utf8",
    env: { ...process.env, DATABASE_URL: clusterUrl(info, "fallwright") },
  });
  if (r.status !== 0) throw new Error(`migrate failed: ${r.stderr}`);
  const server = await startServer(clusterUrl(info, "fallwright"));
  servers.push(server);
  return { info, server };
}

let first: Awaited<ReturnType<typeof checkout>>;
let second: Awaited<ReturnType<typeof checkout>>;

beforeAll(async () => {
  const wanted = await freePort();
  first = await checkout("copy-a", wanted);
  second = await checkout("copy-b", wanted);
}, 240_000);

afterAll(async () => {
  for (const s of servers) await s.stop();
  for (const c of clusters) stopCluster(c, "immediate");
  for (const d of dirs) fs.rmSync(d, { recursive: true, force: true });
});

describe("two checkouts on one machine", () => {
  it("the second cluster takes another port instead of failing on the first one's", () => {
    expect(first.info.port).not.toBe(second.info.port);
    expect(first.info.dataDir).not.toBe(second.info.dataDir);
  });

  it("both apps serve, each from its own database", async () => {
    for (const { server } of [first, second]) {
      const health = await fetch(`${server.url}/healthz`);
      expect(health.status).toBe(200);
      const home = await fetch(`${server.url}/lessons`);
      expect(home.status).toBe(200);
      expect(await home.text()).toContain("Fallwright");
    }
    expect(first.server.url).not.toBe(second.server.url);
  });
});
