/** `npm start`: everything from a fresh machine to a served production build with demo data. */
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import { log, PROJECT_ROOT, stopCluster } from "./cluster.ts";
import { chooseFakePorts, PROFILES, prepareDatabaseCluster, serviceEnv, startFakes } from "./services.ts";

const dev = process.argv.includes("--dev");
// `npm start -- --keep-db` (or FALLWRIGHT_KEEP_DB=1) leaves the database running after Ctrl-C.
const keepDb = process.argv.includes("--keep-db") || process.env.FALLWRIGHT_KEEP_DB === "1";
const profile = PROFILES.dev;

function newestMtime(dir: string): number {
  let newest = 0;
  for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, entry.name);
    newest = Math.max(newest, entry.isDirectory() ? newestMtime(p) : fs.statSync(p).mtimeMs);
  }
  return newest;
}

function buildIfStale() {
  const built = path.join(PROJECT_ROOT, "build/server/index.js");
  const sources = Math.max(
    newestMtime(path.join(PROJECT_ROOT, "app")),
    fs.statSync(path.join(PROJECT_ROOT, "package-lock.json")).mtimeMs,
  );
  if (fs.existsSync(built) && fs.statSync(built).mtimeMs > sources) {
    log("build is up to date");
    return;
  }
  log("building the production bundle...");
  const r = spawnSync(process.execPath, [path.join(PROJECT_ROOT, "node_modules/@react-router/dev/bin.js"), "build"], {
    cwd: PROJECT_ROOT,
    stdio: "inherit",
  });
  if (r.status !== 0) process.exit(r.status ?? 1);
}

const { url: databaseUrl, started } = await prepareDatabaseCluster(profile);
const ports = await chooseFakePorts(profile);
const env = serviceEnv(profile, ports);
const fakes = await startFakes(profile, env, ports);
if (!dev) buildIfStale();

const port = process.env.PORT ?? "3000";
const server: ChildProcess = spawn(
  process.execPath,
  ["--import", "tsx", path.join(PROJECT_ROOT, "app/server/index.ts")],
  {
    cwd: PROJECT_ROOT,
    stdio: "inherit",
    // Links in e-mail need APP_URL; on this machine it is the address printed below (a deployment sets its own).
    env: {
      ...process.env,
      ...env,
      DATABASE_URL: databaseUrl,
      PORT: port,
      APP_URL: process.env.APP_URL || `http://localhost:${port}`,
      NODE_ENV: dev ? "development" : "production",
    },
  },
);

log(`open http://localhost:${port}`);
log("demo sign-ins (password: fallwright-demo):");
for (const who of ["admin", "trainer", "trainee", "designer"]) log(`  ${who}@tidemark.example`);
if (!process.env.SMTP_URL) log(`e-mail is caught by the local fake: admins see it under Admin → Outbox`);

function stop(signal: NodeJS.Signals) {
  server.kill(signal);
  fakes?.kill(signal);
}
process.on("SIGINT", () => stop("SIGINT"));
process.on("SIGTERM", () => stop("SIGTERM"));
server.on("exit", (code) => {
  fakes?.kill("SIGTERM");
  // Stop the database this command started (not one that was already running, nor DATABASE_URL's).
  if (started && !keepDb) {
    log("stopping the project's PostgreSQL (npm start -- --keep-db leaves it running)");
    stopCluster(started);
  }
  process.exit(code ?? 0);
});
