/**
 * `npm run db:restore -- --in file.dump [--into <database url>]`: restores a backup made by
 * db:backup. The target must be an empty database (or pass --clean to replace what is there).
 */
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import { arg, pgTool, targetUrl } from "./pg-tools.ts";

export function restore(file: string, url: string, opts: { clean?: boolean } = {}) {
  if (!fs.existsSync(file)) throw new Error(`no backup at ${file}`);
  const args = ["--no-owner", "--no-privileges", "--exit-on-error", "--single-transaction", "--dbname", url];
  if (opts.clean) args.push("--clean", "--if-exists");
  const r = spawnSync(pgTool("pg_restore"), [...args, file], { encoding: "utf8" });
  if (r.status !== 0) throw new Error(`pg_restore failed: ${r.stderr}`);
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const file = arg("in");
  if (!file) {
    console.error("usage: npm run db:restore -- --in <file.dump> [--into <database url>] [--clean]");
    process.exit(2);
  }
  restore(file, arg("into") ?? targetUrl(), { clean: process.argv.includes("--clean") });
  console.log(`restored ${file}`);
}
