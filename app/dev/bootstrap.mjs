// Plain Node, no dependencies: runs before node_modules exists on a fresh machine.
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";

export const root = path.resolve(import.meta.dirname, "../..");

/** Installs npm dependencies when they are missing or older than package-lock.json. */
export function ensureDependencies() {
  const marker = path.join(root, "node_modules", ".package-lock.json");
  const lock = path.join(root, "package-lock.json");
  const stale = !fs.existsSync(marker) || fs.statSync(marker).mtimeMs < fs.statSync(lock).mtimeMs;
  if (!stale) return;
  console.log("[fallwright] installing dependencies (npm ci)...");
  const r = spawnSync("npm", ["ci", "--no-audit", "--no-fund"], { cwd: root, stdio: "inherit" });
  if (r.status !== 0) process.exit(r.status ?? 1);
}

/** Runs a TypeScript task with tsx, passing signals through, and resolves with its exit code. */
export function runTs(file, args = [], env = {}) {
  const r = spawnSync(process.execPath, ["--import", "tsx", path.join(root, file), ...args], {
    cwd: root,
    stdio: "inherit",
    env: { ...process.env, ...env },
  });
  return r.status ?? 1;
}

const task = process.argv[2];
if (import.meta.url === `file://${process.argv[1]}` && task) {
  ensureDependencies();
  process.exit(runTs(`app/dev/${task}.ts`, process.argv.slice(3)));
}
