/** Shared by `npm run bench` and `npm run load`: a production server on its own database. */
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import { clusterUrl, dropDatabase, ensureDatabase, readClusterInfo } from "../../app/dev/cluster.ts";
import { chooseFakePorts, PROFILES, prepareDatabase, serviceEnv, startFakes } from "../../app/dev/services.ts";
import { ROOT } from "../support/build.ts";
import { startServer, type RunningServer } from "../support/server.ts";

export async function benchServer(dbName: string, env: Record<string, string> = {}) {
  const profile = PROFILES.test;
  await prepareDatabase(profile);
  const info = readClusterInfo("test")!;
  await dropDatabase(info, dbName);
  await ensureDatabase(info, dbName, profile.database);
  const ports = await chooseFakePorts(profile);
  const services = serviceEnv(profile, ports);
  const fakes = await startFakes(profile, services, ports);
  // A build of its own (FALLWRIGHT_BUILD_DIR, else .data/build-bench), never the shared `build`.
  const buildDir = path.resolve(ROOT, process.env.FALLWRIGHT_BUILD_DIR ?? ".data/build-bench");
  if (!fs.existsSync(path.join(buildDir, "server/index.js")) || process.env.REBUILD !== "0") {
    const r = spawnSync(process.execPath, [path.join(ROOT, "node_modules/@react-router/dev/bin.js"), "build"], {
      cwd: ROOT,
      stdio: "ignore",
      env: { ...process.env, FALLWRIGHT_BUILD_DIR: buildDir },
    });
    if (r.status !== 0) throw new Error("build failed");
  }
  process.env.FALLWRIGHT_BUILD_DIR = buildDir;
  const server: RunningServer = await startServer(clusterUrl(info, dbName), { ...services, ...env });
  return {
    server,
    async stop() {
      await server.stop();
      fakes?.kill("SIGTERM");
      await dropDatabase(info, dbName);
    },
  };
}

export async function signIn(base: string, email: string, password = "fallwright-demo"): Promise<string> {
  const res = await fetch(`${base}/login`, {
    method: "POST",
    redirect: "manual",
    headers: { "Content-Type": "application/x-www-form-urlencoded", Origin: base },
    body: new URLSearchParams({ email, password }),
  });
  if (res.status !== 302) throw new Error(`sign-in as ${email} answered ${res.status}`);
  return res.headers
    .getSetCookie()
    .map((c) => c.split(";")[0])
    .join("; ");
}

export const SMALL_ROOF = {
  outline: [
    [0, 0],
    [15, 0],
    [15, 10],
    [0, 10],
  ],
  outlets: [{ at: [7.5, 0] }],
  baseFall: "1:60",
  joists: { spacing: 0.4 },
};
