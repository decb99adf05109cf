/** The production build that tests which need one (budgets, route matrix, outage) use. */
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";

export const ROOT = path.resolve(import.meta.dirname, "../..");

export function buildDir(): string {
  return path.resolve(ROOT, process.env.FALLWRIGHT_BUILD_DIR ?? "build");
}

/** `npm test` builds before vitest runs; a lone `vitest` run builds here once. */
export function ensureBuild(): string {
  const dir = buildDir();
  if (!fs.existsSync(path.join(dir, "server/index.js"))) {
    const r = spawnSync(process.execPath, [path.join(ROOT, "node_modules/@react-router/dev/bin.js"), "build"], {
      cwd: ROOT,
      encoding: "utf8",
    });
    if (r.status !== 0) throw new Error(`build failed:\n${r.stdout}\n${r.stderr}`);
  }
  return dir;
}
